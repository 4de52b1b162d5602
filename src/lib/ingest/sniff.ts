/**
 * Layout sniffing: reads the first part of an export (about 64 KiB of decoded text) and decides
 * separator, decimal mark, thousands separator, header rows (names, units, descriptions), layout
 * (wide or long), the time column(s) and their format. Everything it cannot decide from evidence
 * becomes a question in the profile instead of a silent guess.
 */
import { IngestError } from './errors';
import { fnv1a64Hex, normaliseHeaderCell } from './fingerprint';
import { LayoutProfileSchema, SEPARATORS } from './profile';
import type { LayoutProfile, LayoutQuestion, QualityPairs, TimeColumns, WideColumn } from './profile';
import { looksLikeQuality } from './quality';
import { decideColumnNumbers, holdsSeparator } from './column-numbers';
import { detectQualityColumns } from './quality-columns';
import { newScan, scanDateTime, scanTimeOnly, wallMsFromScan } from './time';
import type { DateTimeScan } from './time';
import { tokenizeAll } from './csv';
import { parseNumber } from './numbers';

export interface SniffOptions {
  /** True when the text is the whole file, so its last line is complete. Default: true when the
   *  text is shorter than 60 000 characters. Pass it explicitly from a stream. */
  complete?: boolean;
  /** Records inspected at most; default 400. */
  maxRecords?: number;
  /** The decoder's encoding decision, copied into the profile. */
  encoding?: string | null;
}

type Separator = (typeof SEPARATORS)[number];

const TIME_NAMES = /^(time|timestamp|time ?stamp|date|datetime|date ?time|date\/time|ts|zeit|zeitstempel|datum|uhrzeit|local ?time|utc|time ?\(utc\)|sample ?time)$/i;
const TAG_NAMES = /^(tag|tags|tag ?name|tag_name|tag ?id|name|point|point ?name|signal|item|item ?id|variable|channel|sensor|messstelle)$/i;
const VALUE_NAMES = /^(value|val|wert|messwert|reading|pv|avg|average|mean|measurement)$/i;
const QUALITY_NAMES = /^(quality|q|qual|status|quality ?code|qualit[äa]t)$/i;
const UNIT_NAMES = /^(unit|units|eu|engineering ?units?|einheit)$/i;

const UNIT_RE =
  /^(deg ?[CFK]|° ?[CF]|[KC]|bar ?\(?[ga]\)?|barg|bara|bar|mbar|[kMG]?Pa ?\(?[ga]\)?|[kMG]?Pa|psi[ga]?|t\/h|kg\/[sh]|kg\/min|t\/d|N?m3\/[hs]|N?m³\/[hs]|Sm3\/h|l\/(s|min|h)|[kMG]?W|[kMG]?Wh|[kMG]?VA|[kMG]?var|MJ|GJ|kJ\/kg|%|% ?O2|ppm|ppmv|rpm|1\/min|min-1|kA|A|V|kV|Hz|mg\/N?m3|mm|m|s|h|min|pH|[mµu]S\/cm|cos ?phi|-)$/i;

/** True when a cell looks like an engineering unit ('degC', 'bar(g)', 't/h', 'kW', '%', '[m³/h]'). */
export function isUnitLike(cell: string): boolean {
  let t = cell.trim();
  if (t.length === 0 || t.length > 16) return false;
  if ((t.startsWith('[') && t.endsWith(']')) || (t.startsWith('(') && t.endsWith(')'))) t = t.slice(1, -1).trim();
  return UNIT_RE.test(t);
}

/** Splits 'B1.TT-102 [degC]' into name and unit when the bracketed part is a unit. */
function splitNameUnit(name: string): { tag: string; unit: string | null } {
  const m = /^(.*\S)\s*[[(]([^[\]()]{1,16})[\])]\s*$/.exec(name);
  if (m && isUnitLike(m[2]) && (m[2].length > 1 || /[^A-Za-z]/.test(m[2]))) return { tag: m[1].trim(), unit: m[2].trim() };
  return { tag: name.trim(), unit: null };
}

const NUMERIC_LIKE = /^[+-]?[\d.,'\u00a0\u202f ]*\d[\d.,'\u00a0\u202f ]*(?:[eE][+-]?\d+)?$/;

function isNumericLike(cell: string): boolean {
  const t = cell.trim();
  return t.length > 0 && NUMERIC_LIKE.test(t) && !/\s{2,}/.test(t);
}

const scanA = newScan();

function isDateTimeText(cell: string): boolean {
  return scanDateTime(cell, 0, cell.length, scanA);
}

function isBlank(cell: string): boolean {
  return cell.trim().length === 0;
}

