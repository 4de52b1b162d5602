/**
 * Hour state of a unit from its key tags' hourly statistics: steady, unsettled, idle or suspect.
 *
 * Precedence (the first that applies wins; every reason found is still reported):
 *   1. suspect   - a key tag is missing or has no samples, is frozen (flatline), has values out of
 *                  range, has poor time coverage or too many status words; or a balance closure
 *                  (e.g. mass in vs out) misses its tolerance. The numbers cannot be trusted, so
 *                  nothing else is concluded from them.
 *   2. idle      - the load tag's hourly mean is below the unit's minimum load.
 *   3. unsettled - a key tag's spread within the hour is above its limit (load or conditions swinging).
 *   4. steady    - none of the above.
 * Only steady hours enter efficiency trends, baselines and drift detection.
 *
 * Spread is the within-hour standard deviation, either relative to the hourly mean (maxRelSpread,
 * for ratio-scale quantities: flow, power, absolute pressure) or absolute (maxStd, in the unit of
 * the statistics; use it for temperatures, where a relative spread depends on the scale zero).
 * (The engine passes the hour's max - min as the spread; the rule works on whatever measure the
 * caller passes, as long as the limits are in the same measure.)
 *
 * A spread limit is never tighter than what the tag's instrument can resolve (SpreadLimit.instrument):
 * resolutionFactor (default 2) times the instrument's standard uncertainty u at the reading, i.e. its
 * expanded uncertainty U (k = 2, docs/domain.md section 7): a swing within the hour no larger than U
 * is not one the instrument can vouch for (common practice, Lossline's choice). A relative uncertainty (% of reading) is held at its
 * value at LOW_RANGE_FRACTION of the span below that reading: flow meters quote % of reading only
 * over their turndown, and near the bottom of the range their error is a share of the span (common
 * practice, see resolvableSpread). A spread equal to its limit counts as settled; only a spread above
 * the limit makes the hour unsettled.
 *
 * The defaults are *common practice*, with no single published source (docs/domain.md section 6):
 * they are configurable per unit and per tag. Performance test codes (ASME PTC 19.1 and the PTC of
 * each equipment type) are the place to take site-specific limits from.
 */
import { STATE_SEVERITY, type HourState } from '../hour-states';
import { figures, fixed } from '../format';
import { resolvableSpread, type InstrumentResolution } from './resolution';

export { LOW_RANGE_FRACTION, resolutionTerms, resolvableSpread, resolvableSpreadOf, type InstrumentResolution, type ResolutionTerms } from './resolution';

/** Hourly statistics of one tag (field names as produced by the ingest's tag-hour aggregation). */
export interface TagHourStats {
  /** Hourly mean, or null when the hour has no usable sample. */
  mean: number | null;
  /** Within-hour standard deviation, or null. */
  stdDev: number | null;
  min?: number | null;
  max?: number | null;
  /** Usable samples in the hour. */
  sampleCount: number;
  /** Fraction of the hour covered by usable data [-]. */
  coveredFraction: number;
  /** The value stayed unchanged longer than the tag's flatline limit. */
  flatline: boolean;
  /** Samples rejected as out of the tag's valid range. */
  outOfRangeCount: number;
  /** Cells holding status words instead of numbers ("shutdown", "I/O fault"). */
  nonNumericCount: number;
  /** Samples with a bad quality flag, if the export carries one. */
  badQualityCount?: number;
}

/** Per-tag spread limit (and the tag's own coverage rule). */
export interface SpreadLimit {
  /** Largest stdDev / |mean| [-]. */
  maxRelSpread?: number;
  /** Largest stdDev [unit of the statistics]. */
  maxStd?: number;
  /** The tag's instrument: the limit is never below what it can resolve (resolvableSpread). */
  instrument?: InstrumentResolution;
  /** The tag's own least covered fraction of the hour [-]; absent: SteadyLimits.minCoveredFraction. */
  minCoveredFraction?: number;
}

/** A balance closure residual of the hour, e.g. (mDot_in - mDot_out) / mDot_in. */
export interface BalanceClosure {
  /** What is balanced ('mass', 'energy', 'feedwater vs steam' ...). */
  name: string;
  /** Relative residual [-]. */
  residual: number;
  /** Tolerance on |residual| [-]; default limits.maxBalanceResidual. */
  tolerance?: number;
}

