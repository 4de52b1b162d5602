/**
 * Analytics of unit hours: hour states, uncertainty, baselines, drift detection and cost. Pure: no I/O.
 */
export * from './steady';
export * from './uncertainty';
export * from './baseline';
export * from './drift';
export * from './autocorrelation';
export * from './cost';
export { createRng, type Rng } from './rng';
export { coverageFactor, studentTCdf, studentTQuantile, incompleteBeta, lnGamma } from './distributions';
