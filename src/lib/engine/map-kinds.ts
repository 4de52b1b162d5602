/**
 * One mapper per unit kind of the plant model: which equipment balance it is, how each slot's ports
 * are planned, the unit's power and efficiencies, its load and minimum load, and which mass balance
 * the hour can check. A new unit kind adds its mapper to KIND_MAPPERS (its name and the balance it
 * runs to src/lib/kinds.ts, its catalogue entry to src/lib/plant/kind-catalogue.ts).
 */
import type { PortSpec, UnitModel } from '../equipment';
import type { BalanceKind, UnitKind } from '../kinds';
import type { LinkQuantity, ParamValue } from '../plant/kinds';
import type { MappedUnit } from './map-types';
import { fromLink, linkAt, put, type Ctx } from './map-port';
import { planPort } from './map-plan';
import type { EnginePort, EngineUnit } from './types';

/** What a kind's mapper works on: the context, the unit's merged parameters, the model it fills. */
export interface KindMapping {
  ctx: Ctx;
  unit: EngineUnit;
  params: Record<string, ParamValue>;
  model: UnitModel;
  specs: PortSpec[];
}

/** What a kind's mapper decides besides the model's ports. */
export interface KindResult {
  balanceKind: BalanceKind;
  load: MappedUnit['load'];
  minLoad: number;
  massCheck: MappedUnit['massCheck'];
  /** the entries whose sum is the load (none: no load this hour) */
  loadNames: string[];
}

export type KindMapper = (m: KindMapping) => KindResult;

function num(params: Record<string, ParamValue>, key: string, fallback: number): number {
  const v = params[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : fallback;
}

const flowName = (p: EnginePort | undefined) => (p ? `${p.name}.mDot_kg_per_s` : '');
const sumOf = (ctx: Ctx, names: string[]) => names.reduce((s, n) => s + (ctx.entries.get(n)?.value ?? NaN), 0);
const tagsOf = (ctx: Ctx, names: string[]) =>
  names.map((n) => ctx.entries.get(n)?.source).flatMap((s) => (s?.kind === 'tag' ? [s.tag] : []));

/** The small steps every mapper uses, bound to its mapping. */
function tools(m: KindMapping) {
  const { ctx, unit, specs } = m;
  const bySlot = (slot: string) => unit.ports.filter((p) => p.slot === slot);
  return {
    add: (s: PortSpec | null | undefined) => {
      if (s) specs.push(s);
    },
    bySlot,
    one: (slot: string) => bySlot(slot)[0],
    powerEntry: (name: string, q: LinkQuantity): boolean => {
      const l = linkAt(ctx, null, q);
      if (!l) return false;
      fromLink(ctx, name, l);
      return true;
    },
    measuredFlows: (ps: EnginePort[]) => ps.filter((p) => ctx.entries.has(flowName(p))).map(flowName),
  };
}

/**
 * The rest of a machine whose load is its power (turbines, pumps, compressors, fans): the power
 * entry as the load, minLoad_W, and the mass check of its one stream unless a port's flow comes from
 * the mass balance.
 */
function byPower(m: KindMapping, balanceKind: BalanceKind): KindResult {
  const { ctx, params, specs } = m;
  const load: MappedUnit['load'] = { value: ctx.entries.get('power_W')?.value ?? NaN, unit: 'W', label: 'power', tags: tagsOf(ctx, ['power_W']) };
  const minLoad = num(params, 'minLoad_W', 0);
  const massCheck: MappedUnit['massCheck'] = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
  return { balanceKind, load, minLoad, massCheck, loadNames: ['power_W'] };
}

function turbineMapper(m: KindMapping): KindResult {
  const { ctx, params, model, unit } = m;
  const { add, bySlot, powerEntry } = tools(m);
  const balanceKind: BalanceKind = 'turbine';
  for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
  for (const p of bySlot('extraction')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: false }));
  for (const p of bySlot('exhaust')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: true, flowDefault: 'mass-balance' }));
  powerEntry('power_W', 'power');
  if ((params.powerBasis ?? 'generator-terminals') === 'generator-terminals') {
    model.powerMeasured = 'electric';
    put(ctx, 'generatorEfficiency', num(params, 'generatorEfficiency', 0.97), 0, { kind: 'parameter', key: 'generatorEfficiency' });
  } else model.powerMeasured = 'shaft';
  if (params.wetExhaustMethod === 'condenser-heat-balance') {
    ctx.notes.push("wet exhaust method 'condenser-heat-balance' is worked as the turbine's own energy balance (the condenser is a unit of its own)");
  }
  return byPower(m, balanceKind);
}

