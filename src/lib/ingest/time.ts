/**
 * Time cells: scanning date-time text, the numeric kinds (Unix seconds or milliseconds, spreadsheet
 * serial days), local wall-clock time to UTC in the site's time zone (with the daylight-saving order
 * rule), and the site's local clock hours.
 *
 * Wall-clock times are handled as "wall milliseconds": the epoch milliseconds the same calendar
 * date and clock reading would have in UTC. A time zone then maps wall ms to UTC ms.
 */
import { tzOffset } from '@date-fns/tz';
import { IngestError } from './errors';
import { DAY_MS, HOUR_MS, MINUTE_MS } from '../time';

export * from './time-scan';

/** Formats epoch ms as ISO 8601 UTC ('Z'). */
export function isoUtc(ms: number): string {
  return new Date(ms).toISOString();
}

// ---------------------------------------------------------------------------------------------
// Time zones

const isUtcName = (tz: string) => tz === 'UTC' || tz === 'Etc/UTC' || tz === 'Z' || tz === 'GMT';

/** UTC offset of the zone at an instant [minutes]. */
export function offsetMinutesAt(timeZone: string, utcMs: number): number {
  if (isUtcName(timeZone)) return 0;
  return tzOffset(timeZone, new Date(utcMs));
}

/** Throws INVALID_TIME_ZONE unless the zone is a known IANA name or a ±hh:mm offset. */
export function assertTimeZone(timeZone: string): void {
  if (typeof timeZone !== 'string' || timeZone.length === 0 || !Number.isFinite(offsetMinutesAt(timeZone, 0))) {
    throw new IngestError(
      'INVALID_TIME_ZONE',
      `The time zone ${JSON.stringify(timeZone)} is not known. Set the site's time zone to an IANA name such as 'Europe/Berlin'.`,
      { timeZone },
    );
  }
}

/** How a wall-clock reading maps to UTC in a zone. */
export const WallKind = {
  Normal: 0,
  /** The reading occurs twice (the repeated hour when clocks go back). */
  Repeated: 1,
  /** The reading never occurs (the gap when clocks go forward). */
  Gap: 2,
} as const;
export type WallKind = (typeof WallKind)[keyof typeof WallKind];

interface WallInfo {
  kind: WallKind;
  /** Offset giving the earlier UTC instant (for Normal and Gap the only one used) [minutes]. */
  offsetEarlyMinutes: number;
  /** Offset giving the later UTC instant (equals offsetEarlyMinutes unless Repeated) [minutes]. */
  offsetLateMinutes: number;
}

const BUCKET_MS = 15 * MINUTE_MS;
const CACHE_LIMIT = 20000;

/**
 * Classifies wall-clock readings of one zone. Results are cached per quarter hour of wall time
 * (transitions in the tz database fall on quarter hours).
 */
export function createWallClassifier(timeZone: string): (wallMs: number) => WallInfo {
  assertTimeZone(timeZone);
  const cache = new Map<number, WallInfo>();
  let lastKey = NaN;
  let lastInfo: WallInfo | null = null;
  const fixed = isUtcName(timeZone);
  const utcInfo: WallInfo = { kind: WallKind.Normal, offsetEarlyMinutes: 0, offsetLateMinutes: 0 };
  return (wallMs: number): WallInfo => {
    if (fixed) return utcInfo;
    const key = Math.floor(wallMs / BUCKET_MS);
    if (key === lastKey) return lastInfo!;
    let info = cache.get(key);
    if (!info) {
      const w = key * BUCKET_MS;
      const before = offsetMinutesAt(timeZone, w - DAY_MS);
      const after = offsetMinutesAt(timeZone, w + DAY_MS);
      const okBefore = offsetMinutesAt(timeZone, w - before * MINUTE_MS) === before;
      const okAfter = after !== before && offsetMinutesAt(timeZone, w - after * MINUTE_MS) === after;
      if (okBefore && okAfter) {
        info = {
          kind: WallKind.Repeated,
          offsetEarlyMinutes: Math.max(before, after),
          offsetLateMinutes: Math.min(before, after),
        };
      } else if (okBefore || okAfter) {
        const o = okBefore ? before : after;
        info = { kind: WallKind.Normal, offsetEarlyMinutes: o, offsetLateMinutes: o };
      } else {
        // In the gap: read with the offset in force before the change (02:30 becomes 03:30 summer time).
        info = { kind: WallKind.Gap, offsetEarlyMinutes: before, offsetLateMinutes: before };
      }
      if (cache.size > CACHE_LIMIT) cache.clear();
      cache.set(key, info);
    }
    lastKey = key;
    lastInfo = info;
    return info;
  };
}

/** Counts of daylight-saving decisions made while reading local times. */
export interface LocalClockStats {
  gapCount: number;
  gapLines: number[];
  repeatedFirstPassCount: number;
  repeatedSecondPassCount: number;
  repeatedLines: number[];
}

/**
 * Maps local wall times, in file order, to UTC with the order rule for daylight-saving changes:
 * - a reading in the repeated hour is read with the earlier (summer) offset - the first pass - until
 *   the readings step back (a reading whose first-pass instant is not after the previous row's instant
 *   while its second-pass instant is), from then on with the later offset (the second pass), until a
 *   reading outside the repeated hour;
 * - a reading in the spring-forward gap is read with the offset in force before the change.
 * Every such reading is counted and its line kept (up to `maxLines`).
 */
