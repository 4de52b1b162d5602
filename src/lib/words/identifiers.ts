/**
 * Words for the identifiers of the engine and the API (names with a unit suffix such as
 * `shaftPower_W`, ratios such as `isentropicEfficiency`): what a screen calls them and which kind of
 * number they carry, so the number is written in the site's display units. The API keeps the
 * identifiers; tests/words/catalogue.test.ts reads them from the engine's source and fails when one
 * has no entry here.
 */
import { figure, type WordEntry } from './types';

/** Figures of a balance and its companions (src/lib/equipment/balance.ts, balances/*.ts `extras`). */
export const FIGURE_WORDS = {
  fuel_W: figure('fuel exergy F', 'power', 'Exergy the unit uses up: what it is given to make its product.'),
  product_W: figure('product exergy P', 'power', 'Exergy the unit is there to deliver.'),
  loss_W: figure('exergy loss L', 'power', 'Exergy that leaves the unit unused (stack gas, cooling water, vents).'),
  destruction_W: figure('exergy destruction D', 'power', 'Exergy destroyed inside the unit by friction, mixing, heat transfer and combustion; F = P + L + D.'),
  efficiency: figure('exergy efficiency P / F', 'ratio', 'Share of the fuel exergy that the unit turns into product.'),
  entropyGeneration_W_per_K: figure('entropy generation', 'entropyRate', 'Entropy made in the unit, from its entropy balance.'),
  T0Sgen_W: figure('T0 × entropy generation', 'power', 'Destruction as the entropy balance gives it; it should equal D.'),
  gouyStodolaResidual_W: figure('D − T0 × entropy generation', 'power', 'Difference of the two ways of finding destruction; near zero when mass and energy close.'),
  massResidual_kg_per_s: figure('mass residual', 'massFlow', 'Mass in minus mass out; near zero when the flow meters agree.'),
  energyResidual_W: figure('first-law residual', 'power', 'Energy in minus energy out: heat lost to the surroundings or a meter off.'),
  energyClosure_pct: figure('first-law closure', 'percent', 'The first-law residual as a share of the energy throughput.'),
  closure_pct: figure('balance closure', 'percent', 'The larger of the mass and energy residuals as a share of the throughput.'),
  destructionCost_per_h: figure('cost of destruction', 'none', 'What the destroyed exergy costs per hour at the price of the fuel exergy.'),
  shaftPower_W: figure('shaft power', 'power', 'Power at the shaft, after the generator or motor efficiency.'),
  isentropicEfficiency: figure('isentropic efficiency', 'ratio', 'Ideal over actual enthalpy change (turbine: actual over ideal).'),
  expansionEfficiency: figure('expansion efficiency of the wet exhaust', 'ratio', 'Efficiency assumed to find the enthalpy of a wet exhaust.'),
  hotDuty_W: figure('heat given by the hot side', 'power', 'Heat the hot streams give up.'),
  coldDuty_W: figure('heat taken by the cold side', 'power', 'Heat the cold streams take up.'),
  duty_W: figure('heat duty', 'power', 'Heat the unit rejects or takes up.'),
  energyEfficiency: figure('energy efficiency', 'ratio', 'Power out over power in.'),
  lambda: figure('excess air ratio λ', 'ratio', 'Air supplied over the air that burns the fuel exactly.'),
  airFlow_kg_per_s: figure('combustion air flow', 'massFlow', 'Air flow found from the fuel flow and the O2 in the flue gas.'),
  flueGasFlow_kg_per_s: figure('flue gas flow', 'massFlow', 'Flue gas flow from the combustion balance.'),
  stackLossPhysical_W: figure('stack loss (heat)', 'power', 'Exergy of the flue gas by its temperature and pressure.'),
  stackLossChemical_W: figure('stack loss (composition)', 'power', 'Exergy of the flue gas by its composition.'),
  fuelChemicalExergy_J_per_kg: figure('chemical exergy of the fuel', 'specificEnergy', 'Work obtainable from a kilogram of fuel brought to the environment.'),
  energyEfficiencyLHV: figure('boiler efficiency (LHV)', 'ratio', 'Heat to water and steam over fuel energy on lower heating value.'),
  extraThroughput_W: figure('fuel energy', 'power', 'Fuel energy on lower heating value, counted in the throughput.'),
} as const satisfies Record<string, WordEntry>;

