/**
 * Invented units for the engine tests, each with tag readings in engineering units whose SI values are
 * the inputs of an independently worked reference balance:
 * - turbine, let-down valve, pump, boiler: tests/fixtures/equipment-reference.json
 *   (scripts/equipment-reference.py, python3-iapws IAPWS-IF97, NASA-9 gases, SPECO);
 * - heat exchanger: tests/engine/engine-reference.json (tests/engine/engine-reference.py, python3-iapws).
 *
 * The readings are the reference's SI inputs turned into the links' units by hand (exact affine maps:
 * bar = Pa / 1e5; barg = (Pa - 101325) / 1e5 with the site atmosphere 101325 Pa; degC = K - 273.15;
 * t/h = kg/s x 3.6; kPa = Pa / 1e3; MW = W / 1e6; kW = W / 1e3; % = fraction x 100).
 */
import { readFileSync } from 'node:fs';
import type { Fluid, FuelDefinition } from '~/lib/plant/model';
import type { UnitKind } from '~/lib/kinds';
import type { LinkQuantity } from '~/lib/plant/kinds';

export const P_ATM_Pa = 101325;

interface RefCase {
  id: string;
  inputs: Record<string, number>;
  expected: Record<string, number | null>;
}
export const EQUIPMENT_REF = JSON.parse(readFileSync(new URL('../fixtures/equipment-reference.json', import.meta.url), 'utf8')) as {
  library: string;
  library_version: string;
  dead_state: { T0_K: number; p0_Pa: number };
  cases: RefCase[];
};
export const ENGINE_REF = JSON.parse(readFileSync(new URL('./engine-reference.json', import.meta.url), 'utf8')) as {
  library: string;
  library_version: string;
  dead_state: { T0_K: number; p0_Pa: number };
  heatExchanger: { readings: Record<string, number>; expected: Record<string, number> };
};
export const refCase = (id: string) => EQUIPMENT_REF.cases.find((c) => c.id === id)!;

export interface CasePort {
  name: string;
  slot: string;
  fluid: Fluid;
}
export interface CaseLink {
  port?: string;
  quantity: LinkQuantity;
  tag: string;
  unit: string;
  basis?: 'dry' | 'wet';
  uncertainty?: { mode: 'absolute' | 'relative'; value: number };
  /** the hour's mean reading in `unit` */
  reading: number;
}
export interface EngineCase {
  id: string;
  source: string;
  kind: UnitKind;
  parameters: Record<string, number | string>;
  fuel?: FuelDefinition;
  ports: CasePort[];
  links: CaseLink[];
  expected: { fuel_W: number; product_W: number | null; loss_W?: number; destruction_W: number; efficiency: number | null; entropyGeneration_W_per_K?: number; efficiency_U?: number; destruction_U_W?: number };
}

const water: Fluid = { kind: 'water' };
const barg = (p_Pa: number) => (p_Pa - P_ATM_Pa) / 1e5;
const bar = (p_Pa: number) => p_Pa / 1e5;
const degC = (T_K: number) => T_K - 273.15;
const tph = (kg_per_s: number) => kg_per_s * 3.6;

function fromEquipment(id: string) {
  const c = refCase(id);
  return { i: c.inputs, expected: c.expected as EngineCase['expected'], source: `scripts/equipment-reference.py case '${id}' (${EQUIPMENT_REF.library}, iapws ${EQUIPMENT_REF.library_version})` };
}

