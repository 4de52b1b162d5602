/**
 * Streaming CSV records through papaparse's own streaming parser (`Papa.Parser`), the way its chunk
 * streamers use it: each piece of text is parsed with `ignoreLastRow`, complete rows are handed on
 * and the unparsed rest (from `meta.cursor`) is carried into the next piece. papaparse picks its fast
 * path (plain splits) by itself for pieces without a quote character.
 *
 * What this wrapper adds around papaparse:
 * - Line breaks: LF, CR LF and a lone CR. The file's break is decided once one is seen outside quoted
 *   fields, from at most the first 64 KiB: a lone CR when lone CRs outnumber LFs, otherwise LF. With
 *   LF, one CR at the end of a record is removed (even inside quotes), so LF and CR LF lines may mix.
 * - Completely empty lines are skipped; every record carries the 1-based physical line it starts on
 *   (line breaks inside quoted fields count).
 * - Text after a closing quote (`"12"5`): papaparse reports it (InvalidQuotes) and would run the
 *   quoted field on to a later quote. Here the field ends at the next separator or line break, as
 *   before: its text is kept with lone quotes dropped (`"12"5` -> `125`) and counted in
 *   `malformedQuoteCount`. papaparse reads the record's fields before it, the wrapper keeps them and
 *   papaparse goes on after the field, in small pieces at first (so each such field costs only the
 *   text since the last one).
 * - Memory: text is parsed in pieces of at most 64 KiB, and the carried rest of an unfinished record
 *   may not exceed `maxRecordChars` (RECORD_TOO_LONG), so a single enormous line (or a quote never
 *   closed) stops early instead of being buffered. A quote still open at the end of the file is
 *   UNTERMINATED_QUOTE.
 * - Quoted fields may have spaces between the closing quote and the separator (papaparse's rule);
 *   the spaces are dropped.
 */
import Papa from 'papaparse';
import { IngestError } from './errors';

const LF = 10;
const CR = 13;
const QUOTE = 34;

/** Text parsed per papaparse call at most [characters]. */
const WINDOW = 65536;
/** Text per call right after a field with text after its closing quote, doubling back up to WINDOW
 *  (papaparse reads on to the end of its input after such a field, so this bounds the work). */
const SMALL_WINDOW = 64;
/** Text looked at to decide the line break [characters]. */
const NEWLINE_PROBE = 65536;

/** One record, valid only during the callback. */
export interface CsvRecord {
  /** Field texts: quotes removed and "" unescaped. */
  fields: string[];
  /** fields.length. */
  count: number;
  /** 1-based physical line where the record starts. */
  line: number;
}

export interface CsvTokenizerOptions {
  /** Longest record accepted [characters]; default 1 048 576. */
  maxRecordChars?: number;
}

/** The text of field `i` ('' past the end of the record). */
export function fieldText(rec: CsvRecord, i: number): string {
  return i < rec.count ? (rec.fields[i] ?? '') : '';
}

interface PapaError {
  code: string;
  row: number;
  index: number;
}

interface PapaResult {
  data: string[][];
  errors: PapaError[];
  meta: { cursor: number };
}

/** Lone quotes dropped, "" read as one quote: the text of a field with text after its closing quote. */
function unquoteMalformed(s: string): string {
  return s.replace(/"("?)/g, '$1');
}

function countChar(s: string, ch: string, from: number, to: number): number {
  let n = 0;
  for (let i = s.indexOf(ch, from); i >= 0 && i < to; i = s.indexOf(ch, i + 1)) n++;
  return n;
}

