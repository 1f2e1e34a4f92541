/**
 * The API's answers as they travel: types only, with no runtime code and no
 * import beyond the pure maths, so the server declares what it answers with
 * them and the browser reads the very same definitions (`@brimwatch/api-types`)
 * instead of a copy that could drift.
 */
export type * from './fleet';
export type * from './readings';
export type * from './target-test';
export type * from './alerts';
export type * from './history';
export type * from './dumps';
export type * from './imports';
