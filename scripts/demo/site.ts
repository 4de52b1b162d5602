/**
 * The demo site: Harrowgate Mills Energy Centre, the invented steam and power plant of an invented
 * industrial campus (docs/demo.md). One place declares every historian tag (name, description,
 * engineering unit as exported, decimals, instrument noise) and the plant model that links them, so
 * the generator (./generate.ts) and the model file (./harrowgate.model.json) cannot disagree.
 *
 * Everything here is invented: the site, the tenants, the tag names and the figures.
 */
import type { LinkModel, PlantModel, UnitModel } from '~/lib/plant';
import type { Composition } from '~/lib/thermo';

export const DEMO_SITE_NAME = 'Harrowgate Mills Energy Centre';
export const DEMO_TIME_ZONE = 'Europe/London';
/** Site atmospheric pressure [Pa] (about 95 m above sea level); gauge readings are relative to it. */
export const DEMO_P_ATM_Pa = 100_200;
export const DEMO_ELEVATION_m = 95;

/** Pipeline natural gas by composition (mole fractions, invented but typical). */
export const DEMO_GAS: Readonly<Composition> = Object.freeze({ CH4: 0.912, C2H6: 0.048, C3H8: 0.012, CO2: 0.01, N2: 0.018 });

/** Generator efficiency of TG1 [-] (W_el = W_shaft eta_gen); the model and the generator share it. */
export const TG1_GENERATOR_EFFICIENCY = 0.965;
/** Motor efficiency of the feed pump and the air compressor drives [-]. */
export const PUMP_DRIVE_EFFICIENCY = 0.94;
export const COMPRESSOR_DRIVE_EFFICIENCY = 0.94;

/** Instrument noise of a tag: standard deviation = abs + rel * |reading| [tag unit]. */
export interface Noise {
  abs: number;
  rel?: number;
}

/** One column of the export. */
export interface DemoTag {
  /** internal key the simulation writes (SI value) */
  key: string;
  /** tag name as in the export's header */
  tag: string;
  description: string;
  /** engineering unit as exported */
  unit: string;
  /** quantity of src/lib/units the unit converts as */
  quantity: 'pressure' | 'temperature' | 'massFlow' | 'standardVolumeFlow' | 'power' | 'fraction' | 'ratio' | 'speed';
  decimals: number;
  noise: Noise;
}

const t = (key: string, tag: string, description: string, unit: string, quantity: DemoTag['quantity'], decimals: number, noise: Noise): DemoTag => ({
  key,
  tag,
  description,
  unit,
  quantity,
  decimals,
  noise,
});

/**
 * The export's columns in their order. Tag convention of the site: HM (Harrowgate Mills), the unit's
 * code, then an ISA-style letter code with a loop number (FI flow, PI pressure, TI temperature,
 * JI power, AI analyser, LI level, SI speed).
 */
