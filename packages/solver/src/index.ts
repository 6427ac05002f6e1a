/** @rolloff/solver: the public API. */
export type * from './circuit.js';
export type * from './result.js';
export { formatSi, parseSi } from './units.js';
