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

export const MS_PER_HOUR = 3_600_000;
const MS_PER_DAY = 86_400_000;
const MS_PER_MINUTE = 60_000;
/** Days from 1899-12-30 (spreadsheet day 0) to 1970-01-01. */
export const SERIAL_DAY_OF_UNIX_EPOCH = 25569;

const MONTHS: Record<string, number> = {
  jan: 1, feb: 2, mar: 3, apr: 4, may: 5, jun: 6, jul: 7, aug: 8, sep: 9, sept: 9, oct: 10, nov: 11, dec: 12,
  january: 1, february: 2, march: 3, april: 4, june: 6, july: 7, august: 8, september: 9, october: 10, november: 11, december: 12,
};

/** Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant's days_from_civil). */
export function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/** What {@link scanDateTime} found in one cell. Reused between calls to avoid allocation. */
export interface DateTimeScan {
  /** The three date fields in the order written; a month name is stored as its number. */
  a: number;
  b: number;
  c: number;
  aDigits: number;
  bDigits: number;
  cDigits: number;
  /** 0: no month name; 1, 2 or 3: which field was a month name. */
  monthName: number;
  /** Char code separating the date fields (45 '-', 47 '/', 46 '.', 32 ' '). */
  dateSep: number;
  hasDate: boolean;
  hasTime: boolean;
  hour: number;
  minute: number;
  second: number;
  millisecond: number;
  /** 0 none, 1 AM, 2 PM. */
  meridiem: number;
  /** Explicit UTC offset in minutes ('Z' is 0), NaN when the text has none. */
  offsetMinutes: number;
  /** True when a 'T' separated date and time (ISO 8601). */
  isoT: boolean;
}

export function newScan(): DateTimeScan {
  return {
    a: 0, b: 0, c: 0, aDigits: 0, bDigits: 0, cDigits: 0, monthName: 0, dateSep: 0, hasDate: false, hasTime: false,
    hour: 0, minute: 0, second: 0, millisecond: 0, meridiem: 0, offsetMinutes: NaN, isoT: false,
  };
}

// scanner position/result registers (module-level to avoid allocation in the hot path)
let P = 0;
let V = 0;
let D = 0;

function readDigits(s: string, end: number): boolean {
  let v = 0;
  let d = 0;
  while (P < end) {
    const c = s.charCodeAt(P);
    if (c < 48 || c > 57) break;
    v = v * 10 + (c - 48);
    d++;
    P++;
  }
  V = v;
  D = d;
  return d > 0;
}

function readMonthName(s: string, end: number): boolean {
  const start = P;
  while (P < end) {
    const c = s.charCodeAt(P) | 32;
    if (c < 97 || c > 122) break;
    P++;
  }
  if (P - start < 3) {
    P = start;
    return false;
  }
  const m = MONTHS[s.slice(start, P).toLowerCase()];
  if (!m) {
    P = start;
    return false;
  }
  V = m;
  D = 0;
  return true;
}

function skipSpaces(s: string, end: number): void {
  while (P < end) {
    const c = s.charCodeAt(P);
    if (c !== 32 && c !== 9 && c !== 160) break;
    P++;
  }
}

/** Scans hh:mm[:ss[.fff]] [AM|PM] [Z|±hh[:mm]|UTC|GMT] from P. */
function scanTimePart(s: string, end: number, out: DateTimeScan): boolean {
  if (!readDigits(s, end) || D > 2) return false;
  out.hour = V;
  if (P >= end || s.charCodeAt(P) !== 58) return false;
  P++;
  if (!readDigits(s, end) || D !== 2) return false;
  out.minute = V;
  out.second = 0;
  out.millisecond = 0;
  if (P < end && s.charCodeAt(P) === 58) {
    P++;
    if (!readDigits(s, end) || D !== 2) return false;
    out.second = V;
    if (P < end && (s.charCodeAt(P) === 46 || s.charCodeAt(P) === 44)) {
      const save = P;
      P++;
      const fracStart = P;
      if (readDigits(s, end)) {
        // first three digits are milliseconds, round on the fourth
        let ms = 0;
        let k = 0;
        for (; k < 3; k++) ms = ms * 10 + (fracStart + k < P ? s.charCodeAt(fracStart + k) - 48 : 0);
        if (fracStart + 3 < P && s.charCodeAt(fracStart + 3) >= 53) ms += 1;
        out.millisecond = ms;
      } else {
        P = save;
        return false;
      }
    }
  }
  out.hasTime = true;
  skipSpaces(s, end);
  // meridiem
  if (P < end) {
    const c = s.charCodeAt(P) | 32;
    if (c === 97 || c === 112) {
      let q = P + 1;
      if (q < end && s.charCodeAt(q) === 46) q++;
      if (q < end && (s.charCodeAt(q) | 32) === 109) {
        q++;
        if (q < end && s.charCodeAt(q) === 46) q++;
        out.meridiem = c === 97 ? 1 : 2;
        P = q;
        skipSpaces(s, end);
      }
    }
  }
  // offset
  if (P < end) {
    const c = s.charCodeAt(P);
    if (c === 90 || c === 122) {
      out.offsetMinutes = 0;
      P++;
    } else if ((c | 32) === 117 || (c | 32) === 103) {
      const word = s.slice(P, P + 3).toUpperCase();
      if (word !== 'UTC' && word !== 'GMT') return false;
      P += 3;
      out.offsetMinutes = 0;
    }
    if (P < end) {
      const sc = s.charCodeAt(P);
      if (sc === 43 || sc === 45 || sc === 8722) {
        P++;
        if (!readDigits(s, end)) return false;
        let minutes: number;
        if ((D as number) === 4) minutes = Math.floor(V / 100) * 60 + (V % 100);
        else if (D <= 2) {
          minutes = V * 60;
          if (P < end && s.charCodeAt(P) === 58) {
            P++;
            if (!readDigits(s, end) || D !== 2) return false;
            minutes += V;
          }
        } else return false;
        out.offsetMinutes = sc === 43 ? minutes : -minutes;
      }
    }
    skipSpaces(s, end);
  }
  return P === end;
}