function rotatingMachineMapper(m: KindMapping): KindResult {
  const { ctx, params, model, unit } = m;
  const { add, bySlot, powerEntry } = tools(m);
  const balanceKind = unit.kind as 'compressor' | 'pump' | 'fan';
  for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
  for (const p of bySlot('outlet')) add(planPort(ctx, p, { direction: 'out', flowDefault: 'mass-balance' }));
  powerEntry('power_W', 'power');
  if ((params.powerBasis ?? 'electric') === 'electric') {
    model.powerMeasured = 'electric';
    put(ctx, 'motorEfficiency', num(params, 'driveEfficiency', 0.95), 0, { kind: 'parameter', key: 'driveEfficiency' });
  } else model.powerMeasured = 'shaft';
  return byPower(m, balanceKind);
}

function heatExchangerMapper(m: KindMapping): KindResult {
  const { ctx, params, model, specs, unit } = m;
  const { add, one } = tools(m);
  const balanceKind: BalanceKind = 'heat-exchanger';
  model.belowDeadState = 'flag';
  add(one('hotIn') && planPort(ctx, one('hotIn')!, { direction: 'in', role: 'hot' }));
  add(one('hotOut') && planPort(ctx, one('hotOut')!, { direction: 'out', role: 'hot', flowDefault: 'mass-balance' }));
  add(one('coldIn') && planPort(ctx, one('coldIn')!, { direction: 'in', role: 'cold' }));
  add(one('coldOut') && planPort(ctx, one('coldOut')!, { direction: 'out', role: 'cold', flowDefault: 'mass-balance' }));
  const hot = flowName(one('hotIn'));
  const load: MappedUnit['load'] = { value: ctx.entries.get(hot)?.value ?? NaN, unit: 'kg/s', label: 'hot-side flow', tags: tagsOf(ctx, [hot]) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const groups = (['hot', 'cold'] as const).filter((r) => !specs.some((s) => s.role === r && s.flow !== undefined && s.flow !== 'measured'));
  const massCheck: MappedUnit['massCheck'] = groups.length ? { groups: [...groups] } : null;
  return { balanceKind, load, minLoad, massCheck, loadNames: [hot] };
}

function boilerMapper(m: KindMapping): KindResult {
  const { ctx, params, specs, unit } = m;
  const { add, bySlot, one } = tools(m);
  const balanceKind: BalanceKind = 'boiler';
  const fuelPort = one('fuel');
  add(fuelPort && planPort(ctx, fuelPort, { direction: 'in', role: 'fuel', ambientDefault: true }));
  for (const p of bySlot('air')) add(planPort(ctx, p, { direction: 'in', role: 'air', ambientDefault: true, flowForced: 'fuel-ratio' }));
  for (const p of bySlot('flueGas')) add(planPort(ctx, p, { direction: 'out', role: 'flue-gas', pFromAtmosphere: true, flowForced: 'fuel-ratio' }));
  for (const p of bySlot('feedwater')) add(planPort(ctx, p, { direction: 'in', role: 'water' }));
  const steam = bySlot('steam');
  for (const p of steam) add(planPort(ctx, p, { direction: 'out', role: 'water', flowDefault: 'mass-balance' }));
  for (const p of bySlot('reheatIn')) add(planPort(ctx, p, { direction: 'in', role: 'water', group: 'reheat' }));
  for (const p of bySlot('reheatOut')) add(planPort(ctx, p, { direction: 'out', role: 'water', group: 'reheat', flowDefault: 'mass-balance' }));
  for (const p of bySlot('blowdown')) add(planPort(ctx, p, { direction: 'out', role: 'blowdown', satLiquidDefault: { copyP: steam[0]?.name } }));
  const steamFlows = steam.map(flowName);
  const load: MappedUnit['load'] = { value: steamFlows.length ? sumOf(ctx, steamFlows) : NaN, unit: 'kg/s', label: 'steam flow', tags: tagsOf(ctx, steamFlows) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const groups: string[] = [];
  if (!specs.some((s) => (s.role === 'water' || s.role === 'blowdown') && !s.group && s.flow === 'mass-balance')) groups.push('water');
  if (bySlot('reheatIn').length && !specs.some((s) => s.group === 'reheat' && s.flow === 'mass-balance')) groups.push('reheat');
  const massCheck: MappedUnit['massCheck'] = groups.length ? { groups } : null;
  return { balanceKind, load, minLoad, massCheck, loadNames: steamFlows };
}

function letDownValveMapper(m: KindMapping): KindResult {
  const { ctx, params, specs, unit } = m;
  const { add, bySlot, one } = tools(m);
  const balanceKind: BalanceKind = 'valve';
  for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
  for (const p of bySlot('outlet')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: true, flowDefault: 'mass-balance' }));
  const f = flowName(one('inlet'));
  const load: MappedUnit['load'] = { value: ctx.entries.get(f)?.value ?? NaN, unit: 'kg/s', label: 'flow', tags: tagsOf(ctx, [f]) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const massCheck: MappedUnit['massCheck'] = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
  return { balanceKind, load, minLoad, massCheck, loadNames: [f] };
}

function mixerMapper(m: KindMapping): KindResult {
  const { ctx, params, specs, unit } = m;
  const { add, bySlot, one, measuredFlows } = tools(m);
  const balanceKind: BalanceKind = 'mixer';
  const inlets = bySlot('inlet');
  for (const p of inlets) add(planPort(ctx, p, { direction: 'in' }));
  const outlet = one('outlet');
  add(outlet && planPort(ctx, outlet, { direction: 'out', role: 'outlet', flowDefault: 'mass-balance' }));
  for (const p of bySlot('vent')) {
    if (!linkAt(ctx, p.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow')) {
      ctx.notes.push(`vent '${p.name}' has no flow linked: left out of the balance`);
      continue;
    }
    add(planPort(ctx, p, { direction: 'out', role: 'vent', satVapourDefault: { copyP: outlet?.name } }));
  }
  const out = flowName(outlet);
  const useOut = ctx.entries.has(out);
  const names = useOut ? [out] : measuredFlows(inlets);
  const load: MappedUnit['load'] = { value: names.length ? sumOf(ctx, names) : NaN, unit: 'kg/s', label: useOut ? 'outlet flow' : 'inlet flows', tags: tagsOf(ctx, names) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const massCheck: MappedUnit['massCheck'] = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
  return { balanceKind, load, minLoad, massCheck, loadNames: names };
}

function condenserMapper(m: KindMapping): KindResult {
  const { ctx, params, specs, unit } = m;
  const { add, one } = tools(m);
  const balanceKind: BalanceKind = 'condenser';
  const cIn = one('coolantIn');
  const cOut = one('coolantOut');
  const coolantFlow = cIn ? linkAt(ctx, cIn.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow') : undefined;
  const coolant = Boolean(cIn && cOut);
  const pin = one('processIn');
  // A wet process inlet can take its state from the energy balance only when the coolant flow is known.
  add(pin && planPort(ctx, pin, { direction: 'in', role: 'process', wetFromEnergy: coolant && Boolean(coolantFlow) }));
  add(one('processOut') && planPort(ctx, one('processOut')!, { direction: 'out', role: 'process', flowDefault: 'mass-balance' }));
  const inletFromEnergy = specs.some((s) => s.name === pin?.name && s.state === 'energy-balance');
  if (coolant) {
    add(planPort(ctx, cIn!, { direction: 'in', role: 'cooling', pFromAtmosphere: true, flowDefault: inletFromEnergy ? 'none' : 'energy-balance' }));
    add(planPort(ctx, cOut!, { direction: 'out', role: 'cooling', pFromAtmosphere: true, flowDefault: 'mass-balance' }));
  } else if (cIn || cOut) ctx.notes.push('coolant side incomplete (needs an inlet and an outlet): destruction and loss are not split');
  const f = flowName(pin);
  const load: MappedUnit['load'] = { value: ctx.entries.get(f)?.value ?? NaN, unit: 'kg/s', label: 'process flow', tags: tagsOf(ctx, [f]) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const massCheck: MappedUnit['massCheck'] = specs.some((s) => s.role === 'process' && s.flow === 'mass-balance') ? null : { groups: ['process'] };
  return { balanceKind, load, minLoad, massCheck, loadNames: [f] };
}

function motorGeneratorMapper(m: KindMapping): KindResult {
  const { ctx, params, unit } = m;
  const { powerEntry } = tools(m);
  const balanceKind: BalanceKind = params.mode === 'generator' ? 'generator' : 'motor';
  powerEntry('powerIn_W', 'powerIn');
  powerEntry('powerOut_W', 'powerOut');
  const load: MappedUnit['load'] = { value: ctx.entries.get('powerOut_W')?.value ?? NaN, unit: 'W', label: 'power out', tags: tagsOf(ctx, ['powerOut_W']) };
  const minLoad = num(params, 'minLoad_W', 0);
  return { balanceKind, load, minLoad, massCheck: null, loadNames: ['powerOut_W'] };
}

function controlVolumeMapper(m: KindMapping): KindResult {
  const { ctx, params, model, specs, unit } = m;
  const { add, bySlot, one, powerEntry, measuredFlows } = tools(m);
  const balanceKind: BalanceKind = 'generic';
  const inlets = bySlot('inlet');
  let mb = false;
  for (const p of [...inlets, ...bySlot('outlet')]) {
    const direction = p.slot === 'inlet' ? 'in' : 'out';
    const hasFlow = Boolean(linkAt(ctx, p.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow'));
    const s = planPort(ctx, p, { direction, role: p.account ?? 'fuel', flowDefault: !hasFlow && !mb ? 'mass-balance' : 'none' });
    if (s?.flow === 'mass-balance') mb = true;
    add(s);
  }
  model.chemical = false;
  model.powers = [];
  model.heats = [];
  if (linkAt(ctx, null, 'powerIn')) {
    model.powers.push({ name: 'power in', role: 'fuel', direction: 'in' });
    powerEntry('power in.power_W', 'powerIn');
  }
  if (linkAt(ctx, null, 'powerOut')) {
    model.powers.push({ name: 'power out', role: 'product', direction: 'out' });
    powerEntry('power out.power_W', 'powerOut');
  }
  for (const p of [...bySlot('heatIn'), ...bySlot('heatOut')]) {
    const direction = p.slot === 'heatIn' ? 'in' : 'out';
    const q = linkAt(ctx, p.name, 'heatFlow');
    const t = linkAt(ctx, p.name, 'temperature');
    if (!q) continue; // reported as a missing required link
    fromLink(ctx, `${p.name}.Q_W`, q);
    if (t) fromLink(ctx, `${p.name}.Tb_K`, t);
    else if (p.boundaryT_K !== null) put(ctx, `${p.name}.Tb_K`, p.boundaryT_K, 0, { kind: 'parameter', key: `${p.name}.boundaryT_K` });
    else {
      ctx.problems.push({ code: 'LINK_MISSING', message: `${p.name}: no boundary temperature (link one, or set the port's boundaryT_K)` });
      continue;
    }
    const role = (p.account ?? (direction === 'in' ? 'fuel' : 'product')) as 'fuel' | 'product' | 'loss';
    model.heats.push({ name: p.name, role, direction });
    ctx.plans.push({ name: p.name, slot: p.slot, direction, fluid: 'heat', state: t ? 'boundary temperature measured' : 'fixed boundary temperature', flow: 'heat flow measured' });
  }
  const names = measuredFlows(inlets);
  const load: MappedUnit['load'] = { value: names.length ? sumOf(ctx, names) : NaN, unit: 'kg/s', label: 'inlet flows', tags: tagsOf(ctx, names) };
  const minLoad = num(params, 'minLoad_kg_per_s', 0);
  const massCheck: MappedUnit['massCheck'] = mb || specs.length === 0 ? null : { groups: ['main'] };
  return { balanceKind, load, minLoad, massCheck, loadNames: names };
}

/** The mapper of each unit kind of the plant model. */
export const KIND_MAPPERS: Record<UnitKind, KindMapper> = {
  'turbine': turbineMapper,
  'compressor': rotatingMachineMapper,
  'pump': rotatingMachineMapper,
  'fan': rotatingMachineMapper,
  'heat-exchanger': heatExchangerMapper,
  'boiler': boilerMapper,
  'let-down-valve': letDownValveMapper,
  'mixer': mixerMapper,
  'condenser': condenserMapper,
  'motor-generator': motorGeneratorMapper,
  'control-volume': controlVolumeMapper,
};
