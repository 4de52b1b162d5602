/**
 * The sniffer's time steps: which column(s) hold the time, and how it is written (calendar text with
 * its date order, clock and zone, or Unix seconds / milliseconds / spreadsheet serial days). Each
 * step returns its notes, questions and confidence.
 */
import { IngestError } from './errors';
import type { LayoutQuestion, TimeColumns } from './profile';
import { newScan, scanDateTime, scanTimeOnly, wallMsFromScan } from './time';
import type { DateTimeScan } from './time';
import { parseNumber } from './numbers';
import { TIME_NAMES } from './sniff-cells';
import type { ColumnStats, Rec, Separator } from './sniff-cells';

/** What a sniffing step found besides its decision. */
export interface SniffNotes {
  notes: string[];
  questions: LayoutQuestion[];
  /** Factor on the profile's confidence. */
  confidence: number;
}

export const noNotes = (): SniffNotes => ({ notes: [], questions: [], confidence: 1 });

type NumericTimeKind = 'unix-s' | 'unix-ms' | 'serial';

export interface TimeColumnFinding extends SniffNotes {
  timeCols: number[];
  numericKind: NumericTimeKind | null;
  /** Header records as wide as the data (give or take one), and which of them names the time. */
  candidates: Rec[];
  keywordRow: number;
}

function numericTimeKind(cells: string[], decimalMark: '.' | ','): NumericTimeKind | null {
  const values = cells.map((c) => parseNumber(c, decimalMark, ''));
  if (values.length === 0 || values.some((v) => !Number.isFinite(v))) return null;
  let previous = -Infinity;
  for (const v of values) {
    if (v < previous) return null;
    previous = v;
  }
  const sorted = [...values].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)];
  if (median === undefined) return null;
  if (median >= 3e8 && median <= 4.2e9) return 'unix-s';
  if (median >= 3e11 && median <= 4.2e12) return 'unix-ms';
  if (median >= 20000 && median <= 80000) return 'serial';
  return null;
}

/**
 * Finds the time column(s): date-time text (a date column followed by a time-of-day column counts
 * as one time), else increasing numbers of a time's size. Throws NO_TIME_COLUMN when none.
 */
export function findTimeColumns(header: Rec[], data: Rec[], stats: ColumnStats[], m: number, sep: Separator): TimeColumnFinding {
  const found = noNotes();
  const candidates = header.filter((r) => Math.abs(r.fields.length - m) <= 1);
  const keywordRow = candidates.findIndex((r) => r.fields.some((f) => TIME_NAMES.test(f.trim())));
  const keywordCol = candidates[keywordRow]?.fields.findIndex((f) => TIME_NAMES.test(f.trim())) ?? -1;
  const textTimeCols: number[] = [];
  stats.slice(0, m).forEach((s, j) => {
    if (s.nonBlank > 0 && s.dateTime >= 0.9 * s.nonBlank) textTimeCols.push(j);
  });
  const base = { candidates, keywordRow, numericKind: null };
  const firstTextCol = textTimeCols[0];
  if (firstTextCol !== undefined) {
    const j = textTimeCols.includes(keywordCol) ? keywordCol : firstTextCol;
    const s = stats[j];
    const next = j + 1 < m ? stats[j + 1] : undefined;
    if (s !== undefined && s.dateOnly >= 0.9 * s.nonBlank && next !== undefined && next.nonBlank > 0 && next.timeOnly >= 0.9 * next.nonBlank) {
      found.notes.push(`Date in column ${j + 1} and time of day in column ${j + 2}.`);
      return { ...found, ...base, timeCols: [j, j + 1] };
    }
    found.notes.push(`Time in column ${j + 1}.`);
    return { ...found, ...base, timeCols: [j] };
  }
  const j = keywordCol >= 0 ? keywordCol : 0;
  const cells = data.map((r) => (r.fields[j] ?? '').trim()).filter((f) => f.length > 0);
  const numericKind = numericTimeKind(cells, '.') ?? (sep === ';' ? numericTimeKind(cells, ',') : null);
  if (!numericKind) {
    throw new IngestError(
      'NO_TIME_COLUMN',
      'No column holds dates and times (calendar text, Unix seconds or milliseconds, or spreadsheet serial dates). ' +
        'Include the timestamp column in the export.',
    );
  }
  const what = numericKind === 'unix-s' ? 'Unix seconds' : numericKind === 'unix-ms' ? 'Unix milliseconds' : 'spreadsheet serial days';
  found.notes.push(`Time in column ${j + 1} as ${what} (increasing numbers of that size).`);
  if (keywordCol < 0) {
    found.confidence *= 0.7;
    found.questions.push({
      field: 'time.kind',
      message: `Column ${j + 1} has no time-like name but holds increasing numbers read as ${what}; confirm.`,
      choices: ['unix-s', 'unix-ms', 'serial'],
      blocking: false,
    });
  }
  return { ...found, ...base, timeCols: [j], numericKind };
}

/** How the time is written: numeric kinds as found, calendar text decided from the data. */
export function decideTimeFormat(timeCols: number[], numericKind: NumericTimeKind | null, data: Rec[]): SniffNotes & { time: TimeColumns } {
  if (numericKind) {
    const col = timeCols[0];
    const cell = (col === undefined ? '' : (data[0]?.fields[col] ?? '')).trim();
    const zone = numericKind === 'serial' ? 'local' : 'explicit';
    return { ...noNotes(), time: { columns: timeCols, kind: numericKind, dateOrder: 'ymd', clock: '24h', zone, example: cell } };
  }
  return decideTextTime(timeCols, data);
}

