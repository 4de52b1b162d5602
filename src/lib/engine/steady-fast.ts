/**
 * The steady-state test's all-clear, without its words: whether classifyHour (src/lib/analytics/steady.ts)
 * would find no reason at all in an hour, from the tag hours and the link set's limits, with no
 * statistics objects, no reason records and no texts. Most hours are steady; for them this is the
 * whole test. An hour this says is not clear (or cannot tell) takes the full test, which words its
 * reasons (compute.ts). It applies the same rules with the same arithmetic, in the same order of
 * operations, as keyTagStats (compute.ts), hourState (checks.ts) and classifyHour:
 * - every key tag: a finite mean in SI with samples, not frozen, no sample out of its or the link's
 *   range, covered at least its least fraction with at least STEADY_DEFAULTS.minSamples samples, status
 *   words at most STEADY_DEFAULTS.maxNonNumericFraction of the cells;
 * - every closure within its tolerance;
 * - the load finite and not below the minimum load (an idle candidate has a reason);
 * - every key tag's spread (max - min in SI, else the standard deviation) at most its limit, never
 *   below what its instrument resolves.
 * tests/engine/steady-fast.test.ts holds it equal to the full test on random hours.
 */
import { STEADY_DEFAULTS, aboveLimit, resolutionTerms, resolvableSpreadOf, type BalanceClosure, type ResolutionTerms } from '../analytics';
import { LOAD_KEY, num } from './constants';
import type { LinkSet } from './linkset';
import { linkConverter } from './map-port';
import type { Converter } from '../units/convert';
import type { EngineLink, TagHour } from './types';

/** A key tag with its converter and its spread limit's fields read once (the limits' objects differ in shape). */
interface KeyTag {
  link: EngineLink;
  conv: Converter;
  factor: number;
  /** the limit's own maxRelSpread, maxStd and instrument terms */
  ownRel: number | undefined;
  maxStd: number | undefined;
  inst: ResolutionTerms | null;
  minCovered: number | undefined;
}

/** Per link set and atmosphere: each key tag's converter and limits; null when the quick test cannot apply. */
const prepared = new WeakMap<LinkSet, { p_atm_Pa: number; tags: KeyTag[] | null }>();

function prepare(set: LinkSet, p_atm_Pa: number): KeyTag[] | null {
  const hit = prepared.get(set);
  if (hit && hit.p_atm_Pa === p_atm_Pa) return hit.tags;
  let tags: KeyTag[] | null = [];
  for (const link of set.linksUsed) {
    // a tag named as the load's key is replaced by the load in the full test; a unit it cannot convert words it
    if (link.tagName === LOAD_KEY) {
      tags = null;
      break;
    }
    let conv: Converter;
    try {
      conv = linkConverter(link, p_atm_Pa);
    } catch {
      tags = null;
      break;
    }
    const limit = set.spread[link.tagName];
    const inst = limit?.instrument;
    tags.push({
      link,
      conv,
      factor: Math.abs(conv.factor),
      ownRel: limit?.maxRelSpread,
      maxStd: limit?.maxStd,
      inst: inst ? resolutionTerms(inst) : null,
      minCovered: limit?.minCoveredFraction,
    });
  }
  prepared.set(set, { p_atm_Pa, tags });
  return tags;
}

/** Whether a key tag's spread is above its limit (classifyHour's rule), mean and spread in SI. */
function spreadHigh(mean: number, spread: number, k: KeyTag, defaultRel: number): boolean {
  const maxRel = k.ownRel ?? (k.maxStd === undefined ? defaultRel : undefined);
  const floor = resolvableSpreadOf(k.inst, mean, STEADY_DEFAULTS.resolutionFactor);
  if (maxRel !== undefined && mean !== 0) {
    const rel = spread / Math.abs(mean);
    const relLimit = Math.max(maxRel, floor / Math.abs(mean));
    if (aboveLimit(rel, relLimit)) return true;
  }
  if (k.maxStd !== undefined) {
    const absLimit = Math.max(k.maxStd, floor);
    if (aboveLimit(spread, absLimit)) return true;
  }
  return false;
}

/**
 * True when the full steady-state test of this hour would give no reason (the hour is steady, given
 * no problems and no computed reasons); false when it would give one or this cannot tell.
 */
export function clearlySteady(
  set: LinkSet,
  tagHours: ReadonlyMap<string, TagHour>,
  p_atm_Pa: number,
  closures: readonly BalanceClosure[],
  load: number,
  minLoad: number,
  params: Record<string, unknown>,
): boolean {
  const effMin = minLoad > 0 ? minLoad : Number.MIN_VALUE;
  if (!Number.isFinite(load) || load < effMin) return false;
  const tags = prepare(set, p_atm_Pa);
  if (!tags) return false;
  const minCoveredDefault = num(params.minCoverage, 0.75);
  for (let i = 0; i < tags.length; i++) {
    const k = tags[i]!;
    const th = tagHours.get(k.link.tagName);
    if (!th || th.mean === null) return false;
    const mean = k.conv.toSI(th.mean);
    if (!Number.isFinite(mean) || th.samples <= 0 || th.flatline) return false;
    const { validMin, validMax } = k.link;
    const linkRange = (validMin !== null && th.min !== null && th.min < validMin) || (validMax !== null && th.max !== null && th.max > validMax) ? 1 : 0;
    if (th.outOfRange + linkRange > STEADY_DEFAULTS.maxOutOfRangeCount) return false;
    const minCovered = k.minCovered ?? minCoveredDefault;
    if (th.coveredFraction < minCovered || th.samples < STEADY_DEFAULTS.minSamples) return false;
    const cells = th.samples + th.nonNumeric;
    const statusShare = cells > 0 ? th.nonNumeric / cells : 0;
    if (statusShare > STEADY_DEFAULTS.maxNonNumericFraction) return false;
    const spread = th.min !== null && th.max !== null ? (th.max - th.min) * k.factor : th.std !== null ? th.std * k.factor : null;
    if (spread !== null && Number.isFinite(spread) && spreadHigh(mean, spread, k, set.relLimit)) return false;
  }
  for (let i = 0; i < closures.length; i++) {
    const b = closures[i]!;
    const tol = b.tolerance ?? STEADY_DEFAULTS.maxBalanceResidual;
    if (!Number.isFinite(b.residual) || Math.abs(b.residual) > tol) return false;
  }
  return true;
}
