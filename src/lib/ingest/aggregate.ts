/**
 * Hourly aggregation per tag on the site's local clock hours, streaming: only the open hour of each
 * tag and its last samples are held, finished hours are emitted as soon as they close.
 *
 * Signal model. Between two consecutive usable samples of a tag no further apart than the tag's
 * maxGapSeconds (default 900 s) the signal is
 *   - analog: the straight line between them (trapezoid rule; linear interpolation),
 *   - status: the earlier sample's value held until the later one (step, previous-value hold).
 * Segments that cross an hour boundary are split there, with the value at the boundary interpolated
 * (analog) or held (status), so each hour gets its share. Longer gaps are not bridged, and there is
 * no extrapolation before the first or after the last sample.
 *
 * Per tag and hour:
 *   - mean: time-weighted mean of the signal over the covered part of the hour; when nothing of the
 *     hour is covered (a lone sample) the arithmetic mean of its samples (meanMethod says which);
 *   - stdDev: time-weighted population standard deviation of the signal over the covered part,
 *     sqrt((1/T) ∫ (x - mean)² dt) (for a lone-sample hour: 0 / the samples' population deviation);
 *   - min, max, first, last: of the usable samples whose time falls inside the hour (an hour covered
 *     only by a bridged segment reports the extremes of the interpolated boundary values);
 *   - coveredSeconds / coveredFraction: time inside the hour on which the signal is defined,
 *     divided by the hour's length (3600 s);
 *   - counts: usable samples, rejected text, bad quality, out of [validMin, validMax], uncertain,
 *     duplicates (same time: the later sample replaces the earlier), out of order (dropped);
 *   - flatline: the value has stayed exactly the same, along drawn segments (a gap longer than
 *     maxGapSeconds or a rejected sample ends a run), for longer than the tag's flatlineLimitSeconds,
 *     measured at samples inside the hour (maxUnchangedSeconds: the longest run seen in the hour).
 * Samples that are rejected (text, bad quality, out of range) count in their hour and break the
 * signal: no segment is drawn across them. Blank cells are no samples at all.
 */
import { CellStatus } from './reader-types';
import { DEFAULT_FLATLINE_LIMIT_s, type HourAggregator, type HourAggregatorOptions, type TagHour } from './aggregate-types';
import { HourClock } from './time';
import { IngestError } from './errors';
import { HOUR_FIELDS, SLOT, methodCode } from './hour-pack';

export type { TagOptions, HourAggregatorOptions, TagHour, HourAggregator } from './aggregate-types';

// status of the pending sample (reader statuses plus one of our own)
const S_OK = CellStatus.Ok;
const S_TEXT = CellStatus.Text;
const S_BAD = CellStatus.BadQuality;
const S_UNCERTAIN = CellStatus.Uncertain;
const S_BLANK = CellStatus.Blank;

// Per-tag state lives in one Float64Array, W slots per tag (one buffer keeps the hot loop fast).
// The slot constants, their helpers and writeFields stay in this file although it passes 400 lines:
// moved into a module of their own (imported constants on the hot path), the read of the 70 MB bench
// export took 0.99 to 1.06 CPU s instead of 0.77 to 0.88 (measured in alternation, 3 December 2026).
// Tag k owns S[k * W, k * W + W), and S always holds at least n * W values (addTag grows it), so a
// read S[b + SLOT] with b = k * W of a known tag and SLOT < W is inside the buffer: those reads carry
// a non-null assertion (no check at run time on the hot path).
const IS_STATUS = 0;
const FLAT_MS = 1;
const V_MIN = 2;
const V_MAX = 3;
const GAP_MS = 4;
const P_T = 5; // pending sample (may still be replaced by a duplicate)
const P_V = 6;
const P_S = 7;
const P_DUP = 8;
const P_OOO = 9;
const L_T = 10; // last usable committed sample: the signal is drawn up to it
const L_V = 11;
const H_S = 12; // open hour
const H_E = 13;
const H_O = 14;
const COV = 15; // covered ms
const REF = 16; // shift for the sums (first value of the hour)
const SX = 17; // ∫(x-ref) dt [ms]
const SXX = 18; // ∫(x-ref)² dt [ms]
const CNT = 19;
const MN = 20;
const MX = 21;
const PMN = 22; // extremes of drawn pieces' end values
const PMX = 23;
const F_V = 24;
const F_T = 25;
const LA_V = 26;
const LA_T = 27;
const SSUM = 28; // sample sums, shifted by REF
const SSUM2 = 29;
const C_TEXT = 30;
const C_BAD = 31;
const C_RANGE = 32;
const C_UNC = 33;
const C_DUP = 34;
const C_OOO = 35;
const MAX_RUN = 36;
const RUN_T = 37;
const RUN_V = 38;
const W = 40;
const OUT_OF_RANGE = 255;

