/**
 * The reader's time step: the UTC instant of a record's time cell(s) as the profile describes them,
 * with a fast path for the commonest machine format. Local readings go through the LocalClock, which
 * counts the daylight-saving decisions for the read report.
 */
import type { CsvRecord } from './csv';
import { IngestError } from './errors';
import { parseNumberAt } from './numbers';
import type { LayoutProfile } from './profile';
import { dayFromScan, daysFromCivil, daysInMonth, LocalClock, newScan, scanDateTime, scanTimeOnly, timeOfDayMs, wallMsFromScan, wallMsFromSerial } from './time';
import type { DateOrder } from './time';
import { DAY_MS, HOUR_MS, MINUTE_MS } from '../time';

let fastIsoOffset = NaN;

function d2(text: string, i: number): number {
  const a = text.charCodeAt(i) - 48;
  const b = text.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
}

/**
 * Fast path for 'YYYY-MM-DD[T ]hh:mm[:ss[.fff]][Z]' (the commonest machine format): wall ms, or
 * NaN to fall back to the general scanner. Sets fastIsoOffset to 0 for 'Z', NaN otherwise.
 */
function fastIsoWallMs(text: string, s: number, e: number): number {
  const n = e - s;
  if (n !== 16 && n !== 17 && n !== 19 && n !== 20 && n !== 23 && n !== 24) return NaN;
  if (text.charCodeAt(s + 4) !== 45 || text.charCodeAt(s + 7) !== 45 || text.charCodeAt(s + 13) !== 58) return NaN;
  const sepT = text.charCodeAt(s + 10);
  if (sepT !== 84 && sepT !== 32) return NaN;
  const y1 = d2(text, s);
  const y2 = d2(text, s + 2);
  const mo = d2(text, s + 5);
  const d = d2(text, s + 8);
  const h = d2(text, s + 11);
  const mi = d2(text, s + 14);
  if (y1 < 0 || y2 < 0 || mo < 1 || mo > 12 || d < 1 || d > 31 || h < 0 || h > 23 || mi < 0 || mi > 59) return NaN;
  let p = s + 16;
  let sec = 0;
  let ms = 0;
  if (p < e && text.charCodeAt(p) === 58) {
    sec = d2(text, p + 1);
    if (sec < 0 || sec > 59) return NaN;
    p += 3;
    if (p < e && text.charCodeAt(p) === 46) {
      const a = d2(text, p + 1);
      const c = text.charCodeAt(p + 3) - 48;
      if (a < 0 || c < 0 || c > 9 || p + 4 > e) return NaN;
      ms = a * 10 + c;
      p += 4;
    }
  }
  fastIsoOffset = NaN;
  if (p < e) {
    if (p + 1 === e && (text.charCodeAt(p) === 90 || text.charCodeAt(p) === 122)) fastIsoOffset = 0;
    else return NaN;
  }
  const year = y1 * 100 + y2;
  if (d > 28 && d > daysInMonth(year, mo)) return NaN;
  return daysFromCivil(year, mo, d) * DAY_MS + h * HOUR_MS + mi * MINUTE_MS + sec * 1000 + ms;
}

/**
 * The time step for one file: a function giving the UTC ms of a record's time, or NaN when it
 * cannot be read.
 * @param p the checked profile
 * @param clock the site's local clock (notes absolute instants, resolves local ones by order)
 */
export function createTimeStep(p: LayoutProfile, clock: LocalClock): (rec: CsvRecord) => number {
  const scan = newScan();
  const scan2 = newScan();
  const order: DateOrder = p.time.dateOrder === 'ambiguous' ? 'dmy' : p.time.dateOrder;
  // one time column, or a date column and a time-of-day column (c1)
  const [c0, c1] = p.time.columns;
  if (c0 === undefined) throw new IngestError('INVALID_PROFILE', 'The layout names no time column.');
  const kind = p.time.kind;
  const decCode = p.decimalMark.charCodeAt(0);

  /** UTC ms of a scanned (non-fast) text time, or NaN. */
  function textTime(rec: CsvRecord, text: string, e: number): number {
    if (!scanDateTime(text, 0, e, scan)) return NaN;
    let wall: number;
    let offset = scan.offsetMinutes;
    if (c1 !== undefined) {
      const t1 = c1 < rec.count ? rec.fields[c1] : undefined;
      if (t1 === undefined) return NaN;
      if (scan.hasTime || !scanTimeOnly(t1, 0, t1.length, scan2)) return NaN;
      const day = dayFromScan(scan, order);
      const tod = timeOfDayMs(scan2);
      wall = day * DAY_MS + tod;
      offset = scan2.offsetMinutes;
    } else {
      wall = wallMsFromScan(scan, order);
    }
    if (wall !== wall) return NaN;
    if (offset === offset) {
      const utc = wall - offset * MINUTE_MS;
      clock.noteAbsolute(utc);
      return utc;
    }
    return clock.toUtc(wall, rec.line);
  }

  return function timeOf(rec: CsvRecord): number {
    const text = c0 < rec.count ? rec.fields[c0] : undefined;
    if (text === undefined) return NaN;
    const e = text.length;
    if (kind === 'text') {
      if (c1 === undefined) {
        const wall = fastIsoWallMs(text, 0, e);
        if (wall === wall) {
          const offset = fastIsoOffset;
          if (offset === offset) {
            const utc = wall - offset * MINUTE_MS;
            clock.noteAbsolute(utc);
            return utc;
          }
          return clock.toUtc(wall, rec.line);
        }
      }
      return textTime(rec, text, e);
    }
    const v = parseNumberAt(text, 0, e, kind === 'serial' ? decCode : 46, -1);
    if (v !== v) return NaN;
    if (kind === 'unix-s') return Math.round(v * 1000);
    if (kind === 'unix-ms') return Math.round(v);
    return clock.toUtc(wallMsFromSerial(v), rec.line);
  };
}