export interface SteadyLimits {
  /** The tag whose hourly mean is the unit's load. */
  loadTag: string;
  /** Minimum load, in the unit of the load tag's statistics. */
  minLoad: number;
  /** Tags that must be sound for the hour to count; default: every tag given, plus the load tag. */
  keyTags?: readonly string[];
  /** Per-tag spread limits (and coverage rules); tags without one use defaultMaxRelSpread (and minCoveredFraction). */
  spread?: Readonly<Record<string, SpreadLimit>>;
  /** Default relative spread limit [-]; 0.05. */
  defaultMaxRelSpread?: number;
  /** Multiple of an instrument's standard uncertainty below which no spread limit goes [-]; 2 (U at k = 2). */
  resolutionFactor?: number;
  /** Least covered fraction of the hour per key tag [-]; 0.8. */
  minCoveredFraction?: number;
  /** Least usable samples per key tag; 2. */
  minSamples?: number;
  /** Largest share of status words among the hour's cells per key tag [-]; 0.1. */
  maxNonNumericFraction?: number;
  /** Largest number of out-of-range samples per key tag; 0. */
  maxOutOfRangeCount?: number;
  /** Default tolerance on |balance residual| [-]; 0.05. */
  maxBalanceResidual?: number;
}

/** Defaults (common practice; configurable). */
export const STEADY_DEFAULTS = {
  defaultMaxRelSpread: 0.05,
  resolutionFactor: 2,
  minCoveredFraction: 0.8,
  minSamples: 2,
  maxNonNumericFraction: 0.1,
  maxOutOfRangeCount: 0,
  maxBalanceResidual: 0.05,
} as const;

export type HourReasonCode =
  | 'TAG_MISSING'
  | 'TAG_FROZEN'
  | 'TAG_OUT_OF_RANGE'
  | 'TAG_POOR_COVERAGE'
  | 'TAG_STATUS_WORDS'
  | 'BALANCE_NOT_CLOSED'
  | 'BELOW_MIN_LOAD'
  | 'SPREAD_HIGH';

export interface HourReason {
  code: HourReasonCode;
  /** The state this reason implies on its own. */
  state: Exclude<HourState, 'steady'>;
  tag?: string;
  balance?: string;
  /** The offending value and its limit, when there is one. */
  value?: number;
  limit?: number;
  message: string;
}

/** An hour's state with the reasons for it. */
export interface HourClassification {
  state: HourState;
  /** Every reason found, most severe first. */
  reasons: HourReason[];
}

/**
 * Classifies one hour of one unit.
 *
 * @param input tags: hourly statistics by tag (null/undefined when the tag has no data); balances:
 *        closure residuals of the hour [-]
 * @param limits unit limits; see SteadyLimits for defaults
 * @returns the hour state and every reason, most severe first
 */
export function classifyHour(
  input: { tags: Readonly<Record<string, TagHourStats | null | undefined>>; balances?: readonly BalanceClosure[] },
  limits: SteadyLimits,
): HourClassification {
  const lim = limitsOf(limits);
  const keyTags = keyTagsOf(limits.keyTags ?? Object.keys(input.tags), limits.loadTag);
  const reasons: HourReason[] = [];
  /** Key tags with a sound value this hour: only these are judged for load and spread. */
  const sound = new Set<string>();
  for (const tag of keyTags) {
    const found = tagHealthReasons(tag, input.tags[tag], limits, lim);
    reasons.push(...found);
    if (found.length === 0) sound.add(tag);
  }
  reasons.push(...balanceReasons(input.balances ?? [], lim));
  reasons.push(...loadReasons(input.tags[limits.loadTag], sound, limits));
  for (const tag of keyTags) if (sound.has(tag)) reasons.push(...spreadReasons(tag, input.tags[tag]!, limits, lim));

  reasons.sort((a, b) => STATE_SEVERITY[b.state] - STATE_SEVERITY[a.state]);
  const state: HourState = reasons.length > 0 ? reasons[0].state : 'steady';
  return { state, reasons };
}

type Limits = ReturnType<typeof limitsOf>;