function resetHour(S: Float64Array, b: number): void {
  S[b + COV] = 0;
  S[b + REF] = NaN;
  S[b + SX] = 0;
  S[b + SXX] = 0;
  S[b + CNT] = 0;
  S[b + MN] = Infinity;
  S[b + MX] = -Infinity;
  S[b + PMN] = Infinity;
  S[b + PMX] = -Infinity;
  S[b + F_V] = NaN;
  S[b + F_T] = NaN;
  S[b + LA_V] = NaN;
  S[b + LA_T] = NaN;
  S[b + SSUM] = 0;
  S[b + SSUM2] = 0;
  S[b + C_TEXT] = 0;
  S[b + C_BAD] = 0;
  S[b + C_RANGE] = 0;
  S[b + C_UNC] = 0;
  S[b + C_DUP] = 0;
  S[b + C_OOO] = 0;
  S[b + MAX_RUN] = 0;
}

/** Adds the signal piece [ta, tb] with values va -> vb to the open hour of the tag at b. */
function piece(S: Float64Array, b: number, ta: number, tb: number, va: number, vb: number): void {
  const d = tb - ta;
  if (d <= 0) return;
  let r = S[b + REF]!;
  if (r !== r) {
    r = va;
    S[b + REF] = r;
  }
  S[b + COV]! += d;
  const ya = va - r;
  if (S[b + IS_STATUS] === 1) {
    S[b + SX]! += d * ya;
    S[b + SXX]! += d * ya * ya;
    vb = va;
  } else {
    const yb = vb - r;
    S[b + SX]! += d * (ya + yb) * 0.5;
    S[b + SXX]! += (d * (ya * ya + ya * yb + yb * yb)) / 3;
  }
  if (va < S[b + PMN]!) S[b + PMN] = va;
  if (va > S[b + PMX]!) S[b + PMX] = va;
  if (vb < S[b + PMN]!) S[b + PMN] = vb;
  if (vb > S[b + PMX]!) S[b + PMX] = vb;
}

/**
 * The aggregator as a class: its methods are shared by every instance, so the hot loop keeps
 * monomorphic calls when several files are aggregated in one process.
 */
class Aggregator implements HourAggregator {
  private n = 0;
  private readonly names: string[] = [];
  private readonly byName = new Map<string, number>();
  private S = new Float64Array(16 * W);
  private readonly clock: HourClock;
  private readonly defaultGapS: number;
  /** The packed hour handed to onHourFields, reused (null: hours go to onHour as objects). */
  private readonly fields: Float64Array | null;

  constructor(private readonly options: HourAggregatorOptions) {
    this.clock = new HourClock(options.timeZone);
    this.fields = options.onHourFields ? new Float64Array(HOUR_FIELDS) : null;
    this.defaultGapS = options.maxGapSeconds ?? 900;
    if (!(this.defaultGapS >= 0)) throw new IngestError('INVALID_OPTIONS', `maxGapSeconds must be 0 or more, got ${this.defaultGapS}.`);
  }