export class CsvTokenizer {
  private readonly sep: string;
  private readonly onRecord: (rec: CsvRecord) => void;
  private readonly maxRecordChars: number;
  private parser: Papa.Parser | null = null;
  private newline: '\n' | '\r' = '\n';
  /** Unparsed text from the start of the next record (or the rest of `partial`'s); it starts on `line`. */
  private carry = '';
  /** Pushed text not parsed yet. */
  private pending = '';
  private window = WINDOW;
  /** Set when feed() stopped early after re-quoting a field. */
  private repaired = false;
  private line = 1;
  /** Fields of a record read up to a field with text after its closing quote; the rest is in carry. */
  private partial: string[] | null = null;
  private partialLine = 0;
  private partialChars = 0;
  private readonly rec: CsvRecord = { fields: [], count: 0, line: 1 };
  /** Records handed out so far. */
  recordCount = 0;
  /** Fields that had text after their closing quote. */
  malformedQuoteCount = 0;

  constructor(separator: string, onRecord: (rec: CsvRecord) => void, options: CsvTokenizerOptions = {}) {
    if (separator.length !== 1 || separator === '"' || separator === '\n' || separator === '\r' || separator === '\ufeff') {
      throw new IngestError('INVALID_OPTIONS', `The separator must be one character other than a quote or line break, got ${JSON.stringify(separator)}.`);
    }
    this.sep = separator;
    this.onRecord = onRecord;
    this.maxRecordChars = options.maxRecordChars ?? 1_048_576;
  }

  /** Physical line number the next record will start on. */
  get currentLine(): number {
    return this.partial ? this.partialLine : this.line;
  }

  push(chunk: string): void {
    if (chunk.length === 0) return;
    this.pending = this.pending.length ? this.pending + chunk : chunk;
    // parse once the new text is as long as the carried rest (so a long record is not parsed again
    // for every small push), or when together they exceed the record limit
    const waiting = this.pending.length;
    if (waiting >= this.carry.length || waiting + this.carry.length > this.maxRecordChars) this.drain(false);
  }

  /** Hands on every complete record pushed so far (a push may otherwise wait for more text). */
  flush(): void {
    if (this.pending.length > 0) this.drain(false);
  }

  /** Processes what is left; the last record may lack a line break. */
  end(): void {
    this.drain(true);
    if (this.partial) {
      // the file ends with a separator after a field with text after its closing quote: one more empty field
      this.partial.push('');
      this.emit(this.partial, this.partialLine);
      this.partial = null;
      this.partialChars = 0;
    }
  }

  private tooLong(length: number, line: number): never {
    throw new IngestError(
      'RECORD_TOO_LONG',
      `The record starting on line ${line} is longer than ${this.maxRecordChars} characters (${length} read so far). ` +
        'Either the file is not a CSV export, the separator is wrong, or a quote is never closed. Check the export settings.',
      { line, length, maxRecordChars: this.maxRecordChars },
      line,
    );
  }

  /** The unfinished record (carry, and partial fields) may not exceed the limit. */
  private checkCarry(): void {
    const length = this.carry.length + this.partialChars;
    if (length > this.maxRecordChars) this.tooLong(length, this.partial ? this.partialLine : this.line);
  }

  /**
   * LF or a lone CR, from the text so far outside quoted fields: LF unless lone CRs outnumber LFs.
   * Null while no line break outside quotes is seen yet (and the file goes on).
   */
  private decideNewline(text: string, final: boolean): '\n' | '\r' | null {
    let s = text.length > NEWLINE_PROBE ? text.slice(0, NEWLINE_PROBE) : text;
    s = s.replace(/"[^"]*"/g, '');
    const open = s.indexOf('"');
    const cut = open >= 0;
    if (cut) s = s.slice(0, open);
    const lf = countChar(s, '\n', 0, s.length);
    let lone = 0;
    for (let i = s.indexOf('\r'); i >= 0; i = s.indexOf('\r', i + 1)) {
      if (i + 1 < s.length ? s.charCodeAt(i + 1) !== LF : final && !cut) lone++;
    }
    if (lf === 0 && lone === 0 && !final && text.length < NEWLINE_PROBE) return null;
    return lone > lf ? '\r' : '\n';
  }