/**
 * Scans a date-time cell text[start, end): a date of three fields (digits or an English month name)
 * separated by '-', '/', '.' or spaces, then optionally 'T', spaces or ', ' and a time of day with
 * optional fraction, AM/PM and UTC offset. Returns false when the text does not have that shape.
 * Ranges are not checked here (see {@link wallMsFromScan}).
 */
export function scanDateTime(text: string, start: number, end: number, out: DateTimeScan): boolean {
  P = start;
  while (end > start && (text.charCodeAt(end - 1) === 32 || text.charCodeAt(end - 1) === 9)) end--;
  skipSpaces(text, end);
  out.monthName = 0;
  out.hasTime = false;
  out.hasDate = false;
  out.meridiem = 0;
  out.offsetMinutes = NaN;
  out.isoT = false;
  out.hour = out.minute = out.second = out.millisecond = 0;
  // field a
  if (readDigits(text, end)) {
    out.a = V;
    out.aDigits = D;
  } else if (readMonthName(text, end)) {
    out.a = V;
    out.aDigits = 0;
    out.monthName = 1;
  } else return false;
  if (P >= end) return false;
  const sep = text.charCodeAt(P);
  if (sep !== 45 && sep !== 47 && sep !== 46 && sep !== 32) return false;
  out.dateSep = sep;
  P++;
  if (sep === 32) skipSpaces(text, end);
  if (readDigits(text, end)) {
    out.b = V;
    out.bDigits = D;
  } else if (out.monthName === 0 && readMonthName(text, end)) {
    out.b = V;
    out.bDigits = 0;
    out.monthName = 2;
  } else return false;
  if (P >= end) return false;
  const sep2 = text.charCodeAt(P);
  if (sep2 !== sep && !(sep === 32 && sep2 === 44)) return false;
  P++;
  if (sep === 32) skipSpaces(text, end);
  if (!readDigits(text, end)) return false;
  out.c = V;
  out.cDigits = D;
  out.hasDate = true;
  if (P >= end) return true;
  const t = text.charCodeAt(P);
  if (t === 84) {
    out.isoT = true;
    P++;
  } else if (t === 32 || t === 9 || t === 44) {
    P++;
    skipSpaces(text, end);
  } else return false;
  return scanTimePart(text, end, out);
}

/** Scans a time-of-day cell (hh:mm[:ss[.fff]] [AM|PM] [offset]). */
export function scanTimeOnly(text: string, start: number, end: number, out: DateTimeScan): boolean {
  P = start;
  while (end > start && (text.charCodeAt(end - 1) === 32 || text.charCodeAt(end - 1) === 9)) end--;
  skipSpaces(text, end);
  out.hasTime = false;
  out.meridiem = 0;
  out.offsetMinutes = NaN;
  out.hour = out.minute = out.second = out.millisecond = 0;
  return scanTimePart(text, end, out);
}

export type DateOrder = 'ymd' | 'dmy' | 'mdy';

/**
 * Days since 1970-01-01 of a scanned date in the given field order, or NaN when the fields do not
 * form a valid date. A four-digit first field always means year-month-day; a month name fixes the
 * month wherever it stands; two-digit years are 1970-2069.
 */
