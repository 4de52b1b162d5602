/**
 * The streaming row reader: decoded text chunks in, samples out, memory flat.
 *
 * Wide files give one call per row with all tags' values in a reused Float64Array (no object per
 * sample); long files give one call per sample. Cells that are not numbers are never dropped
 * silently: each is marked in the status array, counted per tag and reason, and summarised (distinct
 * texts with counts, first lines) in the read report.
 *
 * Fatal (throw IngestError): an invalid profile or time zone, an undecided date order, a record
 * longer than the limit, a quote never closed, and a file without data rows (HEADER_ONLY).
 * Per-row warnings (counted, first lines listed): ragged rows (missing cells read as blank, extra
 * cells ignored), unreadable times (row skipped), duplicate times (kept: the later row wins in the
 * aggregator, per tag; a blank cell in the later row keeps the earlier value), times going backwards (kept; the aggregator drops them per tag and counts them),
 * readings in the daylight-saving gap or repeated hour (resolved by order, see LocalClock), unknown
 * quality words, text after a closing quote.
 */
import { IngestError } from './errors';
import { valueLimitsFor, type ValueLimits } from './limits';
import { CsvTokenizer, fieldText } from './csv';
import type { CsvRecord } from './csv';
import { isBlankAt, parseNumberAt } from './numbers';
import { LayoutProfileSchema } from './profile';
import type { LayoutProfile } from './profile';
import { classifyQuality, QualityClass } from './quality';
import { createQualityJudge } from './quality-codes';
import { assertTimeZone, dayFromScan, daysFromCivil, isoUtc, LocalClock, newScan, scanDateTime, scanTimeOnly, timeOfDayMs, wallMsFromScan, wallMsFromSerial } from './time';
import type { DateOrder } from './time';

/** Per-cell status codes passed with values. */
export const CellStatus = {
  /** A number, usable. */
  Ok: 0,
  /** Empty cell: no sample (ignored by the aggregator, counted by the reader). */
  Blank: 1,
  /** Text that is not a number ('Shutdown', 'I/O Timeout', '#N/A'): a rejected sample. */
  Text: 2,
  /** A number whose quality says bad: a rejected sample. */
  BadQuality: 3,
  /** A number whose quality says uncertain (or is unknown): used, and counted. */
  Uncertain: 4,
} as const;
export type CellStatus = (typeof CellStatus)[keyof typeof CellStatus];

/** Receives what the reader reads. The hour aggregator implements it. */
export interface SampleSink {
  /** Announces a tag before its first sample; indexes are dense from 0 in order of appearance. */
  addTag(tagIndex: number, tag: string): void;
  /** Wide files: one row; values[k] and status[k] belong to tag k (arrays are reused: copy if kept). */
  addRow(timeMs: number, values: Float64Array, status: Uint8Array): void;
  /** Long files: one sample. */
  addSample(tagIndex: number, timeMs: number, value: number, status: number): void;
}

export interface RejectedCell {
  tag: string;
  timeMs: number;
  line: number;
  /** text: not a number; bad-quality: the historian said bad; impossible: outside the quantity's
   *  possible range (see limits.ts); outside-window: the row's time is outside the accepted window. */
  reason: RejectReason;
  text: string;
  /** bad-quality: the quality code the file gave the sample. */
  code?: string;
}

export type RejectReason = 'text' | 'bad-quality' | 'impossible' | 'outside-window';

/** Longest tag name accepted [characters]. */
export const MAX_TAG_NAME_CHARS = 200;

export interface RowReaderOptions {
  /** The site's IANA time zone, for local times. */
  timeZone: string;
  sink: SampleSink;
  /** Longest record accepted [characters]; default 1 048 576. */
  maxRecordChars?: number;
  /** Lines listed per warning at most; default 20. */
  maxListedLines?: number;
  /** Distinct rejected texts kept per tag at most; default 10. */
  maxRejectedExamples?: number;
  /** Called for every rejected cell (for a server that stores them); optional. */
  onRejectedCell?: (cell: RejectedCell) => void;
  /** Called for every data row whose time cannot be read (the row is skipped); optional. */
  onTimeError?: (line: number, text: string) => void;
  /**
   * Possible values of a tag in its own unit; values outside are rejected as 'impossible'. Default:
   * from the unit in the file's units row (wide files), else the magnitude limit only (limits.ts).
   */
  valueLimits?: (tag: string, unitText: string | null) => ValueLimits | null;
  /** Accepted times [UTC ms, inclusive]; rows outside have their cells rejected as 'outside-window'. */
  timeWindow?: { minMs: number; maxMs: number };
  /** Wide files with quality columns: the site's good codes (default DEFAULT_GOOD_QUALITY_CODES). */
  goodQualityCodes?: readonly string[];
}

