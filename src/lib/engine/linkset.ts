/**
 * What is the same for every hour of a unit that the same link versions hold: the model version, the
 * tags read, the steady-state test's key tags and spread limits; and the hashes of an hour (model
 * version and inputs hash). Kept per unit object and link set, so an hour pays for none of it twice.
 */
import type { InstrumentResolution, SpreadLimit } from '../analytics';
import type { UnitModel } from '../equipment';
import { LINK_QUANTITIES } from '../plant/kinds';
import { ENGINE_VERSION, LOAD_KEY, SPREAD_O2_ABS, SPREAD_X_ABS, num } from './constants';
import { ByteHasher, hashOf } from './hash';
import { cachedConverter, unitParameters } from './map';
import type { EngineLink, EngineUnit, UnitHourInput } from './types';

export interface ComputeOptions {
  /** propagate the tags' uncertainties (GUM); default true */
  uncertainty?: boolean;
  /** the hashes, when the caller has them already (unitHourHashes with the same input and options) */
  hashes?: { modelVersion: string; inputsHash: string };
}

/** What is the same for every hour a set of link versions holds. */
export interface LinkSet {
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

const models = new WeakMap<object, { kind: string; model: UnitModel }[]>();

const o2BasisOf = (f: object) => ('o2Basis' in f ? f.o2Basis : '');
/** Whether two models agree in everything that can change from one hour to the next for one unit. */
function sameModel(a: UnitModel, b: UnitModel): boolean {
  if ((a.powerMeasured ?? '') !== (b.powerMeasured ?? '') || (a.belowDeadState ?? '') !== (b.belowDeadState ?? '')) return false;
  const pa = a.ports ?? [];
  const pb = b.ports ?? [];
  if (pa.length !== pb.length) return false;
  for (let i = 0; i < pa.length; i++) {
    const x = pa[i]!;
    const y = pb[i]!;
    if (x.name !== y.name || x.direction !== y.direction || x.role !== y.role || x.group !== y.group || x.state !== y.state || x.flow !== y.flow) return false;
    if (x.fluid.kind !== y.fluid.kind || o2BasisOf(x.fluid) !== o2BasisOf(y.fluid)) return false;
  }
  return sameTerms(a.powers, b.powers) && sameTerms(a.heats, b.heats);
}
function sameTerms(a: UnitModel['powers'], b: UnitModel['powers']): boolean {
  const ta = a ?? [];
  const tb = b ?? [];
  if (ta.length !== tb.length) return false;
  for (let i = 0; i < ta.length; i++) if (ta[i]!.name !== tb[i]!.name || ta[i]!.role !== tb[i]!.role || ta[i]!.direction !== tb[i]!.direction) return false;
  return true;
}

/**
 * One model object per unit and distinct model, so that the equipment library's compiled form and
 * its memoised port states are reused from hour to hour. Two models are the same when they agree in
 * everything of a model that can change from one hour to the next for the same unit (state and flow
 * modes, O2 basis, powers): see sameModel.
 */
export function sharedModel(unit: EngineUnit, kind: string, model: UnitModel): UnitModel {
  let byUnit = models.get(unit);
  if (!byUnit) models.set(unit, (byUnit = []));
  for (const m of byUnit) if (m.model === model || (m.kind === kind && sameModel(m.model, model))) return m.model;
  if (byUnit.length >= 64) byUnit.shift();
  byUnit.push({ kind, model });
  return model;
}

const versions = new WeakMap<object, Map<string, LinkSet>>();
const siteKeys = new WeakMap<object, number>();
let siteSeq = 0;
/** A link in the model version; a tag's own limits only when set, so hours of links without them keep their hashes. */
const linkKey = (l: EngineLink) => {
  const key: unknown[] = [l.id, l.portName, l.quantity, l.tagName, l.engUnit, l.basis, l.uncertaintyMode, l.uncertainty, l.validMin, l.validMax, l.validFromMs, l.validToMs];
  if (l.spreadLimit !== undefined || l.minCoverage !== undefined) key.push({ spreadLimit: l.spreadLimit ?? null, minCoverage: l.minCoverage ?? null });
  return key;
};

const byLinksArray = new WeakMap<object, { unit: object; site: object; sources: unknown; set: LinkSet }>();
/**
 * The model version of an hour and the tags it reads, kept per unit object and link set (the same for
 * every hour those links hold).
 */
export function linkSetOf(input: UnitHourInput): LinkSet {
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
    v = newLinkSet(input);
    if (byUnit.size > 1000) byUnit.clear();
    byUnit.set(key, v);
  }
  return v;
}