  addTag(k: number, tag: string): void {
    const n = this.n;
    if (k !== n) throw new IngestError('INVALID_OPTIONS', `Tags must be announced with dense indexes: expected ${n}, got ${k} for '${tag}'.`);
    if ((n + 1) * W > this.S.length) {
      const grown = new Float64Array(this.S.length * 2);
      grown.set(this.S);
      this.S = grown;
    }
    const S = this.S;
    const o = this.options.tagOptions?.(tag) ?? {};
    const g = o.maxGapSeconds ?? this.defaultGapS;
    if (!(g >= 0)) throw new IngestError('INVALID_OPTIONS', `maxGapSeconds of tag '${tag}' must be 0 or more, got ${g}.`);
    const b = k * W;
    S.fill(NaN, b, b + W);
    S[b + IS_STATUS] = o.kind === 'status' ? 1 : 0;
    S[b + FLAT_MS] = (o.flatlineLimitSeconds ?? DEFAULT_FLATLINE_LIMIT_s) * 1000;
    S[b + V_MIN] = o.validMin ?? -Infinity;
    S[b + V_MAX] = o.validMax ?? Infinity;
    S[b + GAP_MS] = g * 1000;
    resetHour(S, b);
    this.names.push(tag);
    this.byName.set(tag, k);
    this.n = n + 1;
  }

  tagIndex(tag: string): number {
    const k = this.byName.get(tag);
    if (k !== undefined) return k;
    this.addTag(this.n, tag);
    return this.n - 1;
  }

  addRow(timeMs: number, values: Float64Array, status: Uint8Array): void {
    const m = Math.min(this.n, values.length);
    if (status.length < m) throw new IngestError('INVALID_OPTIONS', `A row has ${values.length} values but ${status.length} statuses: each value needs its status.`);
    const S = this.S;
    for (let k = 0; k < m; k++) {
      const s = status[k]!;
      if (s === S_BLANK) continue;
      this.push(S, k * W, timeMs, values[k]!, s);
    }
  }

  addSample(tagIndex: number, timeMs: number, value: number, status: number): void {
    if (!(tagIndex >= 0 && tagIndex < this.n)) throw new IngestError('INVALID_OPTIONS', `Unknown tag index ${tagIndex}; announce tags with addTag first.`);
    if (status === S_BLANK) return;
    this.push(this.S, tagIndex * W, timeMs, value, status);
  }

  flush(): void {
    const S = this.S;
    for (let k = 0; k < this.n; k++) {
      const b = k * W;
      if (S[b + P_T] === S[b + P_T]) {
        this.commit(S, b);
        S[b + P_T] = NaN;
      }
      this.closeHour(S, b);
      // after a flush the next sample starts a fresh signal
      S[b + L_T] = NaN;
      S[b + RUN_T] = NaN;
      S[b + RUN_V] = NaN;
    }
  }

  private push(S: Float64Array, b: number, t: number, v: number, s: number): void {
    const pt = S[b + P_T]!;
    if (t > pt) {
      this.commit(S, b);
    } else if (t === pt) {
      S[b + P_V] = v; // the later sample wins
      S[b + P_S] = s;
      S[b + P_DUP]!++;
      return;
    } else if (t < pt) {
      S[b + P_OOO]!++;
      return;
    }
    // first sample (pt NaN) or after a commit
    S[b + P_T] = t;
    S[b + P_V] = v;
    S[b + P_S] = s;
    S[b + P_DUP] = 0;
    S[b + P_OOO] = 0;
  }

  private openHourAt(S: Float64Array, b: number, t: number): void {
    const span = this.clock.hourOf(t);
    S[b + H_S] = span.startMs;
    S[b + H_E] = span.endMs;
    S[b + H_O] = span.offsetMinutes;
    resetHour(S, b);
  }

