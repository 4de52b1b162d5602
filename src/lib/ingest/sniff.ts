/**
 * Layout sniffing: reads the first part of an export (about 64 KiB of decoded text) and decides
 * separator, decimal mark, thousands separator, header rows (names, units, descriptions), layout
 * (wide or long), the time column(s) and their format. Everything it cannot decide from evidence
 * becomes a question in the profile instead of a silent guess.
 *
 * The decision is made in named steps, each returning its notes, questions and confidence: the
 * separator and cell evidence (sniff-cells.ts), the time columns and format (sniff-time.ts), the
 * header rows, layout and columns (sniff-header.ts) and the number format (sniff-numbers.ts).
 */
import { IngestError } from './errors';
import { fixed } from '../format';
import { fnv1a64Hex, normaliseHeaderCell } from './fingerprint';
import { LayoutProfileSchema } from './profile';
import type { LayoutProfile, LayoutQuestion } from './profile';
import { chooseSeparator, columnStats, isDataLike, isDateTimeText, modeCount } from './sniff-cells';
import type { Rec } from './sniff-cells';
import { decideTimeFormat, findTimeColumns } from './sniff-time';
import type { SniffNotes } from './sniff-time';
import { decideNumbers } from './sniff-numbers';
import { decideLayout, findHeaderRows, longColumns, wideColumns } from './sniff-header';

export { isUnitLike } from './sniff-cells';

export interface SniffOptions {
  /** True when the text is the whole file, so its last line is complete. Default: true when the
   *  text is shorter than 60 000 characters. Pass it explicitly from a stream. */
  complete?: boolean;
  /** Records inspected at most; default 400. */
  maxRecords?: number;
  /** The decoder's encoding decision, copied into the profile. */
  encoding?: string | null;
}

/**
 * Decides the layout of an export from its first part.
 * @param sampleText decoded text from the start of the file (about 64 KiB)
 * @throws IngestError EMPTY_FILE, HEADER_ONLY, NO_TIME_COLUMN, NO_VALUE_COLUMNS, DUPLICATE_HEADERS,
 *   RECORD_TOO_LONG (no complete line in the sample)
 */
export function sniffLayout(sampleText: string, options: SniffOptions = {}): LayoutProfile {
  const { text, complete, droppedTail } = completeLines(sampleText, options.complete);
  const notes: string[] = [];
  const questions: LayoutQuestion[] = [];
  let confidence = 1;
  const take = <T extends SniffNotes>(f: T): T => {
    notes.push(...f.notes);
    questions.push(...f.questions);
    confidence *= f.confidence;
    return f;
  };

  const { sep, score, records } = chooseSeparator(text, true, options.maxRecords ?? 400);
  take({ notes: [`Separator ${JSON.stringify(sep)} splits the lines most consistently (score ${fixed(score, 2)}).`], questions: [], confidence: score < 0.9 ? 0.8 : 1 });
  const m = modeCount(records);
  const dataStart = findDataStart(records, m);
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

  const times = take(findTimeColumns(header, data, stats, m, sep));
  const timeCols = times.timeCols;
  const valueIdx = [...Array(m).keys()].filter((j) => !timeCols.includes(j));
  const h = take(findHeaderRows(times.candidates, times.keywordRow, valueIdx, m));
  const { tagRec, unitRec, descRec } = h;
  const evidence = { data, stats, timeCols, valueIdx, m };
  const lay = take(decideLayout(tagRec ? tagRec.fields.map((f) => f.trim()) : [], evidence));
  const nameOf = (j: number) => `${j + 1} ('${(tagRec?.fields[j] ?? '').trim() || `column ${j + 1}`}')`;
  const dec = take(decideNumbers(data, lay.layout === 'long' ? [lay.valueColumn] : valueIdx, sep, nameOf));
  const { time } = take(decideTimeFormat(timeCols, times.numericKind, data));
  const wide = lay.layout === 'wide' ? take(wideColumns(h, evidence)) : null;

  const fingerprintSource = JSON.stringify([
    'lossline-layout-1',
    lay.layout,
    sep,
    m,
    tagRec ? tagRec.fields.map(normaliseHeaderCell) : null,
    unitRec ? unitRec.fields.map(normaliseHeaderCell) : null,
    descRec ? descRec.fields.map(normaliseHeaderCell) : null,
  ]);
  const rowIndex = (r: Rec | null) => (r ? header.indexOf(r) : null);
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
    headerRows: header.map((r) => r.fields.map((f) => f.trim())),
    tagRowIndex: rowIndex(tagRec),
    unitRowIndex: rowIndex(unitRec),
    descriptionRowIndex: rowIndex(descRec),
    columnNames: h.columnNames,
    layout: lay.layout,
    time,
    wide: wide ? wide.wide : null,
    long: lay.layout === 'long' ? longColumns(lay, timeCols) : null,
    ...(dec.columnNumbers.length > 0 ? { columnNumbers: dec.columnNumbers } : {}),
    ...(wide?.quality ? { quality: wide.quality } : {}),
    fingerprint: fnv1a64Hex(fingerprintSource),
    confidence: Math.max(0, Math.min(1, blockingCount > 0 ? Math.min(confidence, 0.5) : confidence)),
    questions,
    notes,
  };
  return LayoutProfileSchema.parse(profile);
}

/**
 * The sample without a byte-order mark and, when it is not the whole file, without its possibly cut
 * last line. Throws EMPTY_FILE, or RECORD_TOO_LONG when an incomplete sample has no line break.
 */
function completeLines(sampleText: string, completeOption: boolean | undefined): { text: string; complete: boolean; droppedTail: number } {
  let text = sampleText.charCodeAt(0) === 0xfeff ? sampleText.slice(1) : sampleText;
  if (text.trim().length === 0) {
    throw new IngestError('EMPTY_FILE', 'The file is empty or holds only blank lines. Export the data again and upload the new file.');
  }
  const complete = completeOption ?? text.length < 60000;
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
    const cut = Math.max(text.lastIndexOf('\n'), text.lastIndexOf('\r'));
    droppedTail = text.length - (cut + 1);
    text = text.slice(0, cut + 1);
  }
  return { text, complete, droppedTail };
}

/**
 * The first data record: data-like and full width, with the next two records holding a date-time
 * in the same column (or, for numeric times, data-like too); -1 when none.
 */
function findDataStart(records: Rec[], m: number): number {
  for (const [i, rec] of records.entries()) {
    if (rec.fields.length !== m || !isDataLike(rec)) continue;
    const dateCol = rec.fields.findIndex((f) => isDateTimeText(f.trim()));
    const ok = records
      .slice(i + 1, i + 3)
      .every((next) => (dateCol >= 0 ? isDateTimeText((next.fields[dateCol] ?? '').trim()) : isDataLike(next)));
    if (ok) return i;
  }
  return -1;
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
      `Line ${fixed((records.at(-1)?.line ?? 0) + 1, 0)} is longer than the first ${fixed((text.length + droppedTail) / 1024, 0)} KiB of the file read to decide its layout, ` +
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
