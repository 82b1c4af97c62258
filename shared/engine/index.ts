/**
 * The Porewise engine: pure, synchronous filtration calculations used by the client for live
 * what-if and by the server for saved results. SI units unless a name says otherwise.
 */
export * from './errors';
export * from './fluids';
export * from './flow';
export * from './units';
export * from './integrity';
export * from './blocking';
export * from './fit-constant-flow';
export * from './fit-constant-pressure';
export * from './stats';
export * from './run-forecast';
export * from './filterability';
export * from './readiness';
export * from './cartridge-life';
export * from './train-sizing';
export * from './day-timeline';
export * from './alerts';
export * from './day-needs';
export * from './past-runs-capacity';