  /** Processes the pending sample of the tag at b: draw the signal up to it, account it. */
  private commit(S: Float64Array, b: number): void {
    const t = S[b + P_T]!;
    const v = S[b + P_V]!;
    let s = S[b + P_S]!;
    if ((s === S_OK || s === S_UNCERTAIN) && (v < S[b + V_MIN]! || v > S[b + V_MAX]!)) s = OUT_OF_RANGE;
    const usable = s === S_OK || s === S_UNCERTAIN;
    const t0 = S[b + L_T]!;
    const bridged = usable && t0 === t0 && t - t0 <= S[b + GAP_MS]!;
    if (bridged) {
      // draw the segment from the last usable sample, splitting it at hour ends
      const v0 = S[b + L_V]!;
      const status = S[b + IS_STATUS] === 1;
      let a = t0;
      let va = v0;
      while (t >= S[b + H_E]!) {
        const end = S[b + H_E]!;
        const vb = status ? v0 : v0 + ((v - v0) * (end - t0)) / (t - t0);
        piece(S, b, a, end, va, vb);
        this.closeHour(S, b);
        this.openHourAt(S, b, end);
        a = end;
        va = vb;
      }
      piece(S, b, a, t, va, status ? v0 : v);
    } else if (!(t < S[b + H_E]!)) {
      // no open hour (NaN) or the sample lies past it
      this.closeHour(S, b);
      this.openHourAt(S, b, t);
    }
    // account the sample in its hour
    S[b + C_DUP]! += S[b + P_DUP]!;
    S[b + C_OOO]! += S[b + P_OOO]!;
    if (usable) {
      const c = S[b + CNT]!;
      if (c === 0) {
        S[b + F_V] = v;
        S[b + F_T] = t;
      }
      S[b + CNT] = c + 1;
      S[b + LA_V] = v;
      S[b + LA_T] = t;
      if (v < S[b + MN]!) S[b + MN] = v;
      if (v > S[b + MX]!) S[b + MX] = v;
      let r = S[b + REF]!;
      if (r !== r) {
        r = v;
        S[b + REF] = r;
      }
      const y = v - r;
      S[b + SSUM]! += y;
      S[b + SSUM2]! += y * y;
      if (s === S_UNCERTAIN) S[b + C_UNC]!++;
      // flatline run: only along drawn segments (a gap or a rejected sample starts a new run)
      if (!bridged || v !== S[b + RUN_V]) {
        S[b + RUN_V] = v;
        S[b + RUN_T] = t;
      } else {
        const run = t - S[b + RUN_T]!;
        if (run > S[b + MAX_RUN]!) S[b + MAX_RUN] = run;
      }
      S[b + L_T] = t;
      S[b + L_V] = v;
    } else {
      if (s === S_TEXT) S[b + C_TEXT]!++;
      else if (s === S_BAD) S[b + C_BAD]!++;
      else if (s === OUT_OF_RANGE) S[b + C_RANGE]!++;
      S[b + L_T] = NaN; // rejected samples break the signal
    }
  }

