/**
 * Brimwatch's sketch maths: pure functions with no I/O and no imports outside
 * this folder, shared by the server, the collectors and the browser.
 */
export * from './errors';
export * from './sizing';
export * from './health-levels';
export * from './assess';
export * from './occupancy';
export * from './theil-sen';
export * from './forecast-series';
export * from './forecast';
export * from './resize';
export * from './select-rank';
export * from './dump-verdict';
export * from './dump';
export * from './hashing';
export * from './random';
export * from './exposition';
export * from './sketch';
export * from './format';