  private drain(final: boolean): void {
    let text = this.pending;
    this.pending = '';
    if (!this.parser) {
      const probe = this.carry + text;
      const nl = this.decideNewline(probe, final);
      if (nl === null) {
        this.carry = probe;
        this.checkCarry();
        return;
      }
      this.newline = nl;
      this.parser = new Papa.Parser({ delimiter: this.sep, newline: nl, quoteChar: '"' });
      this.carry = '';
      text = probe;
    }
    // a CR as the very last character ends the last line (papaparse would keep it in a quoted field's tail)
    if (final && this.newline === '\n') {
      const last = text.length ? text : this.carry;
      if (last.length && last.charCodeAt(last.length - 1) === CR) text += '\n';
    }
    const n = text.length;
    if (n === 0 && !final) return;
    let o = 0;
    for (;;) {
      const size = Math.min(this.window, n - o);
      this.repaired = false;
      o += this.feed(text, o, size, final && o + size >= n);
      if (!this.repaired && this.window < WINDOW) this.window *= 2;
      if (o >= n && !this.repaired) break;
    }
  }

  /**
   * Parses carry + text[o, o + size), hands on the complete records and keeps the rest as carry.
   * Returns the characters of text used: all of them, or fewer when a field was re-read (then
   * `repaired` is set and the caller feeds the rest again).
   */
  private feed(text: string, o: number, size: number, final: boolean): number {
    const piece = o === 0 && size === text.length ? text : text.slice(o, o + size);
    const carryLength = this.carry.length;
    const input = carryLength ? this.carry + piece : piece;
    const parser = this.parser!;
    const res = parser.parse(input, 0, !final) as PapaResult;
    const rows = res.data.length;
    const errors = res.errors;
    const checkLength = input.length + this.partialChars > this.maxRecordChars;
    const first = errors[0];
    if (first !== undefined) {
      if (first.code === 'InvalidQuotes') {
        const used = this.requote(input, first.index - 1, carryLength, final);
        if (used >= 0) return used;
      }
      for (const e of errors) {
        if (e.code === 'MissingQuotes') {
          const lineAtStart = this.line;
          this.deliver(res.data, e.row, false, checkLength);
          const quoteLine = lineAtStart + countChar(input, this.newline, 0, e.index - 1);
          throw new IngestError(
            'UNTERMINATED_QUOTE',
            `A quoted field opened on line ${quoteLine} is never closed before the end of the file. ` +
              'Check that the export quotes fields consistently.',
            { line: quoteLine },
            quoteLine,
          );
        }
        // a quote followed by a line break of the other kind, read papaparse's way
        if (e.code === 'InvalidQuotes' && e.row < rows) this.malformedQuoteCount++;
      }
    }
    const cursor = res.meta.cursor;
    // one physical line per record unless quoted fields hold line breaks: every record papaparse
    // gives ends with a line break, except the last one at the end of the file
    const oneLineEach = rows === 0 || input.indexOf('"') < 0 || countChar(input, this.newline, 0, cursor) === (final ? rows - 1 : rows);
    this.deliver(res.data, rows, oneLineEach, checkLength);
    this.carry = cursor === 0 ? input : cursor >= input.length ? '' : input.slice(cursor);
    this.checkCarry();
    return size;
  }

