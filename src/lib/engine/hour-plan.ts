/**
 * The mapping of a unit hour (./map.ts) as a plan kept per unit and link set: which tag hour, constant
 * or dead-state value fills each entry of the balance's input vector, in SI with its standard
 * uncertainty. An hour then only reads its tag hours into a preallocated vector; the full mapping (port
 * planning, entry objects, reasons) runs once per link set and again only when an hour needs it (its
 * audit trail, a missing reading, a mapping problem).
 *
 * The one choice of the mapping that an hour's readings make, a port's state from the energy balance
 * when its temperature is within the saturation tolerance of Tsat(p) (or missing), is evaluated per hour
 * (one Tsat call per such port); each combination of these choices has its own plan.
 */
import { SATURATION_TOLERANCE_K, type BalanceKind, type UnitModel } from '../equipment';
import type { Converter } from '../units/convert';
import { sharedModel } from './linkset';
import type { MappedUnit } from './map';
import { linkConverter, tsat } from './map-port';
import type { EngineLink, TagHour, UnitHourInput } from './types';

/** How one entry is filled: a link's hourly mean, a constant, the dead state, or a copy of another entry. */
type Fill =
  | { k: 'link'; link: EngineLink; conv: Converter; rel: boolean; uEng: number }
  | { k: 'const'; value: number; u: number }
  | { k: 'T0' }
  | { k: 'p0' }
  | { k: 'copy'; of: number };

/**
 * A fill with every field of every kind, in one order: the hour's loop over a plan's fills then meets
 * objects of one shape (five shapes made its reads megamorphic).
 */
function fill(f: Fill): Fill {
  const all = { k: f.k, link: null, conv: null, rel: false, uEng: 0, value: 0, u: 0, of: -1 } as Record<string, unknown>;
  return Object.assign(all, f) as unknown as Fill;
}

/** The plan of one combination of choices. */
export interface HourPlan {
  /** the mapping of the hour that made the plan (its kind, model, load words, mass check, minimum load) */
  mapped: MappedUnit;
  kind: BalanceKind;
  model: UnitModel;
  fills: Fill[];
  /** entry index of each vector entry */
  vec: Int32Array;
  /** entry indexes of the load (-1: not an entry, the load is NaN) */
  load: Int32Array;
  val: Float64Array;
  unc: Float64Array;
  x: Float64Array;
  u: Float64Array;
}

interface Decision {
  p: Fill;
  TL: EngineLink;
  conv: Converter;
  water: boolean;
}

/** What is the same for every hour of a link set: the choices to evaluate, and a plan per combination. */
interface PlanFamily {
  decisions: Decision[] | null;
  plans: Map<number, HourPlan | null>;
}

const families = new WeakMap<object, { unit: object; params: object; ports: object; site: object; sources: unknown; fam: PlanFamily }>();

function familyOf(input: UnitHourInput, create: boolean): PlanFamily | null {
  const hit = families.get(input.links);
  const u = input.unit;
  if (hit && hit.unit === u && hit.params === u.parameters && hit.ports === u.ports && hit.site === input.site && hit.sources === input.flueGasSources) return hit.fam;
  if (!create) return null;
  const fam: PlanFamily = { decisions: null, plans: new Map() };
  families.set(input.links, { unit: u, params: u.parameters, ports: u.ports, site: input.site, sources: input.flueGasSources, fam });
  return fam;
}

function linkOf(input: UnitHourInput, id: string): EngineLink | undefined {
  for (const l of input.links) if (l.id === id) return l;
  for (const s of Object.values(input.flueGasSources ?? {})) if (s.o2Link?.id === id) return s.o2Link;
  return undefined;
}

/** The fill of an entry of the mapping, or null when the plan cannot express it (volume flows). */
function fillOf(input: UnitHourInput, mapped: MappedUnit, name: string, order: string[]): Fill | null {
  if (name === 'T0_K') return fill({ k: 'T0' });
  if (name === 'p0_Pa') return fill({ k: 'p0' });
  const e = mapped.entries.get(name)!;
  const s = e.source;
  if (s.kind === 'parameter' || (s.kind === 'site' && s.what !== 'missing')) return fill({ k: 'const', value: e.value, u: e.u });
  if (s.kind === 'copy') {
    const of = order.indexOf(s.of);
    return of >= 0 && of < order.indexOf(name) ? fill({ k: 'copy', of }) : null;
  }
  if (s.kind !== 'tag' || s.note || s.quantity === 'volumeFlow' || s.quantity === 'standardVolumeFlow') return null;
  const link = linkOf(input, s.linkId);
  if (!link) return null;
  try {
    return fill({ k: 'link', link, conv: linkConverter(link, input.site.p_atm_Pa), rel: link.uncertaintyMode === 'relative', uEng: link.uncertainty });
  } catch {
    return null;
  }
}

