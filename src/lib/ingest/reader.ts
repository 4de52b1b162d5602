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
 *
 * The reading is done in named steps, each in its own file: the time of a row (reader-time.ts), the
 * cells of a wide or long row (reader-rows.ts), the counts, tags and rejected cells (reader-tally.ts)
 * and the warnings and report (reader-report.ts); the types are in reader-types.ts.
 */
import { IngestError } from './errors';
import { valueLimitsFor } from './limits';
import { CsvTokenizer, fieldText } from './csv';
import type { CsvRecord } from './csv';
import { isBlankAt } from './numbers';
import { LayoutProfileSchema } from './profile';
import type { LayoutProfile } from './profile';
import { createQualityJudge } from './quality-codes';
import { assertTimeZone, isoUtc, LocalClock } from './time';
import { CellStatus } from './reader-types';
import type { ReadReport, RowReader, RowReaderOptions } from './reader-types';
import { assertWideTagName, badTagName, createRejecter, ReadTally, TagTable } from './reader-tally';
import type { Rejecter } from './reader-tally';
import { createTimeStep } from './reader-time';
import { createLongRowStep, createWideRowStep } from './reader-rows';
import { assertDataRows, readReport } from './reader-report';
import type { ReadEnd } from './reader-report';

export * from './reader-types';

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
  const tally = new ReadTally(options.maxListedLines ?? 20);
  const clock = new LocalClock(options.timeZone, tally.cap);
  const window = { minMs: options.timeWindow?.minMs ?? -Infinity, maxMs: options.timeWindow?.maxMs ?? Infinity };
  const tags = new TagTable(options.sink, options.valueLimits ?? ((_tag: string, unit: string | null) => valueLimitsFor(unit)));
  const reject = createRejecter(tags, tally, options.maxRejectedExamples ?? 10, options.onRejectedCell);
  const valueCols = p.wide ? Int32Array.from(p.wide.columns.map((c) => c.index)) : new Int32Array(0);
  for (const c of p.wide?.columns ?? []) {
    assertWideTagName(c.tag, c.index);
    tags.add(c.tag, c.unit ?? null);
  }
  const context = { p, tags, tally, reject, sink: options.sink };
  const readCells = p.wide ? createWideRowStep(context, valueCols, createQualityJudge(options.goodQualityCodes)) : createLongRowStep(context);
  const timeOf = createTimeStep(p, clock);
  const timeText = (rec: CsvRecord) => p.time.columns.map((c) => fieldText(rec, c)).join(' ');
  const rejectOutsideWindow = outsideWindowStep(p, valueCols, tags, reject);
  let headerLeft = p.headerRowCount;
  let current: CsvRecord | null = null;

  function onRecord(rec: CsvRecord): void {
    if (isBlankRecord(rec)) return;
    if (headerLeft > 0) {
      headerLeft--;
      return;
    }
    current = rec;
    if (rec.count !== p.columnCount) tally.ragged.add(rec.line);
    const t = timeOf(rec);
    if (t !== t) {
      tally.badTime.add(rec.line);
      const text = timeText(rec);
      if (tally.badTimeExamples.length < 3) tally.badTimeExamples.push(text);
      options.onTimeError?.(rec.line, text);
      return;
    }
    if (t < window.minMs || t > window.maxMs) {
      tally.outsideWindow.add(rec.line);
      if (tally.outsideWindowExamples.length < 3) tally.outsideWindowExamples.push(timeText(rec).slice(0, 60));
      rejectOutsideWindow(rec, t);
      return;
    }
    tally.dataRows++;
    if (t < tally.firstTimeMs) tally.firstTimeMs = t;
    if (t > tally.lastTimeMs) tally.lastTimeMs = t;
    readCells(rec, t);
  }

  const tokenizer = new CsvTokenizer(p.separator, onRecord, { maxRecordChars: options.maxRecordChars });
  return {
    push(text: string): void {
      tokenizer.push(text);
    },
    end(): ReadReport {
      tokenizer.end();
      const e: ReadEnd = { p, tags, tally, clock: clock.stats, malformedQuoteCount: tokenizer.malformedQuoteCount, window };
      assertDataRows(e);
      return readReport(e);
    },
    get tags() {
      return tags.names;
    },
    cellText(k: number): string {
      const rec = current;
      if (!rec) return '';
      const col = p.wide ? valueCols[k] : p.long!.valueColumn;
      return col === undefined ? '' : fieldText(rec, col);
    },
    timeText(): string {
      const rec = current;
      if (!rec) return '';
      return p.time.columns.map((c) => (c < rec.count ? fieldText(rec, c).trim() : '')).join(' ');
    },
    get line() {
      return current?.line ?? 0;
    },
  };
}

function isBlankRecord(rec: CsvRecord): boolean {
  const fields = rec.fields;
  for (let i = 0; i < rec.count; i++) {
    const f = fields[i];
    if (f !== undefined && !isBlankAt(f, 0, f.length)) return false;
  }
  return true;
}

/** The step for a row whose time is outside the window: each value cell with text is rejected. */
function outsideWindowStep(p: LayoutProfile, valueCols: Int32Array, tags: TagTable, reject: Rejecter): (rec: CsvRecord, t: number) => void {
  return (rec, t) => {
    if (p.wide) {
      valueCols.forEach((col, k) => {
        const f = col < rec.count ? rec.fields[col] : undefined;
        if (f !== undefined && !isBlankAt(f, 0, f.length)) reject(k, rec, col, t, 'outside-window');
      });
      return;
    }
    const L = p.long!;
    const name = fieldText(rec, L.tagColumn).trim();
    if (!name || badTagName(name)) return;
    const k = tags.indexOf(name);
    const vc = L.valueColumn;
    const v = vc < rec.count ? rec.fields[vc] : undefined;
    if (v !== undefined && !isBlankAt(v, 0, v.length)) reject(k, rec, vc, t, 'outside-window');
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
  const tagName = (k: number): string => {
    const tag = tags[k];
    if (tag === undefined) throw new IngestError('READER_FAULT', `The preview got a value of tag ${k} before the tag itself.`);
    return tag;
  };
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
        const cells = Array.from(values, (v, k) => cell(k, tagName(k), v, status[k] ?? CellStatus.Blank));
        pushRow({ line: reader.line, timeIso: isoUtc(timeMs), timeText: reader.timeText(), timeChoices: null, cells });
      },
      addSample(k, timeMs, value, st) {
        pushRow({ line: reader.line, timeIso: isoUtc(timeMs), timeText: reader.timeText(), timeChoices: null, cells: [cell(k, tagName(k), value, st)] });
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