/** The scans of the sample's time cells (date and time-of-day columns joined), and the first as written. */
function scanTimes(columns: number[], data: Rec[]): { scans: DateTimeScan[]; example: string } {
  const scans: DateTimeScan[] = [];
  let example = '';
  const [dateCol, timeCol] = columns;
  if (dateCol === undefined) return { scans, example };
  for (const r of data) {
    const cell = (r.fields[dateCol] ?? '').trim();
    const s = newScan();
    if (!scanDateTime(cell, 0, cell.length, s)) continue;
    if (timeCol !== undefined) {
      const tcell = (r.fields[timeCol] ?? '').trim();
      const t = newScan();
      if (!scanTimeOnly(tcell, 0, tcell.length, t)) continue;
      s.hasTime = true;
      s.hour = t.hour;
      s.minute = t.minute;
      s.second = t.second;
      s.millisecond = t.millisecond;
      s.meridiem = t.meridiem;
      s.offsetMinutes = t.offsetMinutes;
      if (!example) example = `${cell} ${tcell}`;
    } else if (!example) example = cell;
    scans.push(s);
  }
  return { scans, example };
}

function decideTextTime(columns: number[], data: Rec[]): SniffNotes & { time: TimeColumns } {
  const { scans, example } = scanTimes(columns, data);
  const found = decideDateOrder(scans, example);
  const { notes } = found;
  const dateOrder = found.dateOrder;
  const clock: TimeColumns['clock'] = scans.some((s) => s.meridiem !== 0) ? '12h' : '24h';
  if (clock === '12h') notes.push('Times use a 12-hour clock with AM/PM.');
  const withOffset = scans.filter((s) => s.offsetMinutes === s.offsetMinutes).length;
  const zone: TimeColumns['zone'] = withOffset === 0 ? 'local' : withOffset === scans.length ? 'explicit' : 'mixed';
  if (zone === 'explicit') notes.push('Every time carries Z or a UTC offset: read as absolute instants.');
  else if (zone === 'local') notes.push("Times carry no UTC offset: read as local time in the site's time zone.");
  else {
    notes.push(`${withOffset} of ${scans.length} times carry a UTC offset; the others are read as local time.`);
    found.confidence *= 0.8;
  }
  if (dateOrder !== 'ambiguous') {
    const bad = scans.filter((s) => wallMsFromScan(s, dateOrder) !== wallMsFromScan(s, dateOrder)).length;
    if (bad > 0) {
      found.confidence *= 0.8;
      notes.push(`${bad} time cell(s) in the sample are not valid calendar dates or clock times.`);
    }
  }
  return { notes, questions: found.questions, confidence: found.confidence, time: { columns, kind: 'text', dateOrder, clock, zone, example } };
}

/** The date order from the evidence of the scans; a question when it contradicts itself or is missing. */
function decideDateOrder(scans: DateTimeScan[], example: string): SniffNotes & { dateOrder: TimeColumns['dateOrder'] } {
  const found = noNotes();
  const decided = (dateOrder: TimeColumns['dateOrder'], note: string) => {
    found.notes.push(note);
    return { ...found, dateOrder };
  };
  if (scans.every((s) => s.aDigits === 4)) return decided('ymd', 'Dates start with a four-digit year (year-month-day).');
  if (scans.some((s) => s.monthName === 2)) return decided('dmy', 'Dates carry the month as a name after the day.');
  if (scans.some((s) => s.monthName === 1)) return decided('mdy', 'Dates carry the month as a name before the day.');
  const dayFirst = scans.filter((s) => s.a > 12 && s.a <= 31).length;
  const monthFirst = scans.filter((s) => s.b > 12 && s.b <= 31).length;
  if (dayFirst > 0 && monthFirst === 0) return decided('dmy', `Day first: ${dayFirst} date(s) have a first field above 12.`);
  if (monthFirst > 0 && dayFirst === 0) return decided('mdy', `Month first: ${monthFirst} date(s) have a second field above 12.`);
  found.confidence *= 0.5;
  if (dayFirst > 0 && monthFirst > 0) {
    const dateOrder = dayFirst >= monthFirst ? 'dmy' : 'mdy';
    found.questions.push({
      field: 'time.dateOrder',
      message:
        `The dates contradict each other: ${dayFirst} read only day-first and ${monthFirst} only month-first. ` +
        `Read as ${dateOrder === 'dmy' ? 'day-first' : 'month-first'}; confirm, or correct the export.`,
      choices: ['dmy', 'mdy'],
      blocking: false,
    });
    return { ...found, dateOrder };
  }
  const dots = scans.some((s) => s.dateSep === 46);
  found.questions.push({
    field: 'time.dateOrder',
    message:
      `Every date in the sample (for example ${example}) reads both day-first and month-first, because no field is above 12. ` +
      `Choose the order the export uses${dots ? ' (dates written with dots are usually day-first)' : ''}.`,
    choices: ['dmy', 'mdy'],
    blocking: true,
  });
  return { ...found, dateOrder: 'ambiguous' };
}