export function dayFromScan(out: DateTimeScan, order: DateOrder): number {
  let y: number;
  let m: number;
  let d: number;
  if (out.aDigits === 4) {
    y = out.a;
    m = out.b;
    d = out.c;
  } else if (out.monthName === 2) {
    d = out.a;
    m = out.b;
    y = out.c;
  } else if (out.monthName === 1) {
    m = out.a;
    d = out.b;
    y = out.c;
  } else if (order === 'mdy') {
    m = out.a;
    d = out.b;
    y = out.c;
  } else if (order === 'dmy') {
    d = out.a;
    m = out.b;
    y = out.c;
  } else {
    return NaN; // ymd order needs a four-digit year first
  }
  if (out.aDigits !== 4 && out.cDigits <= 2) y += y < 70 ? 2000 : 1900;
  if (m < 1 || m > 12 || d < 1 || d > daysInMonth(y, m)) return NaN;
  return daysFromCivil(y, m, d);
}

/** Milliseconds since midnight of a scanned time of day, or NaN when out of range. */
export function timeOfDayMs(out: DateTimeScan): number {
  let h = out.hour;
  if (out.meridiem !== 0) {
    if (h < 1 || h > 12) return NaN;
    if (h === 12) h = 0;
    if (out.meridiem === 2) h += 12;
  } else if (h === 24 && out.minute === 0 && out.second === 0 && out.millisecond === 0) {
    return MS_PER_DAY; // 24:00 is the end of the day
  }
  if (h > 23 || out.minute > 59 || out.second > 59) return NaN;
  return h * MS_PER_HOUR + out.minute * MS_PER_MINUTE + out.second * 1000 + out.millisecond;
}

/** Wall milliseconds of a scanned date-time, or NaN. */
export function wallMsFromScan(out: DateTimeScan, order: DateOrder): number {
  const day = dayFromScan(out, order);
  if (day !== day) return NaN;
  const tod = out.hasTime ? timeOfDayMs(out) : 0;
  return day * MS_PER_DAY + tod;
}

/** Wall milliseconds of a spreadsheet serial date (days since 1899-12-30, fraction = time of day). */
export function wallMsFromSerial(serialDays: number): number {
  return Math.round((serialDays - SERIAL_DAY_OF_UNIX_EPOCH) * MS_PER_DAY);
}

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

const BUCKET_MS = 15 * MS_PER_MINUTE;
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
      const before = offsetMinutesAt(timeZone, w - MS_PER_DAY);
      const after = offsetMinutesAt(timeZone, w + MS_PER_DAY);
      const okBefore = offsetMinutesAt(timeZone, w - before * MS_PER_MINUTE) === before;
      const okAfter = after !== before && offsetMinutesAt(timeZone, w - after * MS_PER_MINUTE) === after;
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
      utc = wallMs - info.offsetEarlyMinutes * MS_PER_MINUTE;
    } else if (info.kind === WallKind.Gap) {
      this.secondPass = false;
      utc = wallMs - info.offsetEarlyMinutes * MS_PER_MINUTE;
      this.stats.gapCount++;
      if (this.stats.gapLines.length < this.maxLines) this.stats.gapLines.push(line);
    } else {
      const early = wallMs - info.offsetEarlyMinutes * MS_PER_MINUTE;
      const late = wallMs - info.offsetLateMinutes * MS_PER_MINUTE;
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
      const o = this.fixedOffset * MS_PER_MINUTE;
      const start = Math.floor((utcMs + o) / MS_PER_HOUR) * MS_PER_HOUR - o;
      this.last = { startMs: start, endMs: start + MS_PER_HOUR, offsetMinutes: this.fixedOffset };
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
    const oMs = o * MS_PER_MINUTE;
    const localStart = Math.floor((utcMs + oMs) / MS_PER_HOUR) * MS_PER_HOUR;
    let start = localStart - oMs;
    let end = start + MS_PER_HOUR;
    if (offsetMinutesAt(tz, start) !== o) start = this.firstWithOffset(start, utcMs, o);
    if (offsetMinutesAt(tz, end - 1) !== o) end = this.firstWithoutOffset(utcMs, end, o);
    return { startMs: start, endMs: end, offsetMinutes: o };
  }

  /** Smallest whole minute in (lo, hi] with offset o, knowing lo has another offset and hi has o. */
  private firstWithOffset(lo: number, hi: number, o: number): number {
    let a = Math.floor(lo / MS_PER_MINUTE);
    let b = Math.ceil(hi / MS_PER_MINUTE);
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (offsetMinutesAt(this.timeZone, m * MS_PER_MINUTE) === o) b = m;
      else a = m;
    }
    return Math.min(b * MS_PER_MINUTE, hi);
  }

  /** Smallest whole minute in (lo, hi) whose offset differs from o, knowing lo has o. */
  private firstWithoutOffset(lo: number, hi: number, o: number): number {
    let a = Math.floor(lo / MS_PER_MINUTE);
    let b = Math.ceil(hi / MS_PER_MINUTE);
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (offsetMinutesAt(this.timeZone, m * MS_PER_MINUTE) === o) a = m;
      else b = m;
    }
    return b * MS_PER_MINUTE;
  }
}
