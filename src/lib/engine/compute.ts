/**
 * One unit hour, start to finish, pure: dead state of the hour, the unit mapped to the equipment
 * library (./map.ts), the balance with first-order uncertainty (GUM, k = 2), the checks (first-law
 * closure, mass closure, entropy generation against destruction), the hour state with its reasons
 * (src/lib/analytics/steady.ts classifyHour), the cost of destruction, the audit trail and the hashes.
 *
 * Hour state, in order:
 * - suspect: a key tag missing, frozen, out of range (the tag's own range or the link's), poorly
 *   covered or full of status words; a required link missing; the balance cannot be formed; the mass
 *   or first-law balance misses its tolerance; the entropy-generation check fails; negative
 *   destruction; a vapour port within the saturation tolerance (phase unknown);
 * - idle: the load is below the unit's minimum load (or not above zero). Balance problems of an idle
 *   hour are kept as notes, not reasons: a stopped unit's flows do not balance;
 * - unsettled: a key tag's spread within the hour, (max - min) / |mean| in SI (absolute pressure,
 *   kelvin, kg/s, W), is above the unit's spreadLimit (docs/plant-model.md); O2 and vapour fraction use
 *   an absolute limit instead (SPREAD_O2_ABS, SPREAD_X_ABS); no limit is below what the link's
 *   instrument resolves, U = 2 u from its uncertainty and range (src/lib/analytics/steady.ts resolvableSpread);
 * - steady: none of these.
 *
 * The entropy-generation check: the balance gives D from the exergy balance and, independently,
 * Sgen from the entropy balance; Gouy-Stodola says D = T0 Sgen when mass and energy close. Data that
 * do not close the first law make the two differ: when |D - T0 Sgen| exceeds both ENTROPY_CHECK_TOLERANCE
 * of D and the expanded uncertainty of D (k = 2, when propagated), the destruction is not confirmed by
 * the measurements and the hour is suspect.
 *
 * @see docs/domain.md s.2 (Gouy-Stodola), s.6 (steady state, common practice), s.7 (GUM, cost)
 */
import { BalanceInputError, evaluateUnitHour, inputNames, unitHourWithUncertainty, type UnitBalance, type UnitModel } from '../equipment';
import { classifyHour, destructionCost_per_hour, type BalanceClosure, type InstrumentResolution, type SpreadLimit, type TagHourStats } from '../analytics';
import { LINK_QUANTITIES } from '../plant/kinds';
import { ByteHasher, hashOf } from './hash';
import { cachedConverter, mapUnitHour, unitParameters, type InputEntry, type MappedUnit } from './map';
import type { EngineLink, EngineReason, EngineHourState, EngineUnit, TagHour, UnitHourInput, UnitHourResult } from './types';

/** Bumped whenever the engine's method changes, so that every stored hour is recomputed once. */
export const ENGINE_VERSION = 'lossline-engine-2';

/** First-law closure tolerance [-] of the energy throughput. Common practice (docs/domain.md s.6). */
export const ENERGY_CLOSURE_TOLERANCE = 0.05;
/** |D - T0 Sgen| tolerance as a share of D [-]. Lossline's default; common practice, not a published figure. */
export const ENTROPY_CHECK_TOLERANCE = 0.1;
/** Spread limits of fractions, absolute [-]: O2 2 %-points, vapour fraction 0.05. Common practice. */
export const SPREAD_O2_ABS = 0.02;
export const SPREAD_X_ABS = 0.05;
/** Dead-state temperatures the balances accept [K] (src/lib/equipment checkEnv). */
const T0_RANGE_K: [number, number] = [200, 400];
/** Contributors listed in the audit trail. */
const TOP_CONTRIBUTORS = 6;
const LOAD_KEY = 'load';

export interface ComputeOptions {
  /** propagate the tags' uncertainties (GUM); default true */
  uncertainty?: boolean;
  /** the hashes, when the caller has them already (unitHourHashes with the same input and options) */
  hashes?: { modelVersion: string; inputsHash: string };
}