export function turbineCase(): EngineCase {
  const { i, expected, source } = fromEquipment('turbine-extraction-wet-exhaust');
  return {
    id: 'turbine',
    source,
    kind: 'turbine',
    parameters: { generatorEfficiency: i.generatorEfficiency!, powerBasis: 'generator-terminals', minLoad_W: 1e6 },
    ports: [
      { name: 'main-steam', slot: 'inlet', fluid: water },
      { name: 'extraction', slot: 'extraction', fluid: water },
      { name: 'exhaust', slot: 'exhaust', fluid: water },
    ],
    links: [
      { port: 'main-steam', quantity: 'pressure', tag: 'TG_IN_P', unit: 'barg', reading: barg(i['main-steam.p_Pa']!) },
      { port: 'main-steam', quantity: 'temperature', tag: 'TG_IN_T', unit: 'degC', reading: degC(i['main-steam.T_K']!) },
      { port: 'main-steam', quantity: 'massFlow', tag: 'TG_IN_F', unit: 't/h', reading: tph(i['main-steam.mDot_kg_per_s']!) },
      { port: 'extraction', quantity: 'pressure', tag: 'TG_BL_P', unit: 'bar', reading: bar(i['extraction.p_Pa']!) },
      { port: 'extraction', quantity: 'temperature', tag: 'TG_BL_T', unit: 'degC', reading: degC(i['extraction.T_K']!) },
      { port: 'extraction', quantity: 'massFlow', tag: 'TG_BL_F', unit: 't/h', reading: tph(i['extraction.mDot_kg_per_s']!) },
      { port: 'exhaust', quantity: 'pressure', tag: 'TG_EX_P', unit: 'kPa', reading: i['exhaust.p_Pa']! / 1e3 },
      { quantity: 'power', tag: 'TG_MW', unit: 'MW', reading: i.power_W! / 1e6 },
    ],
    expected,
  };
}

export function valveCase(): EngineCase {
  const { i, expected, source } = fromEquipment('valve-letdown-isenthalpic');
  return {
    id: 'let-down-valve',
    source,
    kind: 'let-down-valve',
    parameters: { minLoad_kg_per_s: 0.1 },
    ports: [
      { name: 'inlet', slot: 'inlet', fluid: water },
      { name: 'outlet', slot: 'outlet', fluid: water },
    ],
    links: [
      { port: 'inlet', quantity: 'pressure', tag: 'PRV_IN_P', unit: 'bar', reading: bar(i['inlet.p_Pa']!) },
      { port: 'inlet', quantity: 'temperature', tag: 'PRV_IN_T', unit: 'degC', reading: degC(i['inlet.T_K']!) },
      { port: 'inlet', quantity: 'massFlow', tag: 'PRV_F', unit: 'kg/s', reading: i['inlet.mDot_kg_per_s']! },
      { port: 'outlet', quantity: 'pressure', tag: 'PRV_OUT_P', unit: 'barg', reading: barg(i['outlet.p_Pa']!) },
    ],
    expected,
  };
}

export function pumpCase(): EngineCase {
  const { i, expected, source } = fromEquipment('pump-feedwater');
  return {
    id: 'pump',
    source,
    kind: 'pump',
    parameters: { powerBasis: 'shaft', minLoad_W: 20e3 },
    ports: [
      { name: 'suction', slot: 'inlet', fluid: water },
      { name: 'discharge', slot: 'outlet', fluid: water },
    ],
    links: [
      { port: 'suction', quantity: 'pressure', tag: 'FWP_SUC_P', unit: 'barg', reading: barg(i['suction.p_Pa']!) },
      { port: 'suction', quantity: 'temperature', tag: 'FWP_SUC_T', unit: 'degC', reading: degC(i['suction.T_K']!) },
      { port: 'suction', quantity: 'massFlow', tag: 'FWP_F', unit: 't/h', reading: tph(i['suction.mDot_kg_per_s']!) },
      { port: 'discharge', quantity: 'pressure', tag: 'FWP_DIS_P', unit: 'barg', reading: barg(i['discharge.p_Pa']!) },
      { port: 'discharge', quantity: 'temperature', tag: 'FWP_DIS_T', unit: 'degC', reading: degC(i['discharge.T_K']!) },
      { quantity: 'power', tag: 'FWP_KW', unit: 'kW', reading: i.power_W! / 1e3 },
    ],
    expected,
  };
}