/** One key tag's value this hour: present, not frozen, in range, covering the hour, not mostly status words (none found: sound). */
function tagHealthReasons(tag: string, st: TagHourStats | null | undefined, limits: SteadyLimits, lim: Limits): HourReason[] {
  if (!st || st.mean === null || !Number.isFinite(st.mean) || st.sampleCount <= 0) {
    return [{ code: 'TAG_MISSING', state: 'suspect', tag, message: `${tag}: no usable value in this hour` }];
  }
  const reasons: HourReason[] = [];
  if (st.flatline) {
    reasons.push({ code: 'TAG_FROZEN', state: 'suspect', tag, message: `${tag}: value unchanged for longer than its flatline limit (frozen transmitter?)` });
  }
  if (st.outOfRangeCount > lim.maxOutOfRangeCount) {
    reasons.push({
      code: 'TAG_OUT_OF_RANGE',
      state: 'suspect',
      tag,
      value: st.outOfRangeCount,
      limit: lim.maxOutOfRangeCount,
      message: `${tag}: ${fixed(st.outOfRangeCount, 0)} sample(s) outside the valid range`,
    });
  }
  const minCovered = limits.spread?.[tag]?.minCoveredFraction ?? lim.minCoveredFraction;
  if (st.coveredFraction < minCovered || st.sampleCount < lim.minSamples) {
    reasons.push({
      code: 'TAG_POOR_COVERAGE',
      state: 'suspect',
      tag,
      value: st.coveredFraction,
      limit: minCovered,
      message: `${tag}: data cover ${fixed(100 * st.coveredFraction, 0)} % of the hour with ${fixed(st.sampleCount, 0)} sample(s) (need ${fixed(100 * minCovered, 0)} % and ${fixed(lim.minSamples, 0)})`,
    });
  }
  const cells = st.sampleCount + st.nonNumericCount + (st.badQualityCount ?? 0);
  const statusShare = cells > 0 ? (st.nonNumericCount + (st.badQualityCount ?? 0)) / cells : 0;
  if (statusShare > lim.maxNonNumericFraction) {
    reasons.push({
      code: 'TAG_STATUS_WORDS',
      state: 'suspect',
      tag,
      value: statusShare,
      limit: lim.maxNonNumericFraction,
      message: `${tag}: ${fixed(100 * statusShare, 0)} % of the hour's cells are status words or bad quality`,
    });
  }
  return reasons;
}

/** Balances of the hour that do not close within their tolerance. */
function balanceReasons(balances: readonly BalanceClosure[], lim: Limits): HourReason[] {
  const reasons: HourReason[] = [];
  for (const b of balances) {
    const tol = b.tolerance ?? lim.maxBalanceResidual;
    if (!Number.isFinite(b.residual) || Math.abs(b.residual) > tol) {
      reasons.push({
        code: 'BALANCE_NOT_CLOSED',
        state: 'suspect',
        balance: b.name,
        value: b.residual,
        limit: tol,
        message: Number.isFinite(b.residual)
          ? `${b.name} balance misses by ${fixed(100 * b.residual, 1)} % (tolerance ${fixed(100 * tol, 1)} %)`
          : `${b.name} balance could not be computed`,
      });
    }
  }
  return reasons;
}

/** A sound load below the unit's minimum load: the hour is idle. */
function loadReasons(load: TagHourStats | null | undefined, sound: ReadonlySet<string>, limits: SteadyLimits): HourReason[] {
  if (!sound.has(limits.loadTag) || !load || load.mean === null || load.mean >= limits.minLoad) return [];
  return [
    {
      code: 'BELOW_MIN_LOAD',
      state: 'idle',
      tag: limits.loadTag,
      value: load.mean,
      limit: limits.minLoad,
      message: `load ${figures(load.mean, 4)} is below the minimum load ${figures(limits.minLoad, 4)}`,
    },
  ];
}