  /**
   * A quoted field opening at q0 has text after its closing quote. When the field's end (the next
   * separator or line break) is in the input, hands on the records before it, keeps the fields of
   * its record so far (this field read with the old rule) as `partial`, carries the text after it
   * and returns the characters of the current piece used; returns -1 to read the input as papaparse
   * did. Each such field costs the text from the previous one, not the whole record again.
   */
  private requote(input: string, q0: number, carryLength: number, final: boolean): number {
    let close = -1;
    for (let j = q0 + 1; ; ) {
      const q = input.indexOf('"', j);
      if (q < 0) break;
      if (q + 1 < input.length && input.charCodeAt(q + 1) === QUOTE) {
        j = q + 2;
        continue;
      }
      close = q;
      break;
    }
    if (close < 0) return -1;
    let end = input.length;
    for (const ch of [this.sep, '\n', '\r']) {
      const i = input.indexOf(ch, close + 1);
      if (i >= 0 && i < end) end = i;
    }
    if (end === input.length && !final) return -1; // the field may go on in the next piece: papaparse carries it
    // only spaces before a line break of the other kind (a lone CR in an LF file): read papaparse's way
    if (end < input.length && input.slice(close + 1, end).trim().length === 0) return -1;
    // papaparse reads the text before the quote: whole records, then this record's fields so far
    // (the last one empty: the field the quote opens)
    const before = this.parser!.parse(input.slice(0, q0), 0, false) as PapaResult;
    const rows = before.data;
    const fields = rows.length > 0 ? rows.pop()! : [''];
    this.deliver(rows, rows.length, false, true);
    fields[fields.length - 1] = unquoteMalformed(input.slice(q0 + 1, end));
    if (this.partial) for (const f of fields) this.partial.push(f);
    else {
      this.partial = fields;
      this.partialLine = this.line;
    }
    const nl = this.newline;
    for (const f of fields) {
      this.partialChars += f.length + 1;
      if (f.length > 0) this.line += countChar(f, nl, 0, f.length);
    }
    this.malformedQuoteCount++;
    let next = end;
    if (end < input.length && input.charCodeAt(end) === this.sep.charCodeAt(0)) next = end + 1;
    else {
      // the record ends with this field; its line break comes next in the carry
      this.emit(this.partial, this.partialLine);
      this.partial = null;
      this.partialChars = 0;
    }
    this.carry = next < carryLength ? input.slice(next, carryLength) : '';
    this.checkCarry();
    this.window = SMALL_WINDOW;
    this.repaired = true;
    return Math.max(0, next - carryLength);
  }

  /**
   * Hands on rows [0, count): removes a CR before LF, skips empty lines, numbers lines (counting line
   * breaks inside fields unless `oneLineEach`), joins the first row to `partial` fields.
   */
  private deliver(data: string[][], count: number, oneLineEach: boolean, checkLength: boolean): void {
    const nl = this.newline;
    const stripCR = nl === '\n';
    const end = Math.min(count, data.length);
    for (let r = 0; r < end; r++) {
      let row = data[r]!;
      const n = row.length;
      let line = this.line;
      this.line++;
      if (!oneLineEach) for (const f of row) if (f.length > 0) this.line += countChar(f, nl, 0, f.length);
      if (stripCR) {
        const f = row[n - 1];
        if (f !== undefined && f.length > 0 && f.charCodeAt(f.length - 1) === CR) row[n - 1] = f.slice(0, -1);
      }
      if (this.partial) {
        row = this.partial.concat(row);
        line = this.partialLine;
        this.partial = null;
        this.partialChars = 0;
      } else if (n === 1 && row[0] === '') continue;
      if (checkLength) {
        let length = row.length - 1;
        for (const f of row) length += f.length;
        if (length > this.maxRecordChars) this.tooLong(length, line);
      }
      this.emit(row, line);
    }
  }

  private emit(fields: string[], line: number): void {
    const rec = this.rec;
    rec.fields = fields;
    rec.count = fields.length;
    rec.line = line;
    this.recordCount++;
    this.onRecord(rec);
  }
}

/** Tokenizes a whole string into arrays of field texts (sniffing, previews, tests). */
export function tokenizeAll(
  text: string,
  separator: string,
  options: CsvTokenizerOptions & { maxRecords?: number; final?: boolean } = {},
): { fields: string[]; line: number }[] {
  const out: { fields: string[]; line: number }[] = [];
  const maxRecords = options.maxRecords ?? Infinity;
  const stop = {};
  const t = new CsvTokenizer(
    separator,
    (rec) => {
      out.push({ fields: rec.fields, line: rec.line });
      if (out.length >= maxRecords) throw stop;
    },
    options,
  );
  try {
    t.push(text);
    if (options.final !== false) t.end();
    else t.flush();
  } catch (e) {
    if (e !== stop) throw e;
  }
  return out;
}
