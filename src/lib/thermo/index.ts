/**
 * Public surface of the property core: water and steam (IAPWS-IF97), ideal gases and mixtures (NASA
 * Glenn polynomials), fuels and combustion, standard chemical exergy (Szargut, Morris & Steward 1988),
 * incompressible liquids, flow exergy and the control-volume exergy balance. SI base units throughout.
 */
export { water } from './water';
export type { WaterPhase, WaterRegion, WaterState } from './water';
export * from './errors';
export * from './gas';
export type { Element, NasaRange, NasaSpeciesData } from './species-data';
export * from './combustion';
export * from './chemical-exergy';
export * from './liquid';
export * from './exergy';