/** A sound key tag's spread within the hour against its relative or absolute limit (never below what the instrument resolves). */
function spreadReasons(tag: string, st: TagHourStats, limits: SteadyLimits, lim: Limits): HourReason[] {
  if (st.stdDev === null || !Number.isFinite(st.stdDev)) return [];
  const own = limits.spread?.[tag];
  const maxRel = own?.maxRelSpread ?? (own?.maxStd === undefined ? lim.defaultMaxRelSpread : undefined);
  const mean = st.mean!;
  const floor = resolvableSpread(mean, own?.instrument, lim.resolutionFactor);
  // At the limit counts as settled: only a spread above it makes the hour unsettled.
  if (maxRel !== undefined && mean !== 0) {
    const rel = st.stdDev / Math.abs(mean);
    const relLimit = Math.max(maxRel, floor / Math.abs(mean));
    if (aboveLimit(rel, relLimit)) {
      const [shown, shownLimit] = distinctFigures(100 * rel, 100 * relLimit);
      return [
        {
          code: 'SPREAD_HIGH',
          state: 'unsettled',
          tag,
          value: rel,
          limit: relLimit,
          message: `${tag}: spread ${shown} % of the mean, above its limit ${shownLimit} % (${fixed(100 * maxRel, 1)} % of the mean${floorNote(floor)}; a spread at the limit counts as settled)`,
        },
      ];
    }
  }
  if (own?.maxStd !== undefined) {
    const absLimit = Math.max(own.maxStd, floor);
    if (aboveLimit(st.stdDev, absLimit)) {
      const [shown, shownLimit] = distinctFigures(st.stdDev, absLimit, 3);
      return [
        {
          code: 'SPREAD_HIGH',
          state: 'unsettled',
          tag,
          value: st.stdDev,
          limit: absLimit,
          message: `${tag}: spread ${shown} within the hour, above its limit ${shownLimit} (set ${fmt(own.maxStd)}${floorNote(floor)}; a spread at the limit counts as settled)`,
        },
      ];
    }
  }
  return [];
}

const fmt = (v: number) => figures(v, 3);

/**
 * The rule of every spread limit: a value AT its limit is inside (settled); only a value above it is
 * outside. "At" allows for the rounding of floating point (a relative 1e-9), so that a spread computed
 * as 0.05000000000000001 against a limit of 0.05 is at its limit, not above it.
 */
export function aboveLimit(value: number, limit: number): boolean {
  return value > limit + Math.abs(limit) * 1e-9;
}

/**
 * A value above its limit and the limit, written with the fewest decimals (at least one) at which the
 * two differ, or with the fewest significant figures (at least `significant`) when that is given,
 * so that the words never say "spread 5.0 % (limit 5.0 %)" of an hour that is outside its limit.
 */
export function distinctFigures(value: number, limit: number, significant?: number): [string, string] {
  if (significant !== undefined) {
    for (let p = significant; p <= 12; p++) {
      const a = figures(value, p);
      const b = figures(limit, p);
      if (a !== b) return [a, b];
    }
    return [figures(value, 17), figures(limit, 17)];
  }
  for (let d = 1; d <= 10; d++) {
    const a = fixed(value, d);
    const b = fixed(limit, d);
    if (a !== b) return [a, b];
  }
  return [figures(value, 17), figures(limit, 17)];
}
/** The instrument's floor in a reason's words (formatted only when a reason is written). */
const floorNote = (floor: number) => (floor > 0 ? `; what the instrument resolves: ${fmt(floor)}` : '');

/** The limits with the defaults filled in where a limit is not given (undefined). */
function limitsOf(l: SteadyLimits) {
  const d = STEADY_DEFAULTS;
  return {
    defaultMaxRelSpread: l.defaultMaxRelSpread ?? d.defaultMaxRelSpread,
    resolutionFactor: l.resolutionFactor ?? d.resolutionFactor,
    minCoveredFraction: l.minCoveredFraction ?? d.minCoveredFraction,
    minSamples: l.minSamples ?? d.minSamples,
    maxNonNumericFraction: l.maxNonNumericFraction ?? d.maxNonNumericFraction,
    maxOutOfRangeCount: l.maxOutOfRangeCount ?? d.maxOutOfRangeCount,
    maxBalanceResidual: l.maxBalanceResidual ?? d.maxBalanceResidual,
  };
}

const keyTagLists = new WeakMap<readonly string[], { loadTag: string; tags: string[] }>();
/** The key tags and the load tag, each once, in order; kept per key-tag array (callers pass the same one hour after hour). */
function keyTagsOf(keyTags: readonly string[], loadTag: string): readonly string[] {
  const hit = keyTagLists.get(keyTags);
  if (hit && hit.loadTag === loadTag) return hit.tags;
  const tags = [...new Set([...keyTags, loadTag])];
  keyTagLists.set(keyTags, { loadTag, tags });
  return tags;
}
