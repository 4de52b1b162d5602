/**
 * The hourly exergy engine, pure: a unit of the plant model, the tag links holding in an hour and the
 * hour's tag statistics in; the unit hour (state with reasons, F, P, L, D, efficiency with its k = 2
 * uncertainty, closure, cost, audit trail, model version and inputs hash) out. The server reads and
 * writes the database (src/server/services/engine.ts); nothing here does I/O.
 */
export * from './types';
export { canonicalJson, hashOf, sha256Hex } from './hash';
export { mapUnitHour, unitParameters, fuelFluidOf, fuelSpecOfDefinition, type InputEntry, type InputSource, type MappedUnit, type PortPlan } from './map';
export {
  computeUnitHour,
  unitHourHashes,
  deadStateOf,
  ENGINE_VERSION,
  ENERGY_CLOSURE_TOLERANCE,
  ENTROPY_CHECK_TOLERANCE,
  SPREAD_O2_ABS,
  SPREAD_X_ABS,
  type ComputeOptions,
} from './compute';
export { costKindOf, electricityCost, fuelExergyCost, fuelPriceOf, steamCost, type BoilerHour } from './cost';
