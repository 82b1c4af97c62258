export * from './auth';
export * from './wineries';
export * from './cellar';
export * from './equipment';
export * from './cartridges';
export * from './attachments';
export * from './idempotency';
export * from './plans';