/**
 * Entries of the balance's input vector: the part after the port name ('steam in.T_K') or the whole
 * name for the unit's own inputs (src/lib/engine map-*.ts).
 */
export const INPUT_WORDS = {
  p_Pa: figure('pressure', 'pressure', 'Pressure at the port.'),
  T_K: figure('temperature', 'temperature', 'Temperature at the port.'),
  mDot_kg_per_s: figure('mass flow', 'massFlow', 'Mass flow through the port.'),
  x: figure('vapour fraction', 'ratio', 'Mass share of vapour in wet steam.'),
  O2_fraction: figure('O2 in the flue gas', 'ratio', 'Oxygen share of the flue gas, which fixes the excess air.'),
  Q_W: figure('heat flow', 'power', 'Heat through the port.'),
  Tb_K: figure('boundary temperature', 'temperature', 'Temperature at which the heat crosses the boundary.'),
  boundaryT_K: figure('fixed boundary temperature', 'temperature', 'Boundary temperature set on the port.'),
  T0_K: figure('dead-state temperature T0', 'temperature', 'Temperature of the surroundings the exergy is measured against.'),
  p0_Pa: figure('dead-state pressure p0', 'pressure', 'Pressure of the surroundings the exergy is measured against.'),
  power_W: figure('power', 'power', 'Power of the unit as measured.'),
  powerIn_W: figure('power in', 'power', 'Power into the unit.'),
  powerOut_W: figure('power out', 'power', 'Power out of the unit.'),
  generatorEfficiency: figure('generator efficiency', 'ratio', 'Electric power over shaft power of the generator.'),
  motorEfficiency: figure('motor efficiency', 'ratio', 'Shaft power over electric power of the motor.'),
} as const satisfies Record<string, WordEntry>;

/** Parameters of units with a unit suffix or a compound name (src/lib/plant/kinds.ts keys). */
export const PARAMETER_WORDS = {
  minLoad_W: figure('minimum load', 'power', 'Below this load the unit counts as idle.'),
  minLoad_kg_per_s: figure('minimum load', 'massFlow', 'Below this flow the unit counts as idle.'),
  ratedPower_W: figure('rated power', 'power', 'Power on the name plate.'),
  spreadLimit: figure('spread limit', 'percent', 'How much a key tag may move within an hour that counts as steady.'),
  minCoverage: figure('minimum coverage', 'percent', 'Share of the hour the samples of a key tag must cover.'),
  massBalanceTolerance: figure('mass balance tolerance', 'percent', 'How far mass in and out may differ in a sound hour.'),
  driveEfficiency: figure('drive (motor) efficiency', 'ratio', 'Shaft power over electric power of the drive.'),
  powerBasis: figure('power measured at', 'none', 'Whether the power tag measures the shaft or the electric terminals.'),
  wetExhaustMethod: figure('wet exhaust enthalpy from', 'none', 'How the enthalpy of a wet exhaust is found.'),
  powerAccount: figure('power counts as', 'none', 'Whether power into a control volume is fuel, product or loss.'),
} as const satisfies Record<string, WordEntry>;

/** Terms of a baseline (src/lib/analytics/baseline.ts, BaselineTerm). */
export const BASELINE_TERM_WORDS = {
  intercept: figure('constant', 'none', 'The part that does not change with load or ambient temperature.'),
  load: figure('load', 'none', 'The load of the unit in the hour.'),
  T_amb: figure('ambient temperature', 'temperature', "The hour's dead-state temperature T0."),
  'load^2': figure('load²', 'none', 'The square of the load, for a curve that bends.'),
  'T_amb^2': figure('ambient temperature²', 'none', 'The square of the ambient temperature.'),
  'load*T_amb': figure('load × ambient temperature', 'none', 'Load and ambient temperature acting together.'),
} as const satisfies Record<string, WordEntry>;