/** The reference's main steam flow comes from the mass balance; here it is measured at that value. */
export function boilerCase(): EngineCase {
  const { i, expected, source } = fromEquipment('boiler-gas-reheat-blowdown');
  const steam = i['feedwater.mDot_kg_per_s']! - i['blowdown.mDot_kg_per_s']!; // mass balance of the water line (self-consistency)
  return {
    id: 'boiler',
    source,
    kind: 'boiler',
    parameters: { minLoad_kg_per_s: 2 },
    fuel: { by: 'composition', moleFractions: { CH4: 0.93, C2H6: 0.04, CO2: 0.01, N2: 0.02 }, price: 'pipeline gas' },
    ports: [
      { name: 'fuel', slot: 'fuel', fluid: { kind: 'fuel' } },
      { name: 'air', slot: 'air', fluid: { kind: 'air' } },
      { name: 'stack', slot: 'flueGas', fluid: { kind: 'flue-gas' } },
      { name: 'feedwater', slot: 'feedwater', fluid: water },
      { name: 'main-steam', slot: 'steam', fluid: water },
      { name: 'blowdown', slot: 'blowdown', fluid: water },
      { name: 'cold-reheat', slot: 'reheatIn', fluid: water },
      { name: 'hot-reheat', slot: 'reheatOut', fluid: water },
    ],
    links: [
      { port: 'fuel', quantity: 'pressure', tag: 'B_GAS_P', unit: 'bar', reading: bar(i['fuel.p_Pa']!) },
      { port: 'fuel', quantity: 'temperature', tag: 'B_GAS_T', unit: 'degC', reading: degC(i['fuel.T_K']!) },
      { port: 'fuel', quantity: 'massFlow', tag: 'B_GAS_F', unit: 'kg/s', reading: i['fuel.mDot_kg_per_s']! },
      { port: 'air', quantity: 'pressure', tag: 'B_AIR_P', unit: 'kPa', reading: i['air.p_Pa']! / 1e3 },
      { port: 'air', quantity: 'temperature', tag: 'B_AIR_T', unit: 'degC', reading: degC(i['air.T_K']!) },
      { port: 'stack', quantity: 'pressure', tag: 'B_STACK_P', unit: 'kPa', reading: i['stack.p_Pa']! / 1e3 },
      { port: 'stack', quantity: 'temperature', tag: 'B_STACK_T', unit: 'degC', reading: degC(i['stack.T_K']!) },
      { port: 'stack', quantity: 'o2Fraction', tag: 'B_STACK_O2', unit: '%', basis: 'dry', reading: i['stack.O2_fraction']! * 100 },
      { port: 'feedwater', quantity: 'pressure', tag: 'B_FW_P', unit: 'bar', reading: bar(i['feedwater.p_Pa']!) },
      { port: 'feedwater', quantity: 'temperature', tag: 'B_FW_T', unit: 'degC', reading: degC(i['feedwater.T_K']!) },
      { port: 'feedwater', quantity: 'massFlow', tag: 'B_FW_F', unit: 't/h', reading: tph(i['feedwater.mDot_kg_per_s']!) },
      { port: 'main-steam', quantity: 'pressure', tag: 'B_MS_P', unit: 'bar', reading: bar(i['main-steam.p_Pa']!) },
      { port: 'main-steam', quantity: 'temperature', tag: 'B_MS_T', unit: 'degC', reading: degC(i['main-steam.T_K']!) },
      { port: 'main-steam', quantity: 'massFlow', tag: 'B_MS_F', unit: 't/h', reading: tph(steam) },
      { port: 'blowdown', quantity: 'pressure', tag: 'B_BD_P', unit: 'bar', reading: bar(i['blowdown.p_Pa']!) },
      { port: 'blowdown', quantity: 'massFlow', tag: 'B_BD_F', unit: 'kg/s', reading: i['blowdown.mDot_kg_per_s']! },
      { port: 'cold-reheat', quantity: 'pressure', tag: 'B_CRH_P', unit: 'bar', reading: bar(i['cold-reheat.p_Pa']!) },
      { port: 'cold-reheat', quantity: 'temperature', tag: 'B_CRH_T', unit: 'degC', reading: degC(i['cold-reheat.T_K']!) },
      { port: 'cold-reheat', quantity: 'massFlow', tag: 'B_CRH_F', unit: 't/h', reading: tph(i['cold-reheat.mDot_kg_per_s']!) },
      { port: 'hot-reheat', quantity: 'pressure', tag: 'B_HRH_P', unit: 'bar', reading: bar(i['hot-reheat.p_Pa']!) },
      { port: 'hot-reheat', quantity: 'temperature', tag: 'B_HRH_T', unit: 'degC', reading: degC(i['hot-reheat.T_K']!) },
    ],
    expected,
  };
}

