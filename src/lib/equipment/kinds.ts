/**
 * One exergy balance per unit kind, with the SPECO fuel/product/loss split of docs/domain.md s.3.
 * Every function takes ports (measurements or precomputed states, flows or 'mass-balance' /
 * 'energy-balance'), resolves what the balances fix, runs the property core's controlVolumeBalance
 * (destruction from the exergy balance, entropy generation from the independent entropy balance) and
 * returns a UnitBalance with F = P + L + D.
 *
 * One file per family of balance kinds (src/lib/kinds.ts, BALANCE_FAMILIES) under ./balances/, and
 * ./balances/common.ts for what they share; this module is their one entry.
 *
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3 (exergy
 *   balances, efficiencies of components); Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
export { checkEnv, type PortBalanceInput } from './balances/common';
export { turbineBalance, type TurbineInput } from './balances/turbine';
export { compressorBalance, type CompressorInput } from './balances/compressor';
export { heatExchangerBalance, type HeatExchangerInput } from './balances/heat-exchanger';
export { boilerBalance, type BoilerInput } from './balances/boiler';
export { valveBalance } from './balances/valve';
export { mixerBalance, type MixerInput } from './balances/mixer';
export { condenserBalance, type CondenserInput } from './balances/condenser';
export { machineBalance, type MachineInput } from './balances/machine';
export { genericBalance, type GenericHeat, type GenericInput, type GenericPower } from './balances/generic';