const models = new WeakMap<object, Map<string, UnitModel>>();
/**
 * One model object per unit and distinct model, so that the equipment library's compiled form and
 * its memoised port states are reused from hour to hour. The signature holds everything of a model
 * that can change from one hour to the next for the same unit (state and flow modes, O2 basis, powers).
 */
function sharedModel(unit: EngineUnit, kind: string, model: UnitModel): UnitModel {
  const sig = [
    kind,
    model.powerMeasured ?? '',
    model.belowDeadState ?? '',
    (model.ports ?? []).map((p) => [p.name, p.direction, p.role, p.group, p.state, p.flow, p.fluid.kind, 'o2Basis' in p.fluid ? p.fluid.o2Basis : ''].join(':')).join('|'),
    (model.powers ?? []).map((w) => `${w.name}:${w.role}:${w.direction}`).join('|'),
    (model.heats ?? []).map((q) => `${q.name}:${q.role}:${q.direction}`).join('|'),
  ].join('#');
  let byUnit = models.get(unit);
  if (!byUnit) models.set(unit, (byUnit = new Map()));
  let m = byUnit.get(sig);
  if (!m) byUnit.set(sig, (m = model));
  return m;
}

const versions = new WeakMap<object, Map<string, LinkSet>>();
const siteKeys = new WeakMap<object, number>();
let siteSeq = 0;
const linkKey = (l: EngineLink) => [l.id, l.portName, l.quantity, l.tagName, l.engUnit, l.basis, l.uncertaintyMode, l.uncertainty, l.validMin, l.validMax, l.validFromMs, l.validToMs];

/** What is the same for every hour a set of link versions holds. */
interface LinkSet {
  /** hash of the method (ENGINE_VERSION), the unit, the links, the site's settings, the flue-gas sources */
  modelVersion: string;
  /** the tags whose hours the unit uses: its own, the ambient tag, flue-gas source O2 tags; sorted */
  usedTags: string[];
  /** the unit's links, one per tag, the steady-state test's key tags (with the load) and spread limits */
  linksUsed: EngineLink[];
  keyTags: string[];
  spread: Record<string, SpreadLimit>;
  relLimit: number;
  linkOfTag: Map<string, EngineLink>;
}

/**
 * The model version of an hour and the tags it reads, kept per unit object and link set (the same for
 * every hour those links hold).
 */