interface Rec {
  fields: string[];
  line: number;
}

function modeCount(records: Rec[]): number {
  const counts = new Map<number, number>();
  for (const r of records) counts.set(r.fields.length, (counts.get(r.fields.length) ?? 0) + 1);
  let best = 0;
  let bestN = -1;
  for (const [c, n] of counts) if (n > bestN || (n === bestN && c > best)) [best, bestN] = [c, n];
  return best;
}

function cleanCell(cell: string): boolean {
  const t = cell.trim();
  if (t.length === 0 || isNumericLike(t) || isDateTimeText(t) || scanTimeOnly(t, 0, t.length, scanA)) return true;
  return !/\d/.test(t) || !/[,;|\t]/.test(t);
}

function chooseSeparator(text: string, complete: boolean, maxRecords: number): { sep: Separator; score: number; records: Rec[] } {
  let best: { sep: Separator; score: number; m: number; records: Rec[] } | null = null;
  for (const sep of SEPARATORS) {
    const records = tokenizeAll(text, sep, { maxRecords, final: complete }).filter((r) => r.fields.some((f) => !isBlank(f)));
    if (records.length === 0) continue;
    const m = modeCount(records);
    let score = 0;
    if (m >= 2) {
      const consistent = records.filter((r) => r.fields.length === m);
      const consistency = consistent.length / records.length;
      let cells = 0;
      let clean = 0;
      for (const r of consistent.slice(-50)) {
        for (const f of r.fields) {
          cells++;
          if (cleanCell(f)) clean++;
        }
      }
      score = consistency * (0.5 + (0.5 * clean) / Math.max(1, cells));
    }
    if (!best || score > best.score + 1e-9 || (Math.abs(score - best.score) <= 1e-9 && m > best.m)) best = { sep, score, m, records };
  }
  if (!best) {
    throw new IngestError('EMPTY_FILE', 'The file holds no text lines. Export the data again and upload the new file.');
  }
  if (best.score === 0) {
    // one column only: no separator found
    throw new IngestError(
      'NO_VALUE_COLUMNS',
      'No separator (comma, semicolon, tab or bar) splits the lines into columns, so the file has no value columns. ' +
        'Check that the export writes one column per tag or tag, time and value columns.',
    );
  }
  return best;
}

function isDataLike(r: Rec): boolean {
  let nonBlank = 0;
  let hits = 0;
  for (const f of r.fields) {
    if (isBlank(f)) continue;
    nonBlank++;
    if (isNumericLike(f) || isDateTimeText(f)) hits++;
  }
  return hits >= 1 && hits >= 0.5 * nonBlank;
}

interface ColumnStats {
  nonBlank: number;
  numeric: number;
  dateTime: number;
  dateOnly: number;
  timeOnly: number;
  identifier: number;
  quality: number;
  distinct: Set<string>;
}

function columnStats(data: Rec[], m: number): ColumnStats[] {
  const stats: ColumnStats[] = [];
  for (let j = 0; j < m; j++) {
    stats.push({ nonBlank: 0, numeric: 0, dateTime: 0, dateOnly: 0, timeOnly: 0, identifier: 0, quality: 0, distinct: new Set() });
  }
  for (const r of data) {
    for (let j = 0; j < m; j++) {
      const f = (r.fields[j] ?? '').trim();
      if (f.length === 0) continue;
      const s = stats[j];
      s.nonBlank++;
      if (isNumericLike(f)) s.numeric++;
      if (scanDateTime(f, 0, f.length, scanA)) {
        s.dateTime++;
        if (!scanA.hasTime) s.dateOnly++;
      } else if (scanTimeOnly(f, 0, f.length, scanA)) s.timeOnly++;
      if (!isNumericLike(f) && /^[^\s]+$/.test(f) && /[\d._\-:/]/.test(f)) s.identifier++;
      if (looksLikeQuality(f)) s.quality++;
      if (s.distinct.size < 200) s.distinct.add(f);
    }
  }
  return stats;
}

interface TimeDecision {
  time: TimeColumns;
  questions: LayoutQuestion[];
  notes: string[];
  confidence: number;
}

function numericTimeKind(cells: string[], decimalMark: '.' | ','): 'unix-s' | 'unix-ms' | 'serial' | null {
  const values = cells.map((c) => parseNumber(c, decimalMark, ''));
  if (values.length === 0 || values.some((v) => !Number.isFinite(v))) return null;
  for (let i = 1; i < values.length; i++) if (values[i] < values[i - 1]) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)];
  if (median >= 3e8 && median <= 4.2e9) return 'unix-s';
  if (median >= 3e11 && median <= 4.2e12) return 'unix-ms';
  if (median >= 20000 && median <= 80000) return 'serial';
  return null;
}