export type IngestWarningCode =
  | 'RAGGED_ROWS'
  | 'UNREADABLE_TIMES'
  | 'DUPLICATE_TIMES'
  | 'BACKWARDS_TIMES'
  | 'DST_REPEATED_HOUR'
  | 'DST_GAP'
  | 'UNKNOWN_QUALITY'
  | 'MALFORMED_QUOTES'
  | 'BLANK_TAG_NAMES'
  | 'TIMES_OUTSIDE_WINDOW'
  | 'IMPOSSIBLE_VALUES'
  | 'COLUMNS_WITHOUT_NUMBERS'
  | 'BAD_TAG_NAMES';

export interface IngestWarning {
  code: IngestWarningCode;
  message: string;
  count: number;
  /** First lines affected (1-based physical lines), up to the cap. */
  lines: number[];
}

export interface TagReadSummary {
  tag: string;
  /** Numeric cells (good or uncertain). */
  valueCount: number;
  blankCount: number;
  textCount: number;
  badQualityCount: number;
  uncertainCount: number;
  /** Numbers outside the quantity's possible range (rejected). */
  impossibleCount: number;
  /** Cells of rows whose time is outside the accepted window (rejected). */
  outsideWindowCount: number;
  /** Distinct rejected texts with counts (up to the cap), most frequent first. */
  rejectedTexts: { text: string; count: number }[];
  /** First lines with a rejected cell. */
  rejectedLines: number[];
}

export interface ReadReport {
  dataRowCount: number;
  headerRowCount: number;
  /** Numeric cells over all tags. */
  valueCount: number;
  rejectedCount: number;
  blankCount: number;
  firstTimeMs: number | null;
  lastTimeMs: number | null;
  tags: TagReadSummary[];
  warnings: IngestWarning[];
}

export interface RowReader {
  push(text: string): void;
  /** Ends the input and returns the report. Throws HEADER_ONLY when no data row was read. */
  end(): ReadReport;
  /** Tags known so far, by index. */
  readonly tags: readonly string[];
  /** During a sink call: the text of tag k's cell in the current row (wide) or of the value cell (long). */
  cellText(k: number): string;
  /** During a sink call: the time cell text of the current row (two cells joined by a space). */
  timeText(): string;
  /** During a sink call: the current line. */
  readonly line: number;
}

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
  if (d > 28 && d > daysInMonthOf(year, mo)) return NaN;
  return daysFromCivil(year, mo, d) * 86_400_000 + h * 3_600_000 + mi * 60_000 + sec * 1000 + ms;
}