export class LocalClock {
  private readonly classify: (wallMs: number) => WallInfo;
  private secondPass = false;
  private lastUtcMs = -Infinity;
  readonly stats: LocalClockStats = { gapCount: 0, gapLines: [], repeatedFirstPassCount: 0, repeatedSecondPassCount: 0, repeatedLines: [] };
  constructor(timeZone: string, private readonly maxLines = 20) {
    this.classify = createWallClassifier(timeZone);
  }

  /** UTC ms of a local wall reading on the given line. */
  toUtc(wallMs: number, line: number): number {
    const info = this.classify(wallMs);
    let utc: number;
    if (info.kind === WallKind.Normal) {
      this.secondPass = false;
      utc = wallMs - info.offsetEarlyMinutes * MINUTE_MS;
    } else if (info.kind === WallKind.Gap) {
      this.secondPass = false;
      utc = wallMs - info.offsetEarlyMinutes * MINUTE_MS;
      this.stats.gapCount++;
      if (this.stats.gapLines.length < this.maxLines) this.stats.gapLines.push(line);
    } else {
      const early = wallMs - info.offsetEarlyMinutes * MINUTE_MS;
      const late = wallMs - info.offsetLateMinutes * MINUTE_MS;
      if (!this.secondPass && early <= this.lastUtcMs && late > this.lastUtcMs) this.secondPass = true;
      utc = this.secondPass ? late : early;
      if (this.secondPass) this.stats.repeatedSecondPassCount++;
      else this.stats.repeatedFirstPassCount++;
      if (this.stats.repeatedLines.length < this.maxLines) this.stats.repeatedLines.push(line);
    }
    this.lastUtcMs = utc;
    return utc;
  }

  /** Tells the clock about a row whose instant was absolute (explicit offset), to keep the order. */
  noteAbsolute(utcMs: number): void {
    this.lastUtcMs = utcMs;
    this.secondPass = false;
  }
}

// ---------------------------------------------------------------------------------------------
// Local clock hours

export interface HourSpan {
  /** UTC ms where the local clock hour starts. */
  startMs: number;
  /** UTC ms where it ends (start + 1 h, unless an offset change inside the hour cuts it). */
  endMs: number;
  /** UTC offset in force during the hour [minutes]. */
  offsetMinutes: number;
}

/**
 * The site's local clock hours. A site at UTC+05:30 gets hours starting at hh:30 UTC; the repeated
 * hour when clocks go back is two distinct hours with different offsets. Results are cached.
 */
export class HourClock {
  private readonly cache = new Map<number, HourSpan>();
  private last: HourSpan = { startMs: Infinity, endMs: -Infinity, offsetMinutes: 0 };
  private readonly fixedOffset: number | null;
  constructor(private readonly timeZone: string) {
    assertTimeZone(timeZone);
    // A zone without transitions in a wide window is treated as fixed.
    this.fixedOffset = isUtcName(timeZone) ? 0 : null;
  }

  /** The local hour containing the instant. The returned object must not be modified. */
  hourOf(utcMs: number): HourSpan {
    const last = this.last;
    if (utcMs >= last.startMs && utcMs < last.endMs) return last;
    if (this.fixedOffset !== null) {
      const o = this.fixedOffset * MINUTE_MS;
      const start = Math.floor((utcMs + o) / HOUR_MS) * HOUR_MS - o;
      this.last = { startMs: start, endMs: start + HOUR_MS, offsetMinutes: this.fixedOffset };
      return this.last;
    }
    const key = Math.floor(utcMs / BUCKET_MS);
    let span = this.cache.get(key);
    if (!span || utcMs < span.startMs || utcMs >= span.endMs) {
      span = this.compute(utcMs);
      if (this.cache.size > CACHE_LIMIT) this.cache.clear();
      this.cache.set(key, span);
    }
    this.last = span;
    return span;
  }

  private compute(utcMs: number): HourSpan {
    const tz = this.timeZone;
    const o = offsetMinutesAt(tz, utcMs);
    const oMs = o * MINUTE_MS;
    const localStart = Math.floor((utcMs + oMs) / HOUR_MS) * HOUR_MS;
    let start = localStart - oMs;
    let end = start + HOUR_MS;
    if (offsetMinutesAt(tz, start) !== o) start = this.firstWithOffset(start, utcMs, o);
    if (offsetMinutesAt(tz, end - 1) !== o) end = this.firstWithoutOffset(utcMs, end, o);
    return { startMs: start, endMs: end, offsetMinutes: o };
  }

  /** Smallest whole minute in (lo, hi] with offset o, knowing lo has another offset and hi has o. */
  private firstWithOffset(lo: number, hi: number, o: number): number {
    return Math.min(this.firstMinuteWhere(lo, hi, (ms) => offsetMinutesAt(this.timeZone, ms) === o), hi);
  }

  /** Smallest whole minute in (lo, hi) whose offset differs from o, knowing lo has o. */
  private firstWithoutOffset(lo: number, hi: number, o: number): number {
    return this.firstMinuteWhere(lo, hi, (ms) => offsetMinutesAt(this.timeZone, ms) !== o);
  }

  /** Bisection over whole minutes: the first minute after lo where `holds` turns true, knowing it is false at lo and true by hi. */
  private firstMinuteWhere(lo: number, hi: number, holds: (ms: number) => boolean): number {
    let a = Math.floor(lo / MINUTE_MS);
    let b = Math.ceil(hi / MINUTE_MS);
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (holds(m * MINUTE_MS)) b = m;
      else a = m;
    }
    return b * MINUTE_MS;
  }
}