function decideTextTime(columns: number[], data: Rec[]): TimeDecision {
  const questions: LayoutQuestion[] = [];
  const notes: string[] = [];
  let confidence = 1;
  const scans: DateTimeScan[] = [];
  let example = '';
  for (const r of data) {
    const cell = (r.fields[columns[0]] ?? '').trim();
    const s = newScan();
    if (!scanDateTime(cell, 0, cell.length, s)) continue;
    if (columns.length === 2) {
      const tcell = (r.fields[columns[1]] ?? '').trim();
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
  let dateOrder: TimeColumns['dateOrder'];
  if (scans.every((s) => s.aDigits === 4)) {
    dateOrder = 'ymd';
    notes.push('Dates start with a four-digit year (year-month-day).');
  } else if (scans.some((s) => s.monthName === 2)) {
    dateOrder = 'dmy';
    notes.push('Dates carry the month as a name after the day.');
  } else if (scans.some((s) => s.monthName === 1)) {
    dateOrder = 'mdy';
    notes.push('Dates carry the month as a name before the day.');
  } else {
    const dayFirst = scans.filter((s) => s.a > 12 && s.a <= 31).length;
    const monthFirst = scans.filter((s) => s.b > 12 && s.b <= 31).length;
    if (dayFirst > 0 && monthFirst === 0) {
      dateOrder = 'dmy';
      notes.push(`Day first: ${dayFirst} date(s) have a first field above 12.`);
    } else if (monthFirst > 0 && dayFirst === 0) {
      dateOrder = 'mdy';
      notes.push(`Month first: ${monthFirst} date(s) have a second field above 12.`);
    } else if (dayFirst > 0 && monthFirst > 0) {
      dateOrder = dayFirst >= monthFirst ? 'dmy' : 'mdy';
      confidence *= 0.5;
      questions.push({
        field: 'time.dateOrder',
        message:
          `The dates contradict each other: ${dayFirst} read only day-first and ${monthFirst} only month-first. ` +
          `Read as ${dateOrder === 'dmy' ? 'day-first' : 'month-first'}; confirm, or correct the export.`,
        choices: ['dmy', 'mdy'],
        blocking: false,
      });
    } else {
      dateOrder = 'ambiguous';
      confidence *= 0.5;
      const dots = scans.some((s) => s.dateSep === 46);
      questions.push({
        field: 'time.dateOrder',
        message:
          `Every date in the sample (for example ${example}) reads both day-first and month-first, because no field is above 12. ` +
          `Choose the order the export uses${dots ? ' (dates written with dots are usually day-first)' : ''}.`,
        choices: ['dmy', 'mdy'],
        blocking: true,
      });
    }
  }
  const clock: TimeColumns['clock'] = scans.some((s) => s.meridiem !== 0) ? '12h' : '24h';
  if (clock === '12h') notes.push('Times use a 12-hour clock with AM/PM.');
  const withOffset = scans.filter((s) => s.offsetMinutes === s.offsetMinutes).length;
  const zone: TimeColumns['zone'] = withOffset === 0 ? 'local' : withOffset === scans.length ? 'explicit' : 'mixed';
  if (zone === 'explicit') notes.push('Every time carries Z or a UTC offset: read as absolute instants.');
  else if (zone === 'local') notes.push("Times carry no UTC offset: read as local time in the site's time zone.");
  else {
    notes.push(`${withOffset} of ${scans.length} times carry a UTC offset; the others are read as local time.`);
    confidence *= 0.8;
  }
  if (dateOrder !== 'ambiguous') {
    const bad = scans.filter((s) => wallMsFromScan(s, dateOrder as 'ymd' | 'dmy' | 'mdy') !== wallMsFromScan(s, dateOrder as 'ymd' | 'dmy' | 'mdy')).length;
    if (bad > 0) {
      confidence *= 0.8;
      notes.push(`${bad} time cell(s) in the sample are not valid calendar dates or clock times.`);
    }
  }
  return { time: { columns, kind: 'text', dateOrder, clock, zone, example }, questions, notes, confidence };
}

function decimalEvidence(cells: string[], sep: Separator): {
  decimalMark: '.' | ',';
  thousandsSeparator: '' | ',' | '.' | ' ' | "'";
  note: string;
  question: LayoutQuestion | null;
  confidence: number;
} {
  let point = 0;
  let comma = 0;
  let comma3 = 0;
  let point3 = 0;
  let thComma = 0;
  let thPoint = 0;
  let thSpace = 0;
  let thApos = 0;
  for (const raw of cells) {
    const t = raw.trim().replace(/^[+-]/, '').replace(/[eE][+-]?\d+$/, '');
    if (!/\d/.test(t)) continue;
    const hasP = t.includes('.');
    const hasC = t.includes(',');
    if (/\d[ \u00a0\u202f]\d{3}(\D|$)/.test(t)) thSpace++;
    if (/\d'\d{3}(\D|$)/.test(t)) thApos++;
    if (hasP && hasC) {
      if (t.lastIndexOf('.') > t.lastIndexOf(',')) {
        point++;
        thComma++;
      } else {
        comma++;
        thPoint++;
      }
      continue;
    }
    if (hasC) {
      const parts = t.split(',');
      if (parts.length > 2) thComma++;
      else if (parts[1].length === 3 && parts[0].length >= 1 && parts[0] !== '0') comma3++;
      else comma++;
    } else if (hasP) {
      const parts = t.split('.');
      if (parts.length > 2) thPoint++;
      else if (parts[1].length === 3 && parts[0].length >= 1 && parts[0] !== '0') point3++;
      else point++;
    }
  }
  let decimalMark: '.' | ',';
  let note: string;
  let question: LayoutQuestion | null = null;
  let confidence = 1;
  if (comma > 0 && point === 0) {
    decimalMark = ',';
    note = `Decimal comma: ${comma} number(s) such as '12,5' only read one way.`;
  } else if (point > 0 && comma === 0) {
    decimalMark = '.';
    note = `Decimal point: ${point} number(s) such as '12.5' only read one way.`;
  } else if (point > 0 && comma > 0) {
    decimalMark = point >= comma ? '.' : ',';
    confidence = 0.5;
    note = `Numbers disagree: ${point} read with a decimal point, ${comma} with a decimal comma.`;
    question = {
      field: 'decimalMark',
      message: `${note} Read with a decimal ${decimalMark === '.' ? 'point' : 'comma'}; confirm which one the export uses.`,
      choices: ['.', ','],
      blocking: false,
    };
  } else if (comma3 > 0 || point3 > 0) {
    decimalMark = sep === ';' || comma3 > 0 ? ',' : '.';
    if (sep === ',' && comma3 > 0) decimalMark = '.';
    confidence = 0.5;
    note = `Every number with a mark has exactly three digits after it (such as '1,234'), which reads as a decimal or a thousands group.`;
    question = {
      field: 'decimalMark',
      message: `${note} Read with a decimal ${decimalMark === '.' ? 'point' : 'comma'}; confirm.`,
      choices: ['.', ','],
      blocking: false,
    };
  } else {
    decimalMark = sep === ';' ? ',' : '.';
    confidence = 0.9;
    note = `No number in the sample has a decimal mark; assumed a decimal ${decimalMark === '.' ? 'point' : 'comma'} (usual with this separator).`;
  }
  let thousandsSeparator: '' | ',' | '.' | ' ' | "'" = '';
  if (decimalMark === '.' && (thComma > 0 || (comma3 > 0 && !question))) thousandsSeparator = ',';
  else if (decimalMark === ',' && (thPoint > 0 || (point3 > 0 && !question))) thousandsSeparator = '.';
  else if (thSpace > 0) thousandsSeparator = ' ';
  else if (thApos > 0) thousandsSeparator = "'";
  if (thousandsSeparator === sep) thousandsSeparator = '';
  if (thousandsSeparator) note += ` Thousands separator ${JSON.stringify(thousandsSeparator)}.`;
  return { decimalMark, thousandsSeparator, note, question, confidence };
}

/**
 * Decides the layout of an export from its first part.
 * @param sampleText decoded text from the start of the file (about 64 KiB)
 * @throws IngestError EMPTY_FILE, HEADER_ONLY, NO_TIME_COLUMN, NO_VALUE_COLUMNS, DUPLICATE_HEADERS,
 *   RECORD_TOO_LONG (no complete line in the sample)
 */
export function sniffLayout(sampleText: string, options: SniffOptions = {}): LayoutProfile {
  let text = sampleText.charCodeAt(0) === 0xfeff ? sampleText.slice(1) : sampleText;
  if (text.trim().length === 0) {
    throw new IngestError('EMPTY_FILE', 'The file is empty or holds only blank lines. Export the data again and upload the new file.');
  }
  const complete = options.complete ?? text.length < 60000;
  const maxRecords = options.maxRecords ?? 400;
  if (!complete && !/[\r\n]/.test(text)) {
    throw new IngestError(
      'RECORD_TOO_LONG',
      `The first ${text.length} characters hold no line break, so the file is not a line-by-line CSV export (or its first line is enormous). ` +
        'Check the export settings.',
      { sampleCharacters: text.length },
      1,
    );
  }
  let droppedTail = 0;
  if (!complete) {
    // drop a possibly cut last line
    const cut = Math.max(text.lastIndexOf('\n'), text.lastIndexOf('\r'));
    droppedTail = text.length - (cut + 1);
    text = text.slice(0, cut + 1);
  }
  const notes: string[] = [];
  const questions: LayoutQuestion[] = [];
  let confidence = 1;

  const { sep, score, records } = chooseSeparator(text, true, maxRecords);
  notes.push(`Separator ${JSON.stringify(sep)} splits the lines most consistently (score ${score.toFixed(2)}).`);
  if (score < 0.9) confidence *= 0.8;
  const m = modeCount(records);

  // first data record: data-like and full width, with the next two records holding a date-time in
  // the same column (or, for numeric times, data-like too)
  let dataStart = -1;
  for (let i = 0; i < records.length; i++) {
    if (records[i].fields.length !== m || !isDataLike(records[i])) continue;
    const dateCol = records[i].fields.findIndex((f) => isDateTimeText(f.trim()));
    let ok = true;
    for (let k = i + 1; k < Math.min(records.length, i + 3); k++) {
      const next = records[k];
      if (dateCol >= 0 ? !isDateTimeText((next.fields[dateCol] ?? '').trim()) : !isDataLike(next)) ok = false;
    }
    if (ok) {
      dataStart = i;
      break;
    }
  }
  if (dataStart < 0) {
    noDataRowReason(text, records, droppedTail, complete);
    throw new IngestError(
      'HEADER_ONLY',
      `The file has ${records.length} header line(s) but no data rows (a data row holds a time and numbers). ` +
        'Export a time range that contains data.',
      { headerLines: records.length },
    );
  }
  const header = records.slice(0, dataStart);
  const data = records.slice(dataStart).filter((r) => r.fields.length >= m - 1);
  const stats = columnStats(data, m);
  const headerRows = header.map((r) => r.fields.map((f) => f.trim()));

  // --- time column(s)
  let timeCols: number[] | null = null;
  let numericKind: 'unix-s' | 'unix-ms' | 'serial' | null = null;
  const candidates = header.filter((r) => Math.abs(r.fields.length - m) <= 1);
  const keywordRow = candidates.findIndex((r) => r.fields.some((f) => TIME_NAMES.test(f.trim())));
  const keywordCol = keywordRow >= 0 ? candidates[keywordRow].fields.findIndex((f) => TIME_NAMES.test(f.trim())) : -1;
  const textTimeCols: number[] = [];
  for (let j = 0; j < m; j++) {
    const s = stats[j];
    if (s.nonBlank > 0 && s.dateTime >= 0.9 * s.nonBlank) textTimeCols.push(j);
  }
  if (textTimeCols.length > 0) {
    const j = textTimeCols.includes(keywordCol) ? keywordCol : textTimeCols[0];
    const s = stats[j];
    if (s.dateOnly >= 0.9 * s.nonBlank && j + 1 < m && stats[j + 1].nonBlank > 0 && stats[j + 1].timeOnly >= 0.9 * stats[j + 1].nonBlank) {
      timeCols = [j, j + 1];
      notes.push(`Date in column ${j + 1} and time of day in column ${j + 2}.`);
    } else {
      timeCols = [j];
      notes.push(`Time in column ${j + 1}.`);
    }
  } else {
    const j = keywordCol >= 0 ? keywordCol : 0;
    const cells = data.map((r) => (r.fields[j] ?? '').trim()).filter((f) => f.length > 0);
    numericKind = numericTimeKind(cells, '.') ?? (sep === ';' ? numericTimeKind(cells, ',') : null);
    if (numericKind) {
      timeCols = [j];
      const what = numericKind === 'unix-s' ? 'Unix seconds' : numericKind === 'unix-ms' ? 'Unix milliseconds' : 'spreadsheet serial days';
      notes.push(`Time in column ${j + 1} as ${what} (increasing numbers of that size).`);
      if (keywordCol < 0) {
        confidence *= 0.7;
        questions.push({
          field: 'time.kind',
          message: `Column ${j + 1} has no time-like name but holds increasing numbers read as ${what}; confirm.`,
          choices: ['unix-s', 'unix-ms', 'serial'],
          blocking: false,
        });
      }
    }
  }
  if (!timeCols) {
    throw new IngestError(
      'NO_TIME_COLUMN',
      'No column holds dates and times (calendar text, Unix seconds or milliseconds, or spreadsheet serial dates). ' +
        'Include the timestamp column in the export.',
    );
  }

  // --- header rows: names, units, descriptions
  const isTimeCol = (j: number) => timeCols!.includes(j);
  const valueIdx = [...Array(m).keys()].filter((j) => !isTimeCol(j));
  const unitScore = (r: Rec) => {
    const cells = valueIdx.map((j) => r.fields[j] ?? '').filter((f) => !isBlank(f));
    return cells.length === 0 ? 0 : cells.filter(isUnitLike).length / cells.length;
  };
  // names row: the one naming the time column, else the first full, unique, non-unit row; rows
  // before it are preamble, units and descriptions are looked for after it
  let tagRec: Rec | null = keywordRow >= 0 ? candidates[keywordRow] : null;
  if (!tagRec) {
    for (const r of candidates) {
      if (unitScore(r) >= 0.6) continue;
      const names = valueIdx.map((j) => (r.fields[j] ?? '').trim()).filter((f) => f.length > 0);
      if (names.length >= 0.8 * valueIdx.length && new Set(names).size === names.length) {
        tagRec = r;
        break;
      }
    }
  }
  const after = tagRec ? candidates.slice(candidates.indexOf(tagRec) + 1) : candidates;
  let unitRec: Rec | null = null;
  for (const r of after) if (unitScore(r) >= 0.6 && (!unitRec || unitScore(r) > unitScore(unitRec))) unitRec = r;
  let descRec: Rec | null = null;
  for (const r of after) {
    if (r === unitRec) continue;
    const filled = valueIdx.filter((j) => !isBlank(r.fields[j] ?? '')).length;
    if (filled >= 0.5 * valueIdx.length) {
      descRec = r;
      break;
    }
  }
  const rowIndex = (r: Rec | null) => (r ? header.indexOf(r) : null);
  if (unitRec) notes.push(`Units in header line ${unitRec.line}.`);
  if (descRec) notes.push(`Descriptions in header line ${descRec.line}.`);

  const columnNames: string[] = [];
  for (let j = 0; j < m; j++) {
    const n = tagRec ? (tagRec.fields[j] ?? '').trim() : '';
    columnNames.push(n.length > 0 ? n : `column ${j + 1}`);
  }
  if (tagRec) {
    // duplicated names are fatal: samples could not be told apart
    const seen = new Map<string, number[]>();
    tagRec.fields.forEach((f, j) => {
      const n = f.trim();
      if (n.length === 0) return;
      seen.set(n, [...(seen.get(n) ?? []), j + 1]);
    });
    const dups = [...seen].filter(([, cols]) => cols.length > 1);
    if (dups.length > 0) {
      throw new IngestError(
        'DUPLICATE_HEADERS',
        `Column names appear more than once: ${dups.map(([n, cols]) => `'${n}' (columns ${cols.join(', ')})`).join('; ')}. ` +
          'Samples of such columns cannot be told apart; export each tag once.',
        { duplicates: Object.fromEntries(dups) },
        tagRec.line,
      );
    }
    notes.push(`Names in header line ${tagRec.line}.`);
  } else {
    confidence *= 0.5;
    questions.push({
      field: 'columnNames',
      message: 'No header line with column names was found; columns are named by position. Name them or export with a header.',
      choices: [],
      blocking: false,
    });
  }

  // --- layout
  const names = tagRec ? tagRec.fields.map((f) => f.trim()) : [];
  let layout: 'wide' | 'long' = 'wide';
  let tagColumn = names.findIndex((n) => TAG_NAMES.test(n));
  let valueColumn = names.findIndex((n) => VALUE_NAMES.test(n));
  let qualityColumn = names.findIndex((n) => QUALITY_NAMES.test(n));
  const unitColumn = names.findIndex((n) => UNIT_NAMES.test(n));
  if (tagColumn >= 0 && valueColumn >= 0 && !isTimeCol(tagColumn) && !isTimeCol(valueColumn)) {
    layout = 'long';
    notes.push(`Long layout: columns named '${names[tagColumn]}' and '${names[valueColumn]}'.`);
  } else if (m <= 5) {
    // evidence: one identifier-like text column whose names repeat or vary, and the time repeats
    const idCols = valueIdx.filter((j) => stats[j].nonBlank > 0 && stats[j].identifier >= 0.9 * stats[j].nonBlank && stats[j].numeric === 0);
    if (idCols.length === 1) {
      const j = idCols[0];
      const timeCells = data.map((r) => timeCols!.map((c) => r.fields[c] ?? '').join(' '));
      const timeRepeats = new Set(timeCells).size < timeCells.length;
      if (timeRepeats || stats[j].distinct.size >= 2) {
        const numCols = valueIdx.filter((k) => k !== j && stats[k].nonBlank > 0 && stats[k].numeric >= 0.5 * stats[k].nonBlank);
        const valueCandidate = numCols.find((k) => !(stats[k].quality === stats[k].nonBlank && qualityColumn === k));
        if (valueCandidate !== undefined) {
          layout = 'long';
          tagColumn = j;
          valueColumn = valueCandidate;
          confidence *= 0.8;
          notes.push(`Long layout by evidence: column ${j + 1} holds tag names${timeRepeats ? ' and times repeat across rows' : ''}.`);
          questions.push({
            field: 'layout',
            message: `Read as a long export (column ${j + 1} = tag, column ${valueColumn + 1} = value) from the data alone; confirm.`,
            choices: ['long', 'wide'],
            blocking: false,
          });
        }
      }
    }
  }
  if (layout === 'long') {
    if (qualityColumn < 0 || qualityColumn === valueColumn || qualityColumn === tagColumn || isTimeCol(qualityColumn)) {
      qualityColumn = valueIdx.find(
        (k) => k !== tagColumn && k !== valueColumn && k !== unitColumn && stats[k].nonBlank > 0 && stats[k].quality === stats[k].nonBlank,
      ) ?? -1;
    }
    if (qualityColumn >= 0) notes.push(`Quality in column ${qualityColumn + 1}.`);
  }

  // --- numbers
  const numberCells: string[] = [];
  const numberCols = layout === 'long' ? [valueColumn] : valueIdx;
  const cellsByColumn = new Map<number, string[]>(numberCols.map((j) => [j, []]));
  for (const r of data) {
    for (const j of numberCols) {
      const cell = r.fields[j] ?? '';
      if (!isNumericLike(cell)) continue;
      // a comma inside a field of a comma file was quoted: that column keeps its own format
      if (holdsSeparator(cell, sep)) cellsByColumn.get(j)!.push(cell);
      else numberCells.push(cell);
    }
  }
  const dec = decimalEvidence(numberCells, sep);
  notes.push(dec.note);
  confidence *= dec.confidence;
  if (dec.question) questions.push(dec.question);
  const columnNumbers = decideColumnNumbers(sep, cellsByColumn, (j) => `${j + 1} ('${(tagRec?.fields[j] ?? '').trim() || `column ${j + 1}`}')`);
  notes.push(...columnNumbers.notes);
  questions.push(...columnNumbers.questions);
  if (columnNumbers.questions.length > 0) confidence *= 0.5;

  // --- time format
  let time: TimeColumns;
  if (numericKind) {
    const cell = (data[0].fields[timeCols[0]] ?? '').trim();
    time = {
      columns: timeCols,
      kind: numericKind,
      dateOrder: 'ymd',
      clock: '24h',
      zone: numericKind === 'serial' ? 'local' : 'explicit',
      example: cell,
    };
  } else {
    const d = decideTextTime(timeCols, data);
    time = d.time;
    questions.push(...d.questions);
    notes.push(...d.notes);
    confidence *= d.confidence;
  }

  // --- columns
  let wide: LayoutProfile['wide'] = null;
  let long: LayoutProfile['long'] = null;
  let quality: QualityPairs | null = null;
  if (layout === 'wide') {
    const qd = detectQualityColumns(tagRec ? columnNames : columnNames.map(() => ''), valueIdx, stats);
    quality = qd.quality;
    notes.push(...qd.notes);
    const cols: WideColumn[] = [];
    for (const j of valueIdx) {
      if (qd.columns.includes(j)) continue;
      const rawName = tagRec ? (tagRec.fields[j] ?? '').trim() : '';
      if (rawName.length === 0 && stats[j].nonBlank === 0) continue; // trailing separator column
      const split = splitNameUnit(rawName);
      const unitCell = unitRec ? (unitRec.fields[j] ?? '').trim() : '';
      const descCell = descRec ? (descRec.fields[j] ?? '').trim() : '';
      cols.push({
        index: j,
        tag: split.tag.length > 0 ? split.tag : `column ${j + 1}`,
        unit: unitCell.length > 0 ? unitCell : split.unit,
        description: descCell.length > 0 ? descCell : null,
      });
    }
    if (cols.length === 0) {
      throw new IngestError('NO_VALUE_COLUMNS', 'Besides the time, the file has no column with values. Include the tags in the export.');
    }
    const tags = new Map<string, number>();
    for (const c of cols) tags.set(c.tag, (tags.get(c.tag) ?? 0) + 1);
    const dupTags = [...tags].filter(([, n]) => n > 1).map(([t]) => t);
    if (dupTags.length > 0) {
      throw new IngestError(
        'DUPLICATE_HEADERS',
        `Tag names appear more than once once units are split off: ${dupTags.map((t) => `'${t}'`).join(', ')}. Export each tag once.`,
        { duplicates: dupTags },
      );
    }
    wide = { columns: cols };
    notes.push(`Wide layout: ${cols.length} value column(s).`);
  } else {
    long = {
      tagColumn,
      valueColumn,
      qualityColumn: qualityColumn >= 0 ? qualityColumn : null,
      unitColumn: unitColumn >= 0 && !isTimeCol(unitColumn) && unitColumn !== tagColumn && unitColumn !== valueColumn ? unitColumn : null,
    };
  }

  const fingerprintSource = JSON.stringify([
    'lossline-layout-1',
    layout,
    sep,
    m,
    tagRec ? tagRec.fields.map(normaliseHeaderCell) : null,
    unitRec ? unitRec.fields.map(normaliseHeaderCell) : null,
    descRec ? descRec.fields.map(normaliseHeaderCell) : null,
  ]);
  const blockingCount = questions.filter((q) => q.blocking).length;
  const profile: LayoutProfile = {
    version: 1,
    encoding: options.encoding ?? null,
    separator: sep,
    quote: '"',
    decimalMark: dec.decimalMark,
    thousandsSeparator: dec.thousandsSeparator,
    columnCount: m,
    headerRowCount: header.length,
    headerRows,
    tagRowIndex: rowIndex(tagRec),
    unitRowIndex: rowIndex(unitRec),
    descriptionRowIndex: rowIndex(descRec),
    columnNames,
    layout,
    time,
    wide,
    long,
    ...(columnNumbers.formats.length > 0 ? { columnNumbers: columnNumbers.formats } : {}),
    ...(quality ? { quality } : {}),
    fingerprint: fnv1a64Hex(fingerprintSource),
    confidence: Math.max(0, Math.min(1, blockingCount > 0 ? Math.min(confidence, 0.5) : confidence)),
    questions,
    notes,
  };
  return LayoutProfileSchema.parse(profile);
}

/**
 * When the sample holds no data row, a more precise reason than HEADER_ONLY where there is one:
 * a cut line longer than half the sample (RECORD_TOO_LONG), thousands of blank lines (BLANK_LINES),
 * rows with times but no number in any value cell (NO_NUMBERS). Returns when none applies.
 */
function noDataRowReason(text: string, records: { fields: string[]; line: number }[], droppedTail: number, complete: boolean): void {
  if (!complete && droppedTail > text.length) {
    throw new IngestError(
      'RECORD_TOO_LONG',
      `Line ${(records.at(-1)?.line ?? 0) + 1} is longer than the first ${Math.round((text.length + droppedTail) / 1024)} KiB of the file read to decide its layout, ` +
        'so no data row could be seen. Either the file is not a CSV export, the separator is wrong, or a quote is never closed. Check the export settings.',
      { sampleCharacters: text.length + droppedTail },
      (records.at(-1)?.line ?? 0) + 1,
    );
  }
  let blank = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 && (i === 0 || text.charCodeAt(i - 1) === 10 || (text.charCodeAt(i - 1) === 13 && (i < 2 || text.charCodeAt(i - 2) === 10)))) blank++;
  }
  if (blank >= 1000 && blank > 10 * records.length) {
    throw new IngestError(
      'BLANK_LINES',
      `The file holds ${blank} blank line(s) ${complete ? 'and no data row' : 'before any data row in the part read to decide its layout'}. ` +
        'Remove the blank lines (or export again without padding) and upload the new file.',
      { blankLines: blank, records: records.length },
    );
  }
  const timed = records.filter((r) => r.fields.some((f) => isDateTimeText(f.trim())));
  if (timed.length >= 3) {
    const examples = new Set<string>();
    for (const r of timed.slice(0, 20)) for (const f of r.fields) if (!isDateTimeText(f.trim()) && f.trim() && examples.size < 3) examples.add(f.trim().slice(0, 20));
    throw new IngestError(
      'NO_NUMBERS',
      `${timed.length} row(s) hold a time but no value cell holds a number${examples.size ? ` (for example ${[...examples].map((x) => `'${x}'`).join(', ')})` : ''}. ` +
        'Check that the export writes the values (NaN, error words and empty exports are not readings).',
      { rows: timed.length },
    );
  }
}