const byLinksArray = new WeakMap<object, { unit: object; site: object; sources: unknown; set: LinkSet }>();
function linkSetOf(input: UnitHourInput): LinkSet {
  // The caller usually hands over the same links array for every hour a link set holds.
  const hit = byLinksArray.get(input.links);
  if (hit && hit.unit === input.unit && hit.site === input.site && hit.sources === input.flueGasSources) return hit.set;
  const set = linkSetByKey(input);
  byLinksArray.set(input.links, { unit: input.unit, site: input.site, sources: input.flueGasSources, set });
  return set;
}
function linkSetByKey(input: UnitHourInput): LinkSet {
  let sk = siteKeys.get(input.site);
  if (sk === undefined) siteKeys.set(input.site, (sk = ++siteSeq));
  const fg = input.flueGasSources ? Object.entries(input.flueGasSources).map(([k, v]) => `${k}:${v.o2Link?.id ?? ''}:${v.o2Link?.validToMs ?? ''}`).join(',') : '';
  let key = `${sk}|${fg}`;
  for (const l of input.links) key += `|${l.id}:${l.validFromMs}:${l.validToMs}`;
  let byUnit = versions.get(input.unit);
  if (!byUnit) versions.set(input.unit, (byUnit = new Map()));
  let v = byUnit.get(key);
  if (!v) {
    const { unit, site } = input;
    const modelVersion = hashOf({
      engine: ENGINE_VERSION,
      unit: { kind: unit.kind, parameters: unitParameters(unit), fuel: unit.fuel, ports: unit.ports },
      links: [...input.links].sort((a, b) => (a.id < b.id ? -1 : 1)).map(linkKey),
      site: { p_atm_Pa: site.p_atm_Pa, T0_K: site.T0_K, p0_Pa: site.p0_Pa, t0Tag: site.t0Tag },
      flueGasSources: input.flueGasSources ? Object.fromEntries(Object.entries(input.flueGasSources).map(([k, s]) => [k, { fuel: s.fuel, o2: s.o2Link && linkKey(s.o2Link) }])) : null,
    }).slice(0, 32);
    const used = new Set<string>(input.links.map((l) => l.tagName));
    if (site.t0Tag) used.add(site.t0Tag.name);
    for (const s of Object.values(input.flueGasSources ?? {})) if (s.o2Link) used.add(s.o2Link.tagName);
    const params = unitParameters(unit);
    const relLimit = num(params.spreadLimit, 0.05);
    const linkOfTag = new Map<string, EngineLink>();
    const spread: Record<string, SpreadLimit> = { [LOAD_KEY]: { maxRelSpread: Infinity } };
    for (const l of input.links) {
      if (linkOfTag.has(l.tagName)) continue;
      linkOfTag.set(l.tagName, l);
      const own: SpreadLimit = l.quantity === 'o2Fraction' ? { maxStd: SPREAD_O2_ABS } : l.quantity === 'vapourFraction' ? { maxStd: SPREAD_X_ABS } : { maxRelSpread: relLimit };
      spread[l.tagName] = { ...own, instrument: instrumentOf(l, site.p_atm_Pa) };
    }
    const linksUsed = [...linkOfTag.values()];
    v = { modelVersion, usedTags: [...used].sort(), linksUsed, keyTags: [...linksUsed.map((l) => l.tagName), LOAD_KEY], spread, relLimit, linkOfTag };
    if (byUnit.size > 1000) byUnit.clear();
    byUnit.set(key, v);
  }
  return v;
}

/**
 * The model version and the inputs hash of a unit hour, without computing it: the inputs hash covers
 * the model version, every used tag's statistics, the cost basis and whether uncertainty is propagated.
 * The same inputs always give the same hashes; the engine's caller skips an hour whose stored inputs
 * hash is unchanged.
 */
export function unitHourHashes(input: UnitHourInput, options: ComputeOptions = {}): { modelVersion: string; inputsHash: string } {
  const { modelVersion, usedTags } = linkSetOf(input);
  const h = hasher.reset().text(modelVersion).num(options.uncertainty ?? true).num(input.cost?.cF_per_J ?? null);
  // The tags come in the model version's fixed order, so their names need not be hashed again.
  for (const t of usedTags) {
    const th = input.tagHours.get(t);
    if (!th) h.byte(0);
    else h.byte(1).num(th.mean).num(th.min).num(th.max).num(th.std).num(th.coveredFraction).int(th.samples).int(th.nonNumeric).int(th.outOfRange).byte(th.flatline ? 1 : 0);
  }
  return { modelVersion, inputsHash: h.digest().slice(0, 32) };
}
const hasher = new ByteHasher();

/** The dead state of the hour: the ambient tag's mean when it has one, else the site's fixed T0. */
export function deadStateOf(input: Pick<UnitHourInput, 'site' | 'tagHours'>): { T0_K: number; p0_Pa: number; source: string; tag?: string } {
  const { site } = input;
  if (site.t0Tag) {
    const th = input.tagHours.get(site.t0Tag.name);
    if (th && th.mean !== null && Number.isFinite(th.mean) && th.samples > 0 && !th.flatline) {
      try {
        const T = cachedConverter(site.t0Tag.engUnit, 'temperature', site.p_atm_Pa).toSI(th.mean);
        if (T >= T0_RANGE_K[0] && T <= T0_RANGE_K[1]) return { T0_K: T, p0_Pa: site.p0_Pa, source: 'ambient tag', tag: site.t0Tag.name };
      } catch {
        /* falls back below */
      }
    }
    return { T0_K: site.T0_K, p0_Pa: site.p0_Pa, source: `fallback: the ambient tag ${site.t0Tag.name} has no usable value this hour`, tag: site.t0Tag.name };
  }
  return { T0_K: site.T0_K, p0_Pa: site.p0_Pa, source: 'fixed' };
}