function daysInMonthOf(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

class WarningCounter {
  count = 0;
  lines: number[] = [];
  constructor(private readonly cap: number) {}
  add(line: number): void {
    this.count++;
    if (this.lines.length < this.cap) this.lines.push(line);
  }
}

interface TagState {
  tag: string;
  valueCount: number;
  blankCount: number;
  textCount: number;
  badQualityCount: number;
  uncertainCount: number;
  impossibleCount: number;
  outsideWindowCount: number;
  texts: Map<string, number>;
  rejectedLines: number[];
}

/** Validates a profile for reading; throws INVALID_PROFILE or DATE_ORDER_UNDECIDED. */
export function checkProfile(profile: LayoutProfile): LayoutProfile {
  const parsed = LayoutProfileSchema.safeParse(profile);
  if (!parsed.success) {
    throw new IngestError(
      'INVALID_PROFILE',
      `The layout profile is not valid: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}.`,
      { issues: parsed.error.issues },
    );
  }
  const p = parsed.data;
  if (p.time.kind === 'text' && p.time.dateOrder === 'ambiguous') {
    throw new IngestError(
      'DATE_ORDER_UNDECIDED',
      `The dates (for example ${p.time.example}) read both day-first and month-first. Answer the question 'time.dateOrder' ` +
        "(set time.dateOrder to 'dmy' or 'mdy') before reading the file.",
      { example: p.time.example },
    );
  }
  if ((p.layout === 'wide') !== (p.wide !== null) || (p.layout === 'long') !== (p.long !== null)) {
    throw new IngestError('INVALID_PROFILE', `The layout profile says '${p.layout}' but describes the columns of the other layout.`);
  }
  return p;
}

/**
 * Creates a reader for one file.
 * @param profile the (answered) layout profile of the file
 */
export function createRowReader(profile: LayoutProfile, options: RowReaderOptions): RowReader {
  const p = checkProfile(profile);
  assertTimeZone(options.timeZone);
  const sink = options.sink;
  const cap = options.maxListedLines ?? 20;
  const maxExamples = options.maxRejectedExamples ?? 10;
  const decCode = p.decimalMark.charCodeAt(0);
  const thouCode = p.thousandsSeparator === '' ? -1 : p.thousandsSeparator.charCodeAt(0);
  const clock = new LocalClock(options.timeZone, cap);
  const scan = newScan();
  const scan2 = newScan();
  const order: DateOrder = p.time.dateOrder === 'ambiguous' ? 'dmy' : p.time.dateOrder;
  const timeCols = p.time.columns;
  const kind = p.time.kind;

  const ragged = new WarningCounter(cap);
  const badTime = new WarningCounter(cap);
  const badTimeExamples: string[] = [];
  const duplicates = new WarningCounter(cap);
  const backwards = new WarningCounter(cap);
  const unknownQuality = new WarningCounter(cap);
  const unknownQualityTexts = new Set<string>();
  const blankTags = new WarningCounter(cap);
  const badTagNames = new WarningCounter(cap);
  const outsideWindow = new WarningCounter(cap);
  const outsideWindowExamples: string[] = [];
  const impossible = new WarningCounter(cap);
  const impossibleExamples: string[] = [];
  const winMin = options.timeWindow?.minMs ?? -Infinity;
  const winMax = options.timeWindow?.maxMs ?? Infinity;
  const limitsOf = options.valueLimits ?? ((_tag: string, unit: string | null) => valueLimitsFor(unit));
  let limMin = new Float64Array(16);
  let limMax = new Float64Array(16);
  const limWhy: string[] = [];

  const tagStates: TagState[] = [];
  const tagNames: string[] = [];
  const tagIndex = new Map<string, number>();
  function addTag(name: string, unit: string | null = null): number {
    const k = tagStates.length;
    tagStates.push({ tag: name, valueCount: 0, blankCount: 0, textCount: 0, badQualityCount: 0, uncertainCount: 0, impossibleCount: 0, outsideWindowCount: 0, texts: new Map(), rejectedLines: [] });
    if (k >= limMin.length) {
      const a = new Float64Array(limMin.length * 2);
      a.set(limMin);
      limMin = a;
      const b = new Float64Array(limMax.length * 2);
      b.set(limMax);
      limMax = b;
    }
    const lim = limitsOf(name, unit) ?? valueLimitsFor(null);
    limMin[k] = lim.min;
    limMax[k] = lim.max;
    limWhy[k] = lim.why;
    tagNames.push(name);
    tagIndex.set(name, k);
    sink.addTag(k, name);
    return k;
  }

  let headerLeft = p.headerRowCount;
  let dataRows = 0;
  let firstTimeMs = Infinity;
  let lastTimeMs = -Infinity;
  let prevRowTimeMs = NaN;
  let currentLine = 0;
  let current: CsvRecord | null = null;

  // wide
  const valueCols = p.wide ? Int32Array.from(p.wide.columns.map((c) => c.index)) : new Int32Array(0);
  const nWide = valueCols.length;
  const values = new Float64Array(nWide);
  const status = new Uint8Array(nWide);
  // number format per value column (quoted cells of a comma file keep their own: column-numbers.ts)
  const colFormat = new Map((p.columnNumbers ?? []).map((f) => [f.column, f]));
  const codesOf = (col: number): [number, number] => {
    const f = colFormat.get(col);
    if (!f) return [decCode, thouCode];
    return [f.decimalMark.charCodeAt(0), f.thousandsSeparator === '' ? -1 : f.thousandsSeparator.charCodeAt(0)];
  };
  const decK = Int32Array.from(valueCols, (col) => codesOf(col)[0]);
  const thouK = Int32Array.from(valueCols, (col) => codesOf(col)[1]);
  const [longDec, longThou] = p.long ? codesOf(p.long.valueColumn) : [decCode, thouCode];
  // quality column per value column (-1: none), from the profile's pairs or its row column
  const qualityCols = wideQualityColumns(p, valueCols);
  const judge = createQualityJudge(options.goodQualityCodes);
  if (p.wide) {
    for (const c of p.wide.columns) {
      const bad = badTagName(c.tag);
      if (bad) throw new IngestError('BAD_TAG_NAME', `The column name starting '${cleanName(c.tag).slice(0, 40)}' ${bad}. Rename the column in the export.`, { column: c.index });
      addTag(c.tag, c.unit ?? null);
    }
  }
  // long: per-tag last time for order checks
  let tagLastTime = new Float64Array(16).fill(NaN);
  const qualityCache = new Map<string, number>();
  let lastTagIndex = -1;
  let lastTagRaw = '\u0000';
  let lastQualityRaw = '\u0000';
  let lastQualityClass = 0;

  function reject(k: number, rec: CsvRecord, col: number, timeMs: number, reason: RejectReason, code?: string): void {
    const st = tagStates[k];
    const text = fieldText(rec, col).trim();
    if (reason === 'text') st.textCount++;
    else if (reason === 'bad-quality') st.badQualityCount++;
    else if (reason === 'impossible') {
      st.impossibleCount++;
      impossible.add(rec.line);
      if (impossibleExamples.length < 3) impossibleExamples.push(`${st.tag} = ${text.slice(0, 40)} (${limWhy[k]})`);
    } else st.outsideWindowCount++;
    const why = reason === 'bad-quality' ? (code !== undefined ? `bad quality ${code}` : 'bad quality') : reason === 'impossible' ? 'impossible value' : 'time outside window';
    const key = reason === 'text' ? text : `[${why}] ${text}`;
    const n = st.texts.get(key);
    if (n !== undefined) st.texts.set(key, n + 1);
    else if (st.texts.size < maxExamples) st.texts.set(key, 1);
    if (st.rejectedLines.length < cap) st.rejectedLines.push(rec.line);
    options.onRejectedCell?.(code !== undefined ? { tag: st.tag, timeMs, line: rec.line, reason, text, code } : { tag: st.tag, timeMs, line: rec.line, reason, text });
  }

  /** UTC ms of the record's time, or NaN. */
  function timeOf(rec: CsvRecord): number {
    const c0 = timeCols[0];
    if (c0 >= rec.count) return NaN;
    const text = rec.fields[c0];
    const e = text.length;
    if (kind === 'text') {
      if (timeCols.length === 1) {
        const wall = fastIsoWallMs(text, 0, e);
        if (wall === wall) {
          const offset = fastIsoOffset;
          if (offset === offset) {
            const utc = wall - offset * 60_000;
            clock.noteAbsolute(utc);
            return utc;
          }
          return clock.toUtc(wall, rec.line);
        }
      }
      if (!scanDateTime(text, 0, e, scan)) return NaN;
      let wall: number;
      let offset = scan.offsetMinutes;
      if (timeCols.length === 2) {
        const c1 = timeCols[1];
        if (c1 >= rec.count) return NaN;
        const t1 = rec.fields[c1];
        if (scan.hasTime || !scanTimeOnly(t1, 0, t1.length, scan2)) return NaN;
        const day = dayFromScan(scan, order);
        const tod = timeOfDayMs(scan2);
        wall = day * 86_400_000 + tod;
        offset = scan2.offsetMinutes;
      } else {
        wall = wallMsFromScan(scan, order);
      }
      if (wall !== wall) return NaN;
      if (offset === offset) {
        const utc = wall - offset * 60_000;
        clock.noteAbsolute(utc);
        return utc;
      }
      return clock.toUtc(wall, rec.line);
    }
    const v = parseNumberAt(text, 0, e, kind === 'serial' ? decCode : 46, -1);
    if (v !== v) return NaN;
    if (kind === 'unix-s') return Math.round(v * 1000);
    if (kind === 'unix-ms') return Math.round(v);
    return clock.toUtc(wallMsFromSerial(v), rec.line);
  }

  /** Usable numbers of a tag (wide files count them from the rows). */
  function wideValueCount(st: TagState, _k: number): number {
    return p.wide ? dataRows - st.blankCount - st.textCount - st.impossibleCount - st.badQualityCount : st.valueCount;
  }

  function isBlankRecord(rec: CsvRecord): boolean {
    const fields = rec.fields;
    for (let i = 0; i < rec.count; i++) if (!isBlankAt(fields[i], 0, fields[i].length)) return false;
    return true;
  }

  function onRecord(rec: CsvRecord): void {
    if (isBlankRecord(rec)) return;
    if (headerLeft > 0) {
      headerLeft--;
      return;
    }
    current = rec;
    currentLine = rec.line;
    if (rec.count !== p.columnCount) ragged.add(rec.line);
    const t = timeOf(rec);
    if (t !== t) {
      badTime.add(rec.line);
      const text = timeCols.map((c) => fieldText(rec, c)).join(' ');
      if (badTimeExamples.length < 3) badTimeExamples.push(text);
      options.onTimeError?.(rec.line, text);
      return;
    }
    if (t < winMin || t > winMax) {
      outsideWindow.add(rec.line);
      if (outsideWindowExamples.length < 3) outsideWindowExamples.push(timeCols.map((c) => fieldText(rec, c)).join(' ').slice(0, 60));
      rejectRowOutsideWindow(rec, t);
      return;
    }
    dataRows++;
    if (t < firstTimeMs) firstTimeMs = t;
    if (t > lastTimeMs) lastTimeMs = t;
    if (p.wide) {
      if (t === prevRowTimeMs) duplicates.add(rec.line);
      else if (t < prevRowTimeMs) backwards.add(rec.line);
      prevRowTimeMs = t;
      const fields = rec.fields;
      const count = rec.count;
      for (let k = 0; k < nWide; k++) {
        const col = valueCols[k];
        if (col >= count) {
          values[k] = NaN;
          status[k] = CellStatus.Blank;
          tagStates[k].blankCount++;
          continue;
        }
        const f = fields[col];
        const v = parseNumberAt(f, 0, f.length, decK[k], thouK[k]);
        if (v === v) {
          if (v < limMin[k] || v > limMax[k]) {
            values[k] = NaN;
            status[k] = CellStatus.Text;
            reject(k, rec, col, t, 'impossible');
            continue;
          }
          values[k] = v;
          status[k] = CellStatus.Ok;
          const qc = qualityCols[k];
          if (qc >= 0 && qc < count) {
            const q = judge(fields[qc]);
            if (q === QualityClass.Bad) {
              values[k] = NaN;
              status[k] = CellStatus.BadQuality;
              reject(k, rec, col, t, 'bad-quality', fields[qc].trim());
            } else if (q === QualityClass.Uncertain) {
              status[k] = CellStatus.Uncertain;
              tagStates[k].uncertainCount++;
            }
          }
        } else if (isBlankAt(f, 0, f.length)) {
          values[k] = NaN;
          status[k] = CellStatus.Blank;
          tagStates[k].blankCount++;
        } else {
          values[k] = NaN;
          status[k] = CellStatus.Text;
          reject(k, rec, col, t, 'text');
        }
      }
      sink.addRow(t, values, status);
      return;
    }
    // long
    const L = p.long!;
    // consecutive rows usually carry the same tag and quality text: compare before looking up
    const tc = L.tagColumn;
    const raw = tc < rec.count ? rec.fields[tc] : '';
    let k: number | undefined;
    if (lastTagIndex >= 0 && raw === lastTagRaw) {
      k = lastTagIndex;
    } else {
      const name = raw.trim();
      if (name.length === 0) {
        blankTags.add(rec.line);
        return;
      }
      if (badTagName(name)) {
        badTagNames.add(rec.line);
        return;
      }
      k = tagIndex.get(name);
      if (k === undefined) {
        k = addTag(name);
        if (k >= tagLastTime.length) {
          const grown = new Float64Array(tagLastTime.length * 2).fill(NaN);
          grown.set(tagLastTime);
          tagLastTime = grown;
        }
      }
      lastTagIndex = k;
      lastTagRaw = raw;
    }
    const prev = tagLastTime[k];
    if (t === prev) duplicates.add(rec.line);
    else if (t < prev) backwards.add(rec.line);
    tagLastTime[k] = t;
    const st = tagStates[k];
    let qClass: number = QualityClass.Good;
    if (L.qualityColumn !== null && L.qualityColumn < rec.count) {
      const qt = rec.fields[L.qualityColumn];
      let c: number | undefined;
      if (qt === lastQualityRaw) {
        c = lastQualityClass;
      } else {
        c = qualityCache.get(qt);
        if (c === undefined) {
          c = classifyQuality(qt);
          if (qualityCache.size < 1000) qualityCache.set(qt, c);
        }
        lastQualityRaw = qt;
        lastQualityClass = c;
      }
      qClass = c;
      if (c === QualityClass.Unknown) {
        unknownQuality.add(rec.line);
        if (unknownQualityTexts.size < 10) unknownQualityTexts.add(qt.trim());
        qClass = QualityClass.Uncertain;
      }
    }
    const vc = L.valueColumn;
    let value = NaN;
    let cell: number = CellStatus.Blank;
    if (vc < rec.count) {
      const tx = rec.fields[vc];
      value = parseNumberAt(tx, 0, tx.length, longDec, longThou);
      if (value === value && (value < limMin[k] || value > limMax[k])) {
        reject(k, rec, vc, t, 'impossible');
        sink.addSample(k, t, NaN, CellStatus.Text);
        return;
      }
      if (value === value) cell = qClass === QualityClass.Bad ? CellStatus.BadQuality : qClass === QualityClass.Uncertain ? CellStatus.Uncertain : CellStatus.Ok;
      else if (isBlankAt(tx, 0, tx.length)) cell = CellStatus.Blank;
      else cell = CellStatus.Text;
    }
    if (cell === CellStatus.Blank) st.blankCount++;
    else if (cell === CellStatus.Text) reject(k, rec, vc, t, 'text');
    else if (cell === CellStatus.BadQuality) reject(k, rec, vc, t, 'bad-quality');
    else {
      st.valueCount++;
      if (cell === CellStatus.Uncertain) st.uncertainCount++;
    }
    sink.addSample(k, t, cell === CellStatus.Ok || cell === CellStatus.Uncertain ? value : NaN, cell);
  }

  /** A row whose time is outside the window: each value cell with text is rejected. */
  function rejectRowOutsideWindow(rec: CsvRecord, t: number): void {
    if (p.wide) {
      for (let k = 0; k < nWide; k++) {
        const col = valueCols[k];
        if (col < rec.count && !isBlankAt(rec.fields[col], 0, rec.fields[col].length)) reject(k, rec, col, t, 'outside-window');
      }
      return;
    }
    const L = p.long!;
    const name = L.tagColumn < rec.count ? rec.fields[L.tagColumn].trim() : '';
    if (!name || badTagName(name)) return;
    let k = tagIndex.get(name);
    if (k === undefined) {
      k = addTag(name);
      if (k >= tagLastTime.length) {
        const grown = new Float64Array(tagLastTime.length * 2).fill(NaN);
        grown.set(tagLastTime);
        tagLastTime = grown;
      }
    }
    const vc = L.valueColumn;
    if (vc < rec.count && !isBlankAt(rec.fields[vc], 0, rec.fields[vc].length)) reject(k, rec, vc, t, 'outside-window');
  }

  const tokenizer = new CsvTokenizer(p.separator, onRecord, { maxRecordChars: options.maxRecordChars });

  function warnings(): IngestWarning[] {
    const out: IngestWarning[] = [];
    const add = (code: IngestWarningCode, c: WarningCounter, message: string) => {
      if (c.count > 0) out.push({ code, message, count: c.count, lines: c.lines });
    };
    add('RAGGED_ROWS', ragged, `${ragged.count} row(s) do not have ${p.columnCount} fields; missing cells were read as blank, extra cells ignored.`);
    add('UNREADABLE_TIMES', badTime, `${badTime.count} row(s) have a time that cannot be read (for example ${badTimeExamples.map((x) => `'${x}'`).join(', ')}); those rows were skipped.`);
    add('DUPLICATE_TIMES', duplicates, `${duplicates.count} row(s) repeat the time of the row before (for the same tag); the later value wins.`);
    add('BACKWARDS_TIMES', backwards, `${backwards.count} row(s) have a time earlier than the row before (for the same tag); the aggregator drops them.`);
    const cs = clock.stats;
    if (cs.repeatedFirstPassCount + cs.repeatedSecondPassCount > 0) {
      out.push({
        code: 'DST_REPEATED_HOUR',
        message:
          `${cs.repeatedFirstPassCount + cs.repeatedSecondPassCount} local time(s) fall in the hour repeated when clocks go back; resolved by order: ` +
          `${cs.repeatedFirstPassCount} read as the first pass (summer offset), ${cs.repeatedSecondPassCount} as the second pass (after the time stepped back).` +
          (cs.repeatedSecondPassCount === 0 ? ' No step back was seen, so none was read as the second pass; check those rows.' : ''),
        count: cs.repeatedFirstPassCount + cs.repeatedSecondPassCount,
        lines: cs.repeatedLines,
      });
    }
    if (cs.gapCount > 0) {
      out.push({
        code: 'DST_GAP',
        message: `${cs.gapCount} local time(s) fall in the hour skipped when clocks go forward, so they never happened on a correct clock; read with the offset before the change (02:30 as 03:30 summer time).`,
        count: cs.gapCount,
        lines: cs.gapLines,
      });
    }
    add('UNKNOWN_QUALITY', unknownQuality, `${unknownQuality.count} quality cell(s) are not known words or codes (${[...unknownQualityTexts].map((x) => `'${x}'`).join(', ')}); their values were used as uncertain.`);
    if (tokenizer.malformedQuoteCount > 0) {
      out.push({ code: 'MALFORMED_QUOTES', message: `${tokenizer.malformedQuoteCount} quoted field(s) have text after the closing quote; it was kept.`, count: tokenizer.malformedQuoteCount, lines: [] });
    }
    add('BLANK_TAG_NAMES', blankTags, `${blankTags.count} row(s) have no tag name and were skipped.`);
    add('BAD_TAG_NAMES', badTagNames, `${badTagNames.count} row(s) have a tag name longer than ${MAX_TAG_NAME_CHARS} characters or made of control characters; they were skipped.`);
    add(
      'TIMES_OUTSIDE_WINDOW',
      outsideWindow,
      `${outsideWindow.count} row(s) have a time outside the accepted window (${windowIso(winMin)} to ${windowIso(winMax)}), for example ` +
        `${outsideWindowExamples.map((x) => `'${x}'`).join(', ')}; their cells were rejected.`,
    );
    add(
      'IMPOSSIBLE_VALUES',
      impossible,
      `${impossible.count} value(s) are physically impossible and were rejected, for example ${impossibleExamples.map((x) => `'${x}'`).join(', ')}.`,
    );
    const empty = tagStates.filter((st, k) => wideValueCount(st, k) === 0 && st.textCount + st.impossibleCount > 0);
    if (empty.length > 0) {
      out.push({
        code: 'COLUMNS_WITHOUT_NUMBERS',
        message:
          `${empty.length} tag(s) hold no usable number in the whole file: ` +
          empty
            .slice(0, 10)
            .map((st) => `${st.tag} (for example '${[...st.texts.keys()][0] ?? ''}')`)
            .join(', ') +
          (empty.length > 10 ? ' ...' : '') +
          '. Check that the export writes values for them (NaN, error words and fill values are not readings).',
        count: empty.length,
        lines: [],
      });
    }
    return out;
  }

  return {
    push(text: string): void {
      tokenizer.push(text);
    },
    end(): ReadReport {
      tokenizer.end();
      if (dataRows === 0 && outsideWindow.count > 0) {
        throw new IngestError(
          'TIMES_OUTSIDE_WINDOW',
          `Every row's time lies outside the accepted window (${windowIso(winMin)} to ${windowIso(winMax)}), for example ` +
            `${outsideWindowExamples.map((x) => `'${x}'`).join(', ')}. Check the clock of the exporting system and the time settings of the layout.`,
          { rows: outsideWindow.count, minIso: windowIso(winMin), maxIso: windowIso(winMax) },
        );
      }
      if (dataRows === 0) {
        throw new IngestError(
          'HEADER_ONLY',
          badTime.count > 0
            ? `No row has a readable time (${badTime.count} tried, for example ${badTimeExamples.map((x) => `'${x}'`).join(', ')}). Check the time settings of the layout.`
            : 'The file has header lines but no data rows. Export a time range that contains data.',
          { unreadableTimes: badTime.count },
        );
      }
      let valueCount = 0;
      let rejectedCount = 0;
      let blankCount = 0;
      const tags: TagReadSummary[] = tagStates.map((st) => {
        const valueCountK = wideValueCount(st, tagStates.indexOf(st));
        valueCount += valueCountK;
        rejectedCount += st.textCount + st.badQualityCount + st.impossibleCount + st.outsideWindowCount;
        blankCount += st.blankCount;
        return {
          tag: st.tag,
          valueCount: valueCountK,
          blankCount: st.blankCount,
          textCount: st.textCount,
          badQualityCount: st.badQualityCount,
          uncertainCount: st.uncertainCount,
          impossibleCount: st.impossibleCount,
          outsideWindowCount: st.outsideWindowCount,
          rejectedTexts: [...st.texts].map(([text, count]) => ({ text, count })).sort((a, b) => b.count - a.count),
          rejectedLines: st.rejectedLines,
        };
      });
      return {
        dataRowCount: dataRows,
        headerRowCount: p.headerRowCount,
        valueCount,
        rejectedCount,
        blankCount,
        firstTimeMs: Number.isFinite(firstTimeMs) ? firstTimeMs : null,
        lastTimeMs: Number.isFinite(lastTimeMs) ? lastTimeMs : null,
        tags,
        warnings: warnings(),
      };
    },
    get tags() {
      return tagNames;
    },
    cellText(k: number): string {
      const rec = current;
      if (!rec) return '';
      const col = p.wide ? valueCols[k] : p.long!.valueColumn;
      return col < rec.count ? fieldText(rec, col) : '';
    },
    timeText(): string {
      const rec = current;
      if (!rec) return '';
      return timeCols.map((c) => (c < rec.count ? fieldText(rec, c).trim() : '')).join(' ');
    },
    get line() {
      return currentLine;
    },
  };
}

export interface PreviewCell {
  tag: string;
  /** The number read, or null when the cell was blank or rejected. */
  value: number | null;
  /** The cell text when it was rejected (not a number, or bad quality). */
  rejected: string | null;
  status: CellStatus;
}

export interface PreviewRow {
  line: number;
  /** Time as ISO 8601 UTC, or null when it cannot be read (or the date order is undecided). */
  timeIso: string | null;
  /** Time cell text as written. */
  timeText: string;
  /** When the date order is undecided: the time read each way, for the operator to compare. */
  timeChoices: { dmy: string | null; mdy: string | null } | null;
  cells: PreviewCell[];
}

/**
 * The first n data rows of a sample as the reader reads them, for a preview screen. Rows whose time
 * cannot be read are included with timeIso null and no cells.
 * @param options.timeZone the site's zone for local times (default 'UTC')
 * @param options.complete true when the text is the whole file; default: true when shorter than
 *   60 000 characters. An incomplete sample loses its last, possibly cut, line.
 */
export function previewRows(
  sampleText: string,
  profile: LayoutProfile,
  n: number,
  options: { timeZone?: string; complete?: boolean } = {},
): PreviewRow[] {
  if (!(options.complete ?? sampleText.length < 60000)) {
    // the sample may end inside a line: leave that line out
    const cut = Math.max(sampleText.lastIndexOf('\n'), sampleText.lastIndexOf('\r'));
    sampleText = sampleText.slice(0, cut + 1);
    options = { ...options, complete: true };
  }
  if (profile.time.kind === 'text' && profile.time.dateOrder === 'ambiguous') {
    const dmy = previewRows(sampleText, { ...profile, time: { ...profile.time, dateOrder: 'dmy' } }, n, options);
    const mdy = previewRows(sampleText, { ...profile, time: { ...profile.time, dateOrder: 'mdy' } }, n, options);
    const byLine = new Map(mdy.map((r) => [r.line, r.timeIso]));
    return dmy.map((r) => ({ ...r, timeIso: null, timeChoices: { dmy: r.timeIso, mdy: byLine.get(r.line) ?? null } }));
  }
  const rows: PreviewRow[] = [];
  const stop = {};
  const tags: string[] = [];
  const pushRow = (row: PreviewRow) => {
    rows.push(row);
    if (rows.length >= n) throw stop;
  };
  const cell = (k: number, tag: string, value: number, st: number): PreviewCell => ({
    tag,
    value: st === CellStatus.Ok || st === CellStatus.Uncertain ? value : null,
    rejected: st === CellStatus.Text || st === CellStatus.BadQuality ? reader.cellText(k).trim() : null,
    status: st as CellStatus,
  });
  const reader: RowReader = createRowReader(profile, {
    timeZone: options.timeZone ?? 'UTC',
    sink: {
      addTag(k, tag) {
        tags[k] = tag;
      },
      addRow(timeMs, values, status) {
        const cells: PreviewCell[] = [];
        for (let k = 0; k < values.length; k++) cells.push(cell(k, tags[k], values[k], status[k]));
        pushRow({ line: reader.line, timeIso: isoUtc(timeMs), timeText: reader.timeText(), timeChoices: null, cells });
      },
      addSample(k, timeMs, value, st) {
        pushRow({ line: reader.line, timeIso: isoUtc(timeMs), timeText: reader.timeText(), timeChoices: null, cells: [cell(k, tags[k], value, st)] });
      },
    },
    onTimeError: (line, text) => pushRow({ line, timeIso: null, timeText: text, timeChoices: null, cells: [] }),
  });
  try {
    reader.push(sampleText);
    reader.end();
  } catch (e) {
    if (e !== stop && !(e instanceof IngestError && e.code === 'HEADER_ONLY' && rows.length > 0)) throw e;
  }
  return rows;
}

/** Control characters (NUL included) in a name, made visible as spaces for messages. */
function cleanName(name: string): string {
  // eslint-disable-next-line no-control-regex
  return name.replace(/[\u0000-\u001f\u007f]/g, ' ');
}

/** Why a tag name cannot be stored, or null when it can. */
function badTagName(name: string): string | null {
  if (name.length > MAX_TAG_NAME_CHARS) return `is longer than ${MAX_TAG_NAME_CHARS} characters (${name.length})`;
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(name)) return 'holds control characters';
  return null;
}

const windowIso = (ms: number) => (Number.isFinite(ms) ? isoUtc(ms) : 'open');

/** The quality column of each wide value column, or -1. */
function wideQualityColumns(p: LayoutProfile, valueCols: Int32Array): Int32Array {
  const out = new Int32Array(valueCols.length).fill(-1);
  const q = p.quality;
  if (!q) return out;
  const pairOf = new Map(q.pairs.map((x) => [x.value, x.quality]));
  valueCols.forEach((col, k) => {
    out[k] = q.kind === 'row' ? (q.rowColumn ?? -1) : (pairOf.get(col) ?? -1);
  });
  return out;
}