function modelVersionOf(input: UnitHourInput): string {
  const { unit, site } = input;
  return hashOf({
    engine: ENGINE_VERSION,
    unit: { kind: unit.kind, parameters: unitParameters(unit), fuel: unit.fuel, ports: unit.ports },
    links: [...input.links].sort((a, b) => (a.id < b.id ? -1 : 1)).map(linkKey),
    site: { p_atm_Pa: site.p_atm_Pa, T0_K: site.T0_K, p0_Pa: site.p0_Pa, t0Tag: site.t0Tag },
    flueGasSources: input.flueGasSources ? Object.fromEntries(Object.entries(input.flueGasSources).map(([k, s]) => [k, { fuel: s.fuel, o2: s.o2Link && linkKey(s.o2Link) }])) : null,
  }).slice(0, 32);
}

function newLinkSet(input: UnitHourInput): LinkSet {
  const { unit, site } = input;
  const used = new Set<string>(input.links.map((l) => l.tagName));
  if (site.t0Tag) used.add(site.t0Tag.name);
  for (const s of Object.values(input.flueGasSources ?? {})) if (s.o2Link) used.add(s.o2Link.tagName);
  const relLimit = num(unitParameters(unit).spreadLimit, 0.05);
  const linkOfTag = new Map<string, EngineLink>();
  const spread: Record<string, SpreadLimit> = { [LOAD_KEY]: { maxRelSpread: Infinity } };
  for (const l of input.links) {
    if (linkOfTag.has(l.tagName)) continue;
    linkOfTag.set(l.tagName, l);
    spread[l.tagName] = { ...spreadOf(l, relLimit), instrument: instrumentOf(l, site.p_atm_Pa), ...(l.minCoverage !== undefined ? { minCoveredFraction: l.minCoverage } : {}) };
  }
  const linksUsed = [...linkOfTag.values()];
  return { modelVersion: modelVersionOf(input), usedTags: [...used].sort(), linksUsed, keyTags: [...linksUsed.map((l) => l.tagName), LOAD_KEY], spread, relLimit, linkOfTag };
}

/**
 * A tag's spread limit: its own (the model file's tags[].spreadLimit) or the default of its quantity:
 * O2 and vapour fraction absolute in fraction [-], every other quantity the unit's share of the mean.
 */
function spreadOf(l: EngineLink, relLimit: number): SpreadLimit {
  if (l.quantity === 'o2Fraction') return { maxStd: l.spreadLimit ?? SPREAD_O2_ABS };
  if (l.quantity === 'vapourFraction') return { maxStd: l.spreadLimit ?? SPREAD_X_ABS };
  return { maxRelSpread: l.spreadLimit ?? relLimit };
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

const hasher = new ByteHasher();
/**
 * The model version and the inputs hash of a unit hour, without computing it: the inputs hash covers
 * the model version, every used tag's statistics, the cost basis and whether uncertainty is propagated.
 * The same inputs always give the same hashes; the engine's caller skips an hour whose stored inputs
 * hash is unchanged.
 */
export function unitHourHashes(input: UnitHourInput, options: ComputeOptions = {}): { modelVersion: string; inputsHash: string } {
  return hashesOf(linkSetOf(input), input, options);
}

/** unitHourHashes with the hour's link set at hand (the engine has looked it up already). */
export function hashesOf(set: LinkSet, input: UnitHourInput, options: ComputeOptions): { modelVersion: string; inputsHash: string } {
  const { modelVersion, usedTags } = set;
  const h = hasher.reset().text(modelVersion).num(options.uncertainty ?? true).num(input.cost?.cF_per_J ?? null);
  // The tags come in the model version's fixed order, so their names need not be hashed again.
  for (const t of usedTags) {
    const th = input.tagHours.get(t);
    if (!th) h.byte(0);
    else h.byte(1).num(th.mean).num(th.min).num(th.max).num(th.std).num(th.coveredFraction).int(th.samples).int(th.nonNumeric).int(th.outOfRange).byte(th.flatline ? 1 : 0);
  }
  return { modelVersion, inputsHash: h.digest().slice(0, 32) };
}