/** The hour's statistics of a link's tag in SI, for the steady-state test (spread as max - min). */
function statsSI(link: EngineLink, th: TagHour | undefined, p_atm_Pa: number): TagHourStats | null {
  if (!th) return null;
  let factor = 1;
  let toSI = (v: number) => v;
  try {
    const c = cachedConverter(link.engUnit, LINK_QUANTITIES[link.quantity].quantity, p_atm_Pa);
    factor = Math.abs(c.factor);
    toSI = c.toSI;
  } catch {
    /* the mapping reports the conversion problem */
  }
  const linkRange =
    (link.validMin !== null && th.min !== null && th.min < link.validMin) || (link.validMax !== null && th.max !== null && th.max > link.validMax) ? 1 : 0;
  const spread = th.min !== null && th.max !== null ? (th.max - th.min) * factor : th.std !== null ? th.std * factor : null;
  return {
    mean: th.mean === null ? null : toSI(th.mean),
    stdDev: spread,
    min: th.min === null ? null : toSI(th.min),
    max: th.max === null ? null : toSI(th.max),
    sampleCount: th.samples,
    coveredFraction: th.coveredFraction,
    flatline: th.flatline,
    outOfRangeCount: th.outOfRange + linkRange,
    nonNumericCount: th.nonNumeric,
  };
}

/** A link's instrument in SI for the spread rule: its standard uncertainty and its span (validMax - validMin). */
function instrumentOf(link: EngineLink, p_atm_Pa: number): InstrumentResolution | undefined {
  let factor: number;
  try {
    factor = Math.abs(cachedConverter(link.engUnit, LINK_QUANTITIES[link.quantity].quantity, p_atm_Pa).factor);
  } catch {
    return undefined; // the mapping reports the conversion problem
  }
  if (!(link.uncertainty >= 0)) return undefined;
  const span = link.validMin !== null && link.validMax !== null && link.validMax > link.validMin ? (link.validMax - link.validMin) * factor : null;
  return link.uncertaintyMode === 'relative' ? { uRel: link.uncertainty / 100, span } : { uAbs: link.uncertainty * factor, span };
}

function num(v: unknown, fallback: number): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : fallback;
}

/** Group of an equipment port as the balances default it (for the mass check's denominator). */
function groupOf(kind: string, s: { role?: string; group?: string }): string {
  if (s.group) return s.group;
  if (kind === 'heat-exchanger' || kind === 'condenser' || kind === 'cooler') return s.role ?? 'main';
  if (kind === 'boiler') return s.role === 'water' || s.role === 'blowdown' ? 'water' : 'gas';
  return 'main';
}

const finiteOrNull = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? null : v);

/**
 * Computes one unit hour.
 * @param input the unit, its links holding in the hour, the hour's tag statistics, site, cost basis
 * @returns the row to store, with state, reasons, figures, uncertainty, cost, detail and hashes
 */