  private closeHour(S: Float64Array, b: number): void {
    const start = S[b + H_S]!;
    if (start !== start) return;
    const c = S[b + CNT]!;
    const covered = S[b + COV]!;
    const counters = S[b + C_TEXT]! + S[b + C_BAD]! + S[b + C_RANGE]! + S[b + C_DUP]! + S[b + C_OOO]!;
    if (c > 0 || covered > 0 || counters > 0) {
      const end = S[b + H_E]!;
      let mean: number | null = null;
      let std: number | null = null;
      let method: TagHour['meanMethod'] = 'none';
      const r = S[b + REF]!;
      if (covered > 0) {
        const m1 = S[b + SX]! / covered;
        const m2 = S[b + SXX]! / covered;
        mean = r + m1;
        std = Math.sqrt(Math.max(0, m2 - m1 * m1));
        method = 'time-weighted';
      } else if (c > 0) {
        const m1 = S[b + SSUM]! / c;
        mean = r + m1;
        std = Math.sqrt(Math.max(0, S[b + SSUM2]! / c - m1 * m1));
        method = 'samples';
      }
      const haveSamples = c > 0;
      const tag = this.names[b / W];
      if (tag === undefined) throw new IngestError('READER_FAULT', `The hour aggregator closed an hour of tag ${b / W}, which was never announced.`);
      const min = haveSamples ? S[b + MN]! : covered > 0 ? S[b + PMN]! : null;
      const max = haveSamples ? S[b + MX]! : covered > 0 ? S[b + PMX]! : null;
      if (this.fields) {
        writeFields(this.fields, S, b, mean, method, std, min, max, haveSamples, covered, start, end);
        this.options.onHourFields!(tag, this.fields);
      } else this.options.onHour({
        tag,
        hourStartMs: start,
        hourEndMs: end,
        utcOffsetMinutes: S[b + H_O]!,
        mean,
        meanMethod: method,
        stdDev: std,
        min,
        max,
        first: haveSamples ? S[b + F_V]! : null,
        firstMs: haveSamples ? S[b + F_T]! : null,
        last: haveSamples ? S[b + LA_V]! : null,
        lastMs: haveSamples ? S[b + LA_T]! : null,
        sampleCount: c,
        coveredSeconds: covered / 1000,
        coveredFraction: covered / (end - start),
        nonNumericCount: S[b + C_TEXT]!,
        badQualityCount: S[b + C_BAD]!,
        outOfRangeCount: S[b + C_RANGE]!,
        uncertainCount: S[b + C_UNC]!,
        duplicateCount: S[b + C_DUP]!,
        outOfOrderCount: S[b + C_OOO]!,
        maxUnchangedSeconds: S[b + MAX_RUN]! / 1000,
        flatline: S[b + MAX_RUN]! > S[b + FLAT_MS]!,
      });
    }
    S[b + H_S] = NaN;
    S[b + H_E] = NaN;
  }
}

/** A finished hour in the packed layout of hour-pack.ts (the same figures onHour's object carries). */
function writeFields(
  f: Float64Array,
  S: Float64Array,
  b: number,
  mean: number | null,
  method: TagHour['meanMethod'],
  std: number | null,
  min: number | null,
  max: number | null,
  haveSamples: boolean,
  covered: number,
  start: number,
  end: number,
): void {
  f[SLOT.meanMethod] = methodCode(method);
  f[SLOT.flatline] = S[b + MAX_RUN]! > S[b + FLAT_MS]! ? 1 : 0;
  f[SLOT.hourStartMs] = start;
  f[SLOT.hourEndMs] = end;
  f[SLOT.utcOffsetMinutes] = S[b + H_O]!;
  f[SLOT.mean] = mean ?? NaN;
  f[SLOT.stdDev] = std ?? NaN;
  f[SLOT.min] = min ?? NaN;
  f[SLOT.max] = max ?? NaN;
  f[SLOT.first] = haveSamples ? S[b + F_V]! : NaN;
  f[SLOT.firstMs] = haveSamples ? S[b + F_T]! : NaN;
  f[SLOT.last] = haveSamples ? S[b + LA_V]! : NaN;
  f[SLOT.lastMs] = haveSamples ? S[b + LA_T]! : NaN;
  f[SLOT.sampleCount] = S[b + CNT]!;
  f[SLOT.coveredSeconds] = covered / 1000;
  f[SLOT.coveredFraction] = covered / (end - start);
  f[SLOT.nonNumericCount] = S[b + C_TEXT]!;
  f[SLOT.badQualityCount] = S[b + C_BAD]!;
  f[SLOT.outOfRangeCount] = S[b + C_RANGE]!;
  f[SLOT.uncertainCount] = S[b + C_UNC]!;
  f[SLOT.duplicateCount] = S[b + C_DUP]!;
  f[SLOT.outOfOrderCount] = S[b + C_OOO]!;
  f[SLOT.maxUnchangedSeconds] = S[b + MAX_RUN]! / 1000;
}

/**
 * Creates the aggregator. Feed samples in time order per tag (wide rows through addRow, single
 * samples through addSample); call flush() at the end of the input.
 */
export function createHourAggregator(options: HourAggregatorOptions): HourAggregator {
  return new Aggregator(options);
}