export const DEMO_TAGS: readonly DemoTag[] = [
  t('ambient.T', 'HM_SITE_TI001', 'Weather station air temperature', 'degC', 'temperature', 2, { abs: 0.08 }),
  // Boiler B1
  t('b1.steam.m', 'HM_B1_FI101', 'Boiler B1 steam flow', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  t('b1.steam.p', 'HM_B1_PI102', 'Boiler B1 steam pressure', 'bar(g)', 'pressure', 2, { abs: 0.02 }),
  t('b1.steam.T', 'HM_B1_TI103', 'Boiler B1 steam temperature', 'degC', 'temperature', 1, { abs: 0.25 }),
  t('b1.level', 'HM_B1_LI105', 'Boiler B1 drum level', '%', 'ratio', 1, { abs: 0.6 }),
  t('b1.fw.m', 'HM_B1_FI111', 'Boiler B1 feedwater flow', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  t('b1.fw.p', 'HM_B1_PI112', 'Boiler B1 feedwater pressure at economiser inlet', 'bar(g)', 'pressure', 2, { abs: 0.025 }),
  t('b1.fw.T', 'HM_B1_TI113', 'Boiler B1 feedwater temperature at economiser inlet', 'degC', 'temperature', 2, { abs: 0.15 }),
  t('b1.gas.V', 'HM_B1_FI121', 'Boiler B1 natural gas flow', 'Nm3/h', 'standardVolumeFlow', 1, { abs: 1, rel: 0.002 }),
  t('b1.stack.T', 'HM_B1_TI131', 'Boiler B1 stack temperature', 'degC', 'temperature', 1, { abs: 0.3 }),
  t('b1.stack.O2', 'HM_B1_AI132', 'Boiler B1 flue gas O2 (dry, extractive)', '%', 'fraction', 2, { abs: 0.02 }),
  t('b1.air.T', 'HM_B1_TI141', 'Boiler house combustion air intake temperature', 'degC', 'temperature', 2, { abs: 0.08 }),
  // HP header
  t('hp.p', 'HM_HP_PI201', 'HP steam header pressure at TG1 stop valve', 'bar(g)', 'pressure', 2, { abs: 0.02 }),
  t('hp.T', 'HM_HP_TI202', 'HP steam header temperature at TG1 stop valve', 'degC', 'temperature', 1, { abs: 0.25 }),
  // Turbine-generator TG1
  t('tg1.m', 'HM_TG1_FI211', 'TG1 inlet steam flow', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  t('tg1.ex.p', 'HM_TG1_PI221', 'TG1 exhaust pressure', 'bar(g)', 'pressure', 3, { abs: 0.006 }),
  t('tg1.ex.T', 'HM_TG1_TI222', 'TG1 exhaust temperature', 'degC', 'temperature', 1, { abs: 0.25 }),
  t('tg1.W', 'HM_TG1_JI230', 'TG1 generator output', 'kW', 'power', 1, { abs: 1, rel: 0.002 }),
  t('tg1.speed', 'HM_TG1_SI231', 'TG1 turbine speed', 'rpm', 'speed', 0, { abs: 2 }),
  // Let-down valve PRV1
  t('prv1.m', 'HM_PRV1_FI241', 'PRV1 let-down steam flow', 't/h', 'massFlow', 3, { abs: 0.0075, rel: 0.002 }),
  t('prv1.T', 'HM_PRV1_TI242', 'PRV1 downstream steam temperature', 'degC', 'temperature', 1, { abs: 0.3 }),
  // LP header
  t('lp.p', 'HM_LP_PI301', 'LP steam header pressure', 'bar(g)', 'pressure', 3, { abs: 0.006 }),
  t('lp.T', 'HM_LP_TI302', 'LP steam header temperature', 'degC', 'temperature', 1, { abs: 0.25 }),
  t('lp.campus.m', 'HM_LP_FI310', 'LP steam to campus distribution', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  // Deaerator DA1
  t('da.p', 'HM_DA1_PI401', 'Deaerator DA1 pressure', 'bar(g)', 'pressure', 3, { abs: 0.002 }),
  t('da.out.T', 'HM_DA1_TI402', 'Deaerator DA1 storage outlet temperature', 'degC', 'temperature', 2, { abs: 0.12 }),
  t('da.steam.m', 'HM_DA1_FI411', 'Deaerator DA1 heating steam flow', 't/h', 'massFlow', 3, { abs: 0.0025, rel: 0.002 }),
  t('da.steam.T', 'HM_DA1_TI412', 'Deaerator DA1 heating steam temperature', 'degC', 'temperature', 1, { abs: 0.3 }),
  t('da.cr.m', 'HM_DA1_FI421', 'Condensate return flow to DA1', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  t('da.cr.p', 'HM_DA1_PI422', 'Condensate return pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('da.cr.T', 'HM_DA1_TI423', 'Condensate return temperature', 'degC', 'temperature', 2, { abs: 0.15 }),
  t('da.mu.m', 'HM_DA1_FI431', 'Treated make-up water flow to DA1', 't/h', 'massFlow', 2, { abs: 0.01, rel: 0.002 }),
  t('da.mu.p', 'HM_DA1_PI432', 'Make-up water pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('da.mu.T', 'HM_DA1_TI433', 'Make-up water temperature', 'degC', 'temperature', 2, { abs: 0.12 }),
  // Feed pump FWP1
  t('fwp.suc.p', 'HM_FWP1_PI501', 'Feed pump FWP1 suction pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('fwp.suc.T', 'HM_FWP1_TI502', 'Feed pump FWP1 suction temperature', 'degC', 'temperature', 2, { abs: 0.08 }),
  t('fwp.dis.p', 'HM_FWP1_PI511', 'Feed pump FWP1 discharge pressure', 'bar(g)', 'pressure', 2, { abs: 0.025 }),
  t('fwp.dis.T', 'HM_FWP1_TI512', 'Feed pump FWP1 discharge temperature', 'degC', 'temperature', 2, { abs: 0.08 }),
  t('fwp.W', 'HM_FWP1_JI520', 'Feed pump FWP1 motor power', 'kW', 'power', 2, { abs: 0.05, rel: 0.002 }),
  // Process hot-water heater E601
  t('e601.steam.m', 'HM_E601_FI601', 'E601 heating steam flow', 't/h', 'massFlow', 3, { abs: 0.0025, rel: 0.002 }),
  t('e601.shell.p', 'HM_E601_PI602', 'E601 shell (steam side) pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('e601.steam.T', 'HM_E601_TI603', 'E601 steam inlet temperature', 'degC', 'temperature', 1, { abs: 0.3 }),
  t('e601.cond.p', 'HM_E601_PI604', 'E601 condensate outlet pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('e601.cond.T', 'HM_E601_TI605', 'E601 condensate outlet temperature', 'degC', 'temperature', 2, { abs: 0.15 }),
  t('e601.loop.m', 'HM_E601_FI611', 'Process hot-water loop flow', 't/h', 'massFlow', 2, { abs: 0.015, rel: 0.002 }),
  t('e601.ret.p', 'HM_E601_PI612', 'Process hot-water return pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('e601.ret.T', 'HM_E601_TI613', 'Process hot-water return temperature', 'degC', 'temperature', 2, { abs: 0.06 }),
  t('e601.sup.p', 'HM_E601_PI614', 'Process hot-water supply pressure', 'bar(g)', 'pressure', 3, { abs: 0.004 }),
  t('e601.sup.T', 'HM_E601_TI615', 'Process hot-water supply temperature', 'degC', 'temperature', 2, { abs: 0.06 }),
  // Air compressor AC1
  t('ac1.in.p', 'HM_AC1_PI701', 'Air compressor AC1 inlet pressure (after filter)', 'bar(g)', 'pressure', 4, { abs: 0.0004 }),
  t('ac1.in.T', 'HM_AC1_TI702', 'Air compressor AC1 inlet air temperature', 'degC', 'temperature', 2, { abs: 0.15 }),
  t('ac1.V', 'HM_AC1_FI703', 'Air compressor AC1 free air delivery', 'Nm3/h', 'standardVolumeFlow', 1, { abs: 1, rel: 0.002 }),
  t('ac1.out.p', 'HM_AC1_PI711', 'Air compressor AC1 discharge pressure', 'bar(g)', 'pressure', 3, { abs: 0.006 }),
  t('ac1.out.T', 'HM_AC1_TI712', 'Air compressor AC1 air-end discharge temperature', 'degC', 'temperature', 1, { abs: 0.25 }),
  t('ac1.W', 'HM_AC1_JI720', 'Air compressor AC1 motor power', 'kW', 'power', 1, { abs: 0.1, rel: 0.002 }),
];

/** The tag of an internal key. */
export function tagOf(key: string): DemoTag {
  const found = DEMO_TAGS.find((x) => x.key === key);
  if (!found) throw new Error(`No demo tag with key '${key}'.`);
  return found;
}

type LinkQ = LinkModel['quantity'];
/** A link of a demo tag, with its unit as exported. */
function link(key: string, quantity: LinkQ, port: string | undefined, extra: Partial<LinkModel> = {}): LinkModel {
  const tg = tagOf(key);
  return { ...(port ? { port } : {}), quantity, tag: tg.tag, unit: tg.unit, ...extra };
}
const rel = (percent: number) => ({ uncertainty: { mode: 'relative' as const, value: percent } });
const abs = (value: number) => ({ uncertainty: { mode: 'absolute' as const, value } });
const range = (validMin: number, validMax: number) => ({ validMin, validMax });

const water = { kind: 'water' as const };

/** The units of the site, in the order of the steam cycle. */
function units(): UnitModel[] {
  return [
    {
      name: 'Boiler B1',
      kind: 'boiler',
      description: 'Gas-fired water-tube boiler with economiser, 28 t/h at 40 bar(g) and 400 degC',
      parameters: { minLoad_kg_per_s: 4 / 3.6 },
      fuel: { by: 'composition', moleFractions: { ...DEMO_GAS }, price: 'pipeline gas' },
      ports: [
        { name: 'feedwater', slot: 'feedwater', fluid: water },
        { name: 'main steam', slot: 'steam', fluid: water },
        { name: 'natural gas', slot: 'fuel', fluid: { kind: 'fuel' } },
        { name: 'stack', slot: 'flueGas', fluid: { kind: 'flue-gas' } },
      ],
      links: [
        link('b1.fw.p', 'pressure', 'feedwater', { ...rel(0.25), ...range(0, 70) }),
        link('b1.fw.T', 'temperature', 'feedwater', { ...abs(0.5), ...range(0, 200) }),
        link('b1.fw.m', 'massFlow', 'feedwater', { ...rel(1.5), ...range(-1, 40) }),
        link('b1.steam.p', 'pressure', 'main steam', { ...rel(0.25), ...range(0, 50) }),
        link('b1.steam.T', 'temperature', 'main steam', { ...abs(1.5), ...range(0, 450) }),
        link('b1.steam.m', 'massFlow', 'main steam', { ...rel(1.5), ...range(-1, 40) }),
        link('b1.gas.V', 'standardVolumeFlow', 'natural gas', { ...rel(1), ...range(-20, 3000) }),
        link('b1.stack.T', 'temperature', 'stack', { ...abs(1.5), ...range(0, 350) }),
        link('b1.stack.O2', 'o2Fraction', 'stack', { basis: 'dry', ...abs(0.2), ...range(0, 21) }),
      ],
    },
    {
      name: 'TG1',
      kind: 'turbine',
      description: 'Single-stage back-pressure steam turbine with its generator, HP header to LP header, 2.2 MW',
      parameters: { generatorEfficiency: TG1_GENERATOR_EFFICIENCY, powerBasis: 'generator-terminals', minLoad_W: 300_000, ratedPower_W: 2_200_000 },
      ports: [
        { name: 'stop valve', slot: 'inlet', fluid: water },
        { name: 'exhaust', slot: 'exhaust', fluid: water },
      ],
      links: [
        link('hp.p', 'pressure', 'stop valve', { ...rel(0.25), ...range(0, 50) }),
        link('hp.T', 'temperature', 'stop valve', { ...abs(1.5), ...range(0, 450) }),
        link('tg1.m', 'massFlow', 'stop valve', { ...rel(1.5), ...range(-1, 30) }),
        link('tg1.ex.p', 'pressure', 'exhaust', { ...rel(0.5), ...range(0, 10) }),
        link('tg1.ex.T', 'temperature', 'exhaust', { ...abs(1), ...range(0, 400) }),
        link('tg1.W', 'power', undefined, { ...rel(0.5), ...range(-50, 2600) }),
      ],
    },
    {
      name: 'PRV1',
      kind: 'let-down-valve',
      description: 'Let-down valve beside TG1, HP header (40 bar(g)) to LP header (4 bar(g)); shut while TG1 can take the LP demand',
      parameters: { minLoad_kg_per_s: 0.5 / 3.6 },
      // shut in normal operation while TG1 runs; it carries the LP demand only while TG1 is stopped (docs/demo.md)
      normallyIdle: { when: 'always', whileRunning: ['TG1'] },
      ports: [
        { name: 'HP side', slot: 'inlet', fluid: water },
        { name: 'LP side', slot: 'outlet', fluid: water },
      ],
      links: [
        link('hp.p', 'pressure', 'HP side', { ...rel(0.25), ...range(0, 50) }),
        link('hp.T', 'temperature', 'HP side', { ...abs(1.5), ...range(0, 450) }),
        link('prv1.m', 'massFlow', 'HP side', { ...rel(2), ...range(-1, 30) }),
        link('lp.p', 'pressure', 'LP side', { ...rel(0.5), ...range(0, 10) }),
        link('prv1.T', 'temperature', 'LP side', { ...abs(1.5), ...range(0, 450) }),
      ],
    },
    {
      name: 'DA1',
      kind: 'mixer',
      description: 'Spray-tray deaerator at 0.2 bar(g): LP steam heats condensate return and make-up water',
      parameters: { minLoad_kg_per_s: 3 / 3.6 },
      ports: [
        { name: 'heating steam', slot: 'inlet', fluid: water },
        { name: 'condensate return', slot: 'inlet', fluid: water },
        { name: 'make-up water', slot: 'inlet', fluid: water },
        { name: 'deaerated water', slot: 'outlet', fluid: water },
      ],
      links: [
        link('da.p', 'pressure', 'heating steam', { ...abs(0.003), ...range(-0.5, 2) }),
        link('da.steam.T', 'temperature', 'heating steam', { ...abs(1), ...range(0, 400) }),
        link('da.steam.m', 'massFlow', 'heating steam', { ...rel(2), ...range(-1, 10) }),
        link('da.cr.p', 'pressure', 'condensate return', { ...rel(0.5), ...range(-0.5, 6) }),
        link('da.cr.T', 'temperature', 'condensate return', { ...abs(0.5), ...range(0, 150) }),
        link('da.cr.m', 'massFlow', 'condensate return', { ...rel(1.5), ...range(-1, 30) }),
        link('da.mu.p', 'pressure', 'make-up water', { ...rel(0.5), ...range(-0.5, 8) }),
        link('da.mu.T', 'temperature', 'make-up water', { ...abs(0.5), ...range(0, 60) }),
        link('da.mu.m', 'massFlow', 'make-up water', { ...rel(1.5), ...range(-1, 30) }),
        link('da.p', 'pressure', 'deaerated water', { ...abs(0.003), ...range(-0.5, 2) }),
        link('da.out.T', 'temperature', 'deaerated water', { ...abs(0.5), ...range(0, 150) }),
      ],
    },
    {
      name: 'FWP1',
      kind: 'pump',
      description: 'Boiler feed pump, 30 m3/h at 50 bar(g), fixed-speed motor 75 kW',
      parameters: { minLoad_W: 10_000, ratedPower_W: 75_000, powerBasis: 'electric', driveEfficiency: PUMP_DRIVE_EFFICIENCY },
      ports: [
        { name: 'suction', slot: 'inlet', fluid: water },
        { name: 'discharge', slot: 'outlet', fluid: water },
      ],
      links: [
        link('fwp.suc.p', 'pressure', 'suction', { ...rel(0.5), ...range(-0.5, 5) }),
        link('fwp.suc.T', 'temperature', 'suction', { ...abs(0.3), ...range(0, 150) }),
        link('b1.fw.m', 'massFlow', 'suction', { ...rel(1.5), ...range(-1, 40) }),
        link('fwp.dis.p', 'pressure', 'discharge', { ...rel(0.25), ...range(0, 70) }),
        link('fwp.dis.T', 'temperature', 'discharge', { ...abs(0.3), ...range(0, 150) }),
        link('fwp.W', 'power', undefined, { ...rel(0.5), ...range(-5, 90) }),
      ],
    },
    {
      name: 'E601',
      kind: 'heat-exchanger',
      description: 'Shell-and-tube heater: LP steam heats the process hot-water loop of the food hall (65-85 degC); loop off from Saturday night to Monday morning',
      parameters: { minLoad_kg_per_s: 0.3 / 3.6 },
      ports: [
        { name: 'steam in', slot: 'hotIn', fluid: water },
        { name: 'condensate out', slot: 'hotOut', fluid: water },
        { name: 'loop return', slot: 'coldIn', fluid: water },
        { name: 'loop supply', slot: 'coldOut', fluid: water },
      ],
      links: [
        link('e601.shell.p', 'pressure', 'steam in', { ...rel(0.5), ...range(-0.5, 8) }),
        link('e601.steam.T', 'temperature', 'steam in', { ...abs(1), ...range(0, 300) }),
        link('e601.steam.m', 'massFlow', 'steam in', { ...rel(2), ...range(-1, 8) }),
        link('e601.cond.p', 'pressure', 'condensate out', { ...rel(0.5), ...range(-0.5, 8) }),
        link('e601.cond.T', 'temperature', 'condensate out', { ...abs(0.5), ...range(0, 200) }),
        link('e601.ret.p', 'pressure', 'loop return', { ...rel(0.5), ...range(-0.5, 10) }),
        link('e601.ret.T', 'temperature', 'loop return', { ...abs(0.2), ...range(0, 120) }),
        link('e601.loop.m', 'massFlow', 'loop return', { ...rel(1), ...range(-1, 80) }),
        link('e601.sup.p', 'pressure', 'loop supply', { ...rel(0.5), ...range(-0.5, 10) }),
        link('e601.sup.T', 'temperature', 'loop supply', { ...abs(0.2), ...range(0, 120) }),
      ],
    },
    {
      name: 'AC1',
      kind: 'compressor',
      description: 'Oil-free rotary-screw compressor with variable-speed drive, 3 bar(g) conveying air for the bakery (flour and sugar); discharge measured at the air end, before the aftercooler; stopped on Sundays',
      parameters: { minLoad_W: 15_000, ratedPower_W: 110_000, powerBasis: 'electric', driveEfficiency: COMPRESSOR_DRIVE_EFFICIENCY },
      ports: [
        { name: 'air inlet', slot: 'inlet', fluid: { kind: 'air' } },
        { name: 'discharge', slot: 'outlet', fluid: { kind: 'air' } },
      ],
      links: [
        link('ac1.in.p', 'pressure', 'air inlet', { ...abs(0.002), ...range(-0.2, 0.2) }),
        link('ac1.in.T', 'temperature', 'air inlet', { ...abs(0.5), ...range(-30, 60) }),
        link('ac1.V', 'standardVolumeFlow', 'air inlet', { ...rel(2), ...range(-50, 2500) }),
        link('ac1.out.p', 'pressure', 'discharge', { ...rel(0.25), ...range(0, 6) }),
        link('ac1.out.T', 'temperature', 'discharge', { ...abs(1), ...range(-30, 280) }),
        link('ac1.W', 'power', undefined, { ...rel(0.5), ...range(-5, 140) }),
      ],
    },
  ];
}

/** The plant model file of the demo site (format of docs/plant-model.md). */
export function demoModel(): PlantModel {
  return {
    format: 'lossline-plant-model',
    version: 1,
    site: {
      name: DEMO_SITE_NAME,
      timeZone: DEMO_TIME_ZONE,
      elevation_m: DEMO_ELEVATION_m,
      p_atm_Pa: DEMO_P_ATM_Pa,
      // T0 from the boiler house's air intake: the air the boiler burns with, and never below 0 degC
      // (IAPWS-IF97 has no liquid water below it); the weather station tag is exported but not linked
      deadState: { T0_K: 288.15, p0_Pa: DEMO_P_ATM_Pa, T0Tag: { tag: tagOf('b1.air.T').tag, unit: tagOf('b1.air.T').unit } },
      currency: 'GBP',
      prices: [
        { name: 'pipeline gas', kind: 'fuel', price_per_MWh: 38.5, currency: 'GBP' },
        { name: 'grid electricity', kind: 'electricity', price_per_MWh: 172, currency: 'GBP' },
      ],
    },
    units: units(),
  };
}