function makePlan(input: UnitHourInput, mapped: MappedUnit, names: readonly string[]): HourPlan | null {
  const order = [...mapped.entries.keys()];
  const fills: Fill[] = [];
  for (const n of order) {
    const f = fillOf(input, mapped, n, order);
    if (!f) return null;
    fills.push(f);
  }
  const vec = Int32Array.from(names.map((n) => order.indexOf(n)));
  if (vec.some((i) => i < 0)) return null;
  const model = sharedModel(input.unit, mapped.balanceKind, mapped.model);
  const n = order.length;
  return {
    mapped, kind: mapped.balanceKind, model, fills, vec,
    load: Int32Array.from(mapped.loadNames.map((l) => order.indexOf(l))),
    val: new Float64Array(n), unc: new Float64Array(n), x: new Float64Array(names.length), u: new Float64Array(names.length),
  };
}

/**
 * Keeps the plan of the mapping `mapped` of this hour (after runBalance set its dead state), for the
 * hours of the same link set and the same choices. A mapping with problems keeps no plan.
 */
export function keepPlan(input: UnitHourInput, mapped: MappedUnit | null, names: readonly string[] | null): void {
  const fam = familyOf(input, true)!;
  if (!mapped) {
    if (fam.decisions) return;
    fam.decisions = [];
    fam.plans.set(0, null);
    return;
  }
  if (!fam.decisions) {
    const ds: Decision[] = [];
    for (const d of mapped.decisions) {
      const p = fillOf(input, mapped, d.pName, [...mapped.entries.keys()]);
      let conv: Converter | null = null;
      try {
        conv = linkConverter(d.TL, input.site.p_atm_Pa);
      } catch {
        /* no plan: the mapping reports it */
      }
      if (!p || p.k === 'copy' || !conv) {
        fam.decisions = [];
        fam.plans.set(0, null);
        return;
      }
      ds.push({ p, TL: d.TL, conv, water: d.water });
    }
    fam.decisions = ds;
  }
  let mask = 0;
  mapped.decisions.forEach((d, i) => (mask |= d.fromEnergy ? 1 << i : 0));
  if (fam.plans.has(mask)) return;
  const ok = mapped.problems.length === 0 && names !== null && mapped.decisions.length === fam.decisions.length;
  fam.plans.set(mask, ok ? makePlan(input, mapped, names) : null);
}

const out = { value: NaN, u: 0 };
/** A link's hourly mean in SI and its standard uncertainty in SI into `out` (map-port.ts reading). */
function read(f: Extract<Fill, { k: 'link' }>, tagHours: ReadonlyMap<string, TagHour>): typeof out {
  const mean = tagHours.get(f.link.tagName)?.mean;
  if (mean === null || mean === undefined || !Number.isFinite(mean)) {
    out.value = NaN;
    out.u = 0;
    return out;
  }
  const uEng = f.rel ? (Math.abs(mean) * f.uEng) / 100 : f.uEng;
  out.value = f.conv.toSI(mean);
  out.u = Math.abs(uEng * f.conv.factor);
  return out;
}

/** The choices of this hour, as planPort makes them (map-plan.ts). */
function maskOf(ds: Decision[], input: UnitHourInput): number {
  let mask = 0;
  for (let i = 0; i < ds.length; i++) {
    const d = ds[i]!;
    const p = d.p.k === 'const' ? d.p.value : d.p.k === 'link' ? read(d.p, input.tagHours).value : NaN;
    const th = input.tagHours.get(d.TL.tagName)?.mean;
    const Tmean = th === null || th === undefined || !Number.isFinite(th) ? NaN : d.conv.toSI(th);
    const Ts = d.water ? tsat(p) : NaN;
    const wet = d.water && Number.isFinite(Ts) && Number.isFinite(Tmean) && Tmean - Ts <= SATURATION_TOLERANCE_K;
    if (wet || !Number.isFinite(Tmean)) mask |= 1 << i;
  }
  return mask;
}

/**
 * The plan of this hour with its vector filled (x, u and the load), or null when the hour needs the
 * full mapping: no plan yet for its link set or choices, a plan that cannot be made, a missing reading.
 */
export function planHour(input: UnitHourInput, T0_K: number, p0_Pa: number): { plan: HourPlan; load: number } | null {
  const fam = familyOf(input, false);
  if (!fam || !fam.decisions) return null;
  const plan = fam.plans.get(fam.decisions.length ? maskOf(fam.decisions, input) : 0);
  if (!plan) return null;
  const { fills, val, unc } = plan;
  for (let i = 0; i < fills.length; i++) {
    const f = fills[i]!;
    if (f.k === 'link') {
      const r = read(f, input.tagHours);
      if (r.value !== r.value) return null;
      val[i] = r.value;
      unc[i] = r.u;
    } else if (f.k === 'const') (val[i] = f.value), (unc[i] = f.u);
    else if (f.k === 'T0') (val[i] = T0_K), (unc[i] = 0);
    else if (f.k === 'p0') (val[i] = p0_Pa), (unc[i] = 0);
    else (val[i] = val[f.of]!), (unc[i] = unc[f.of]!);
  }
  const { vec, x, u } = plan;
  for (let i = 0; i < vec.length; i++) (x[i] = val[vec[i]!]!), (u[i] = unc[vec[i]!]!);
  let load = NaN;
  if (plan.load.length === 1) load = plan.load[0]! >= 0 ? val[plan.load[0]!]! : NaN;
  else if (plan.load.length > 1) {
    load = 0;
    for (let i = 0; i < plan.load.length; i++) load += plan.load[i]! >= 0 ? val[plan.load[i]!]! : NaN;
  }
  return { plan, load };
}
