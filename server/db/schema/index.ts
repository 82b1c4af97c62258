export * from './auth';
export * from './wineries';