export function computeUnitHour(input: UnitHourInput, options: ComputeOptions = {}): UnitHourResult {
  const withU = options.uncertainty ?? true;
  const { unit, site } = input;
  const params = unitParameters(unit);
  const dead = deadStateOf(input);
  const notes: string[] = [];
  if (dead.source.startsWith('fallback')) notes.push(`dead state: ${dead.source}; T0 = ${dead.T0_K} K (the site's setting)`);

  let mapped: MappedUnit | null = null;
  const problems: EngineReason[] = [];
  try {
    mapped = mapUnitHour(unit, input.links, input.tagHours, site.p_atm_Pa, input.flueGasSources ?? {});
    problems.push(...mapped.problems);
    notes.push(...mapped.notes);
  } catch (err) {
    problems.push({ code: 'MODEL_INCOMPLETE', message: (err as Error).message });
  }

  // Key tags for the steady-state test, in SI.
  const set = linkSetOf(input);
  const { spread, linksUsed, relLimit } = set;
  const tags: Record<string, TagHourStats | null> = {};
  for (const l of linksUsed) tags[l.tagName] = statsSI(l, input.tagHours.get(l.tagName), site.p_atm_Pa);
  const load = mapped?.load.value ?? NaN;
  const minLoad = mapped?.minLoad ?? 0;
  tags[LOAD_KEY] = {
    mean: Number.isFinite(load) ? load : null,
    stdDev: null,
    sampleCount: 1e9,
    coveredFraction: 1,
    flatline: false,
    outOfRangeCount: 0,
    nonNumericCount: 0,
  };
  // A unit at no load is idle even when its minimum load is 0.
  const effMin = minLoad > 0 ? minLoad : Number.MIN_VALUE;
  const idleCandidate = Number.isFinite(load) && load < effMin;

  // The balance.
  let balance: UnitBalance | null = null;
  let unc: ReturnType<typeof unitHourWithUncertainty> | null = null;
  let names: readonly string[] = [];
  let entries: InputEntry[] = [];
  let balanceError: { code: string; input: string; message: string } | null = null;
  const computed: EngineReason[] = [];
  if (mapped && problems.length === 0) {
    const model = sharedModel(unit, mapped.balanceKind, mapped.model);
    try {
      names = inputNames(mapped.balanceKind, model);
      mapped.entries.set('T0_K', { name: 'T0_K', value: dead.T0_K, u: 0, source: dead.tag && dead.source === 'ambient tag' ? { kind: 'site', what: `dead state from the ambient tag ${dead.tag}` } : { kind: 'site', what: 'dead state' } });
      mapped.entries.set('p0_Pa', { name: 'p0_Pa', value: dead.p0_Pa, u: 0, source: { kind: 'site', what: 'dead state' } });
      entries = names.map((n) => mapped!.entries.get(n) ?? { name: n, value: NaN, u: 0, source: { kind: 'site', what: 'missing' } as const });
      const missing = entries.filter((e) => !Number.isFinite(e.value));
      if (missing.length === 0) {
        const x = new Float64Array(entries.length);
        const u = new Float64Array(entries.length);
        for (let i = 0; i < entries.length; i++) {
          x[i] = entries[i]!.value;
          u[i] = entries[i]!.u;
        }
        if (withU) {
          unc = unitHourWithUncertainty(mapped.balanceKind, model, x, u);
          balance = unc.balance;
        } else balance = evaluateUnitHour(mapped.balanceKind, model, x);
      } else {
        balanceError = { code: 'MISSING_INPUT', input: missing[0]!.name, message: `no value this hour for ${missing.map((m) => m.name).join(', ')}` };
      }
    } catch (err) {
      const e = err as Error & { code?: string; input?: string };
      balanceError = { code: err instanceof BalanceInputError ? e.code! : e.name, input: e.input ?? '', message: e.message };
      computed.push({ code: 'BALANCE_FAILED', message: `the balance cannot be formed: ${e.message}` });
    }
  }

  // Checks of the balance.
  const closures: BalanceClosure[] = [];
  let entropy: { residual_W: number; share: number } | null = null;
  let massShare: number | null = null;
  if (balance && mapped) {
    closures.push({ name: 'first-law (energy)', residual: balance.energyClosure_pct / 100, tolerance: ENERGY_CLOSURE_TOLERANCE });
    if (mapped.massCheck) {
      let inFlow = 0;
      for (const s of mapped.model.ports ?? []) {
        if (s.direction === 'in' && mapped.massCheck.groups.includes(groupOf(mapped.balanceKind, s))) inFlow += balance.ports[s.name]?.mDot_kg_per_s ?? 0;
      }
      massShare = inFlow > 0 ? balance.massResidual_kg_per_s / inFlow : balance.massResidual_kg_per_s === 0 ? 0 : Infinity;
      closures.push({ name: 'mass', residual: massShare, tolerance: num(params.massBalanceTolerance, 0.03) });
    }
    const D = balance.destruction_W;
    const gs = balance.gouyStodolaResidual_W;
    if (Number.isFinite(gs)) {
      const scale = Math.max(Math.abs(D), 0.01 * Math.abs(balance.fuel_W), 1e-9);
      const U_D = unc && Number.isFinite(unc.destruction_W.U) ? unc.destruction_W.U : 0;
      const allowed = Math.max(ENTROPY_CHECK_TOLERANCE * scale, U_D);
      entropy = { residual_W: gs, share: gs / scale };
      if (Math.abs(gs) > allowed) {
        computed.push({
          code: 'ENTROPY_CHECK_FAILED',
          message:
            `destruction ${(D / 1e3).toFixed(1)} kW and T0 Sgen ${((D - gs) / 1e3).toFixed(1)} kW differ by ${(Math.abs(gs) / 1e3).toFixed(1)} kW, ` +
            `more than ${(100 * ENTROPY_CHECK_TOLERANCE).toFixed(0)} % of D and more than its uncertainty (U = ${(U_D / 1e3).toFixed(1)} kW): the data do not close the first law`,
        });
      }
    } else notes.push('entropy-generation check not available (a condensed fuel has no absolute entropy in the property core)');
    for (const f of balance.flags) {
      const [flag, port] = f.split(':');
      if (flag === 'near-saturation' && port) {
        if (balance.ports[port]?.state.phase === 'vapour') {
          computed.push({ code: 'NEAR_SATURATION', message: `${port}: p and T are within the saturation tolerance on the vapour side; the steam may be wet and its state unknown` });
        } else notes.push(`${port}: liquid within the saturation tolerance (taken as liquid)`);
      } else if (flag === 'below-dead-state-definitions') {
        computed.push({ code: 'BELOW_DEAD_STATE', message: 'a stream is below T0: hot-side decrease and cold-side increase are not the fuel and product there' });
      } else if (flag === 'negative-destruction') {
        computed.push({ code: 'NEGATIVE_DESTRUCTION', message: 'the balance gives negative destruction, which no real process does: the data are inconsistent' });
      } else if (flag === 'efficiency-above-one') {
        computed.push({ code: 'EFFICIENCY_ABOVE_ONE', message: 'power out exceeds power in: a meter is off' });
      } else if (flag === 'loss-not-separated') {
        notes.push('no coolant flow: the heat is taken as rejected at T0, so loss and destruction are not split (L = 0)');
      } else if (flag === 'below-dead-state' && port) {
        notes.push(`${port}: below T0`);
      }
    }
  }

  const classified = classifyHour(
    { tags, balances: idleCandidate ? [] : closures },
    {
      loadTag: LOAD_KEY,
      minLoad: effMin,
      keyTags: set.keyTags,
      spread,
      defaultMaxRelSpread: relLimit,
      minCoveredFraction: num(params.minCoverage, 0.75),
    },
  );
  const reasons: (EngineReason & { state: EngineHourState })[] = [];
  for (const r of classified.reasons) {
    if (r.tag === LOAD_KEY && r.code !== 'BELOW_MIN_LOAD') continue; // the load's own tags carry the reason
    let message = r.message;
    if (r.code === 'BELOW_MIN_LOAD' && mapped) {
      const u = mapped.load.unit === 'W' ? { f: 1e-3, s: 'kW' } : { f: 3.6, s: 't/h' };
      message = `${mapped.load.label} ${(load * u.f).toFixed(1)} ${u.s} is below the minimum load ${(minLoad * u.f).toFixed(1)} ${u.s}${minLoad > 0 ? '' : ' (the unit is not running)'}`;
    }
    reasons.push({ code: r.code, message, ...(r.tag && r.tag !== LOAD_KEY ? { tag: r.tag } : {}), state: r.state });
  }
  for (const p of problems) reasons.push({ ...p, state: 'suspect' });
  for (const c of computed) {
    if (idleCandidate) notes.push(`${c.code}: ${c.message}`);
    else reasons.push({ ...c, state: 'suspect' });
  }
  const rank: Record<EngineHourState, number> = { suspect: 3, idle: 2, unsettled: 1, steady: 0 };
  reasons.sort((a, b) => rank[b.state] - rank[a.state]);
  const state: EngineHourState = reasons.length ? reasons[0]!.state : 'steady';

  // Cost of the hour's destruction.
  const D = balance ? balance.destruction_W : NaN;
  const cost = input.cost && Number.isFinite(D) ? destructionCost_per_hour(input.cost.cF_per_J, D) : null;

  // Uncertainty contributors (GUM: share of the variance of each input).
  const contributors: Record<string, unknown>[] = [];
  if (unc) {
    const varE = unc.efficiency ? unc.efficiency.u ** 2 : 0;
    const varD = unc.destruction_W.u ** 2;
    entries.forEach((e, i) => {
      if (!(e.u > 0)) return;
      const cE = unc!.sensitivity.efficiency[i]!;
      const cD = unc!.sensitivity.destruction_W[i]!;
      contributors.push({
        input: e.name,
        ...(e.source.kind === 'tag' ? { tag: e.source.tag } : {}),
        u_SI: e.u,
        c_efficiency: finiteOrNull(cE),
        c_destruction: finiteOrNull(cD),
        share_efficiency: varE > 0 ? finiteOrNull((cE * e.u) ** 2 / varE) : null,
        share_destruction: varD > 0 ? finiteOrNull((cD * e.u) ** 2 / varD) : null,
      });
    });
    const key = unc.efficiency ? 'share_efficiency' : 'share_destruction';
    contributors.sort((a, b) => ((b[key] as number) ?? 0) - ((a[key] as number) ?? 0));
    contributors.splice(TOP_CONTRIBUTORS);
  }

  // The hashes: the model version (unit, links, site settings, method) and every input of the row.
  const { modelVersion, inputsHash } = options.hashes ?? unitHourHashes(input, options);
  const usedTags = set.usedTags;
  const linkOfTag = set.linkOfTag;

  const detail: Record<string, unknown> = {
    engine: ENGINE_VERSION,
    kind: unit.kind,
    balanceKind: mapped?.balanceKind ?? null,
    deadState: dead,
    load: mapped ? { ...mapped.load, value: finiteOrNull(mapped.load.value), minLoad } : null,
    plan: mapped?.ports ?? [],
    inputs: entries.map((e) => ({ name: e.name, value: finiteOrNull(e.value), u: e.u, source: e.source })),
    ports: balance
      ? Object.entries(balance.ports).map(([name, p]) => ({
          name,
          direction: p.direction,
          mDot_kg_per_s: p.mDot_kg_per_s,
          p_Pa: p.state.p,
          T_K: p.state.T,
          h_J_per_kg: p.state.h,
          s_J_per_kgK: p.state.s,
          x: p.state.x,
          phase: p.state.phase,
          psi_J_per_kg: p.state.psi,
          eCh_J_per_kg: p.state.eCh,
          exergy_W: p.mDot_kg_per_s * (p.state.psi + (mapped?.balanceKind === 'boiler' ? (p.state.eCh ?? 0) : 0)),
          flags: p.state.flags,
        }))
      : [],
    terms: balance?.terms ?? [],
    balance: balance
      ? {
          fuel_W: balance.fuel_W,
          product_W: balance.product_W,
          loss_W: balance.loss_W,
          destruction_W: balance.destruction_W,
          efficiency: balance.efficiency,
          entropyGeneration_W_per_K: finiteOrNull(balance.entropyGeneration_W_per_K),
          T0Sgen_W: finiteOrNull(dead.T0_K * balance.entropyGeneration_W_per_K),
          gouyStodolaResidual_W: finiteOrNull(balance.gouyStodolaResidual_W),
          entropyCheckShare: entropy ? finiteOrNull(entropy.share) : null,
          massResidual_kg_per_s: balance.massResidual_kg_per_s,
          massClosureShare: finiteOrNull(massShare),
          energyResidual_W: balance.energyResidual_W,
          energyClosure_pct: balance.energyClosure_pct,
          extras: Object.fromEntries(Object.entries(balance.extras).map(([k, v]) => [k, finiteOrNull(v)])),
          flags: balance.flags,
        }
      : null,
    balanceError,
    uncertainty: unc
      ? {
          k: unc.k,
          method: 'GUM first order, central differences through the whole calculation (JCGM 100:2008 5.1.2)',
          fuel_W: { u: finiteOrNull(unc.fuel_W.u), U: finiteOrNull(unc.fuel_W.U) },
          product_W: unc.product_W ? { u: finiteOrNull(unc.product_W.u), U: finiteOrNull(unc.product_W.U) } : null,
          loss_W: { u: finiteOrNull(unc.loss_W.u), U: finiteOrNull(unc.loss_W.U) },
          destruction_W: { u: finiteOrNull(unc.destruction_W.u), U: finiteOrNull(unc.destruction_W.U) },
          efficiency: unc.efficiency ? { u: finiteOrNull(unc.efficiency.u), U: finiteOrNull(unc.efficiency.U) } : null,
          contributors,
          unavailable: unc.unavailable,
        }
      : null,
    tagHours: usedTags.map((t) => {
      const l = linkOfTag.get(t);
      const th = input.tagHours.get(t);
      return {
        tag: t,
        ...(l
          ? { linkId: l.id, port: l.portName, quantity: l.quantity, engUnit: l.engUnit, uncertainty: { mode: l.uncertaintyMode, value: l.uncertainty }, validMin: l.validMin, validMax: l.validMax, validFromMs: l.validFromMs, validToMs: l.validToMs }
          : { role: site.t0Tag?.name === t ? 'ambient temperature (dead state)' : 'flue-gas O2 of the source boiler' }),
        hour: th ?? null,
      };
    }),
    cost: input.cost ? { cF_per_J: input.cost.cF_per_J, cF_per_MWh: input.cost.cF_per_J * 3.6e9, basis: input.cost.basis, currency: site.currency } : null,
    notes,
  };

  return {
    state,
    reasons: reasons.map(({ state: _s, ...r }) => r),
    load: finiteOrNull(load),
    loadUnit: mapped?.load.unit ?? null,
    T0_K: dead.T0_K,
    p0_Pa: dead.p0_Pa,
    fuel_W: balance ? finiteOrNull(balance.fuel_W) : null,
    product_W: balance ? finiteOrNull(balance.product_W) : null,
    loss_W: balance ? finiteOrNull(balance.loss_W) : null,
    destruction_W: balance ? finiteOrNull(balance.destruction_W) : null,
    efficiency: balance ? finiteOrNull(balance.efficiency) : null,
    efficiency_U: unc?.efficiency ? finiteOrNull(unc.efficiency.U) : null,
    destruction_U_W: unc ? finiteOrNull(unc.destruction_W.U) : null,
    closure_pct: balance ? finiteOrNull(balance.energyClosure_pct) : null,
    entropyGeneration_W_per_K: balance ? finiteOrNull(balance.entropyGeneration_W_per_K) : null,
    destructionCost_per_h: finiteOrNull(cost),
    detail,
    modelVersion,
    inputsHash,
  };
}