export function heatExchangerCase(): EngineCase {
  const r = ENGINE_REF.heatExchanger.readings;
  const abs05 = { mode: 'absolute' as const, value: 0.5 };
  const p05 = { mode: 'relative' as const, value: 0.5 };
  const f1 = { mode: 'relative' as const, value: 1 };
  return {
    id: 'heat-exchanger',
    source: `tests/engine/engine-reference.py (${ENGINE_REF.library}, iapws ${ENGINE_REF.library_version})`,
    kind: 'heat-exchanger',
    parameters: { minLoad_kg_per_s: 0.2 },
    ports: [
      { name: 'steam-in', slot: 'hotIn', fluid: water },
      { name: 'condensate-out', slot: 'hotOut', fluid: water },
      { name: 'water-in', slot: 'coldIn', fluid: water },
      { name: 'water-out', slot: 'coldOut', fluid: water },
    ],
    links: [
      { port: 'steam-in', quantity: 'pressure', tag: 'HX_HOT_IN_P', unit: 'barg', uncertainty: p05, reading: r.HX_HOT_IN_P! },
      { port: 'steam-in', quantity: 'temperature', tag: 'HX_HOT_IN_T', unit: 'degC', uncertainty: abs05, reading: r.HX_HOT_IN_T! },
      { port: 'steam-in', quantity: 'massFlow', tag: 'HX_HOT_IN_F', unit: 't/h', uncertainty: f1, reading: r.HX_HOT_IN_F! },
      { port: 'condensate-out', quantity: 'pressure', tag: 'HX_HOT_OUT_P', unit: 'barg', uncertainty: p05, reading: r.HX_HOT_OUT_P! },
      { port: 'condensate-out', quantity: 'temperature', tag: 'HX_HOT_OUT_T', unit: 'degC', uncertainty: abs05, reading: r.HX_HOT_OUT_T! },
      { port: 'water-in', quantity: 'pressure', tag: 'HX_COLD_IN_P', unit: 'barg', uncertainty: p05, reading: r.HX_COLD_IN_P! },
      { port: 'water-in', quantity: 'temperature', tag: 'HX_COLD_IN_T', unit: 'degC', uncertainty: abs05, reading: r.HX_COLD_IN_T! },
      { port: 'water-in', quantity: 'massFlow', tag: 'HX_COLD_IN_F', unit: 't/h', uncertainty: f1, reading: r.HX_COLD_IN_F! },
      { port: 'water-out', quantity: 'pressure', tag: 'HX_COLD_OUT_P', unit: 'barg', uncertainty: p05, reading: r.HX_COLD_OUT_P! },
      { port: 'water-out', quantity: 'temperature', tag: 'HX_COLD_OUT_T', unit: 'degC', uncertainty: abs05, reading: r.HX_COLD_OUT_T! },
    ],
    expected: ENGINE_REF.heatExchanger.expected as EngineCase['expected'],
  };
}

export const ALL_CASES = () => [turbineCase(), valveCase(), pumpCase(), boilerCase(), heatExchangerCase()];

/** A steady tag hour around a mean: full coverage, 60 samples, spread 0.2 % of the reading. */
export function steadyHour(mean: number) {
  const half = Math.abs(mean) * 0.001;
  return { mean, min: mean - half, max: mean + half, std: half / 2, samples: 60, coveredFraction: 1, nonNumeric: 0, outOfRange: 0, flatline: false };
}
