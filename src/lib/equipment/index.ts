/**
 * Public surface of the equipment balances: port states from measurements, one SPECO exergy balance
 * per unit kind, and the flat-vector hourly evaluation with uncertainty. Pure: SI in, SI out.
 * @see docs/domain.md sections 2, 3, 5, 6, 7
 */
export * from './errors';
export {
  SATURATION_TOLERANCE_K,
  airMoleFractions,
  buildFuel,
  fluidOf,
  fuelEnthalpy298_J_per_kg,
  portState,
  prepareFluid,
} from './fluids';
export type { Environment, Fluid, FluidSpec, FuelSpec, PortFlag, PortMeasurement, PortPhase, PortState } from './fluids';
export { BALANCE_KINDS, type BalanceKind } from '../kinds';
export { assemble, resolvePorts } from './balance';
export type {
  BalancePort,
  HeatFlow,
  PortFlowInput,
  PortStateInput,
  PowerFlow,
  ResolvedPort,
  TermRole,
  UnitBalance,
  UnitTerm,
} from './balance';
// every balance and its input type, and checkEnv: kinds.ts is the one entry of ./balances
export * from './kinds';
export { compileUnit, compiledUnit, evaluateUnitHour, inputNames, inputVector } from './model';
export { unitHourWithUncertainty } from './uncertainty';
export type { Uncertain, UncertaintyOptions, UnitHourUncertainty } from './uncertainty';
export type {
  CompiledUnit,
  GenericTermSpec,
  PortFlowMode,
  PortSpec,
  PortStateMode,
  UnitModel,
} from './model';
