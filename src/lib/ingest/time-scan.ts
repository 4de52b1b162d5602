/**
 * Calendar text of time cells: scanning date-time text into fields, the date orders, and wall-clock
 * milliseconds of a scanned cell or of a spreadsheet serial day (see time.ts for what wall ms are).
 * Allocation-free: the scanner keeps its position in module registers and writes into a reused scan.
 */
import { DAY_MS, HOUR_MS, MINUTE_MS } from '../time';

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

export function daysInMonth(year: number, month: number): number {
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

/**
 * Scans the zone after a time from P (text is left there): Z, UTC or GMT, and/or an offset
 * ±hh, ±hhmm or ±hh:mm, then spaces. False when it is not one. Only cells with text after the time
 * of day come here, so the common cell pays no call.
 */
function scanZone(s: string, end: number, out: DateTimeScan): boolean {
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
  return true;
}

/**
 * Scans hh:mm[:ss[.fff]] [AM|PM] [Z|±hh[:mm]|UTC|GMT] from P.
 * The clock reading and the meridiem stay in this one function on purpose: it runs for every row of a
 * file, and split into a step per part (clock reading, meridiem, offset) the reader read about 10 %
 * fewer values per second (interleaved in-process measurement on a 200-tag export). The zone, which
 * only cells with text after the time reach, is its own step (scanZone).
 */
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
  if (P < end && !scanZone(s, end, out)) return false;
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
    return DAY_MS; // 24:00 is the end of the day
  }
  if (h > 23 || out.minute > 59 || out.second > 59) return NaN;
  return h * HOUR_MS + out.minute * MINUTE_MS + out.second * 1000 + out.millisecond;
}

/** Wall milliseconds of a scanned date-time, or NaN. */
export function wallMsFromScan(out: DateTimeScan, order: DateOrder): number {
  const day = dayFromScan(out, order);
  if (day !== day) return NaN;
  const tod = out.hasTime ? timeOfDayMs(out) : 0;
  return day * DAY_MS + tod;
}

/** Wall milliseconds of a spreadsheet serial date (days since 1899-12-30, fraction = time of day). */
export function wallMsFromSerial(serialDays: number): number {
  return Math.round((serialDays - SERIAL_DAY_OF_UNIX_EPOCH) * DAY_MS);
}
