import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CsvTokenizer, IngestError, tokenizeAll } from '~/lib/ingest/index';
import type { CsvTokenizerOptions } from '~/lib/ingest/index';
import { draws, runs } from '../support/random';
import { at } from '../support/present';

interface Rec {
  fields: string[];
  line: number;
}

/** A tokenizer that collects copies of its records. */
function collector(sep: string, options: CsvTokenizerOptions = {}): { t: CsvTokenizer; recs: Rec[] } {
  const recs: Rec[] = [];
  const t = new CsvTokenizer(sep, (rec) => recs.push({ fields: rec.fields.slice(0, rec.count), line: rec.line }), options);
  return { t, recs };
}

/** Feeds the pieces one by one, each parsed before the next arrives (flush), then ends the file. */
function tokenizePieces(pieces: string[], sep: string): { recs: Rec[]; malformed: number } {
  const { t, recs } = collector(sep);
  for (const p of pieces) {
    t.push(p);
    t.flush();
  }
  t.end();
  return { recs, malformed: t.malformedQuoteCount };
}

function tokenizeChunked(text: string, sep: string, sizes: () => number): Rec[] {
  const pieces: string[] = [];
  for (let o = 0; o < text.length; ) {
    const n = Math.max(1, sizes());
    pieces.push(text.slice(o, o + n));
    o += n;
  }
  return tokenizePieces(pieces, sep).recs;
}

/** Every cut of the text into two pieces, and the text one character at a time. */
function everySplit(text: string): string[][] {
  const out: string[][] = [];
  for (let cut = 0; cut <= text.length; cut++) out.push([text.slice(0, cut), text.slice(cut)]);
  out.push([...text]);
  return out;
}

function codeOf(f: () => void): string {
  try {
    f();
  } catch (e) {
    return e instanceof IngestError ? e.code : String(e);
  }
  return 'none';
}

describe('CsvTokenizer (papaparse underneath)', () => {
  it.each([',', ';', '\t', '|'])('quoted separators, doubled quotes and line breaks, cut at every position (separator %j)', (s) => {
    const text =
      `Time${s}"B1.FT-101${s} steam"${s}"Note ""A"""\r\n` +
      `2024-03-05 10:00:00${s}"1${s}5"${s}"two\nlines"\r\n` +
      `"2024-03-05 10:01:00"${s}${s}"x\r\ny"\n` +
      `\n` +
      `2024-03-05 10:02:00${s}""${s}""""\n` +
      `2024-03-05 10:03:00${s}7${s}"end"`;
    const expected: Rec[] = [
      { line: 1, fields: ['Time', `B1.FT-101${s} steam`, 'Note "A"'] },
      { line: 2, fields: ['2024-03-05 10:00:00', `1${s}5`, 'two\nlines'] },
      { line: 4, fields: ['2024-03-05 10:01:00', '', 'x\r\ny'] },
      { line: 7, fields: ['2024-03-05 10:02:00', '', '"'] },
      { line: 8, fields: ['2024-03-05 10:03:00', '7', 'end'] },
    ];
    expect(tokenizeAll(text, s)).toEqual(expected);
    for (const pieces of everySplit(text)) {
      const got = tokenizePieces(pieces, s);
      expect(got.recs, JSON.stringify(pieces)).toEqual(expected);
      expect(got.malformed).toBe(0);
    }
  });

  it('a quoted field that is the last of its line, with CR LF after it, cut at every position', () => {
    const text = 'a,"b"\r\n"c\r\n","d"\r\ne,f\r\n';
    const expected: Rec[] = [
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['c\r\n', 'd'] },
      { line: 4, fields: ['e', 'f'] },
    ];
    for (const pieces of everySplit(text)) expect(tokenizePieces(pieces, ',').recs, JSON.stringify(pieces)).toEqual(expected);
    // a file cut after the CR of its last CR LF
    const cut = 'a,"b"\r\nc,"d"\r';
    for (const pieces of everySplit(cut)) {
      expect(tokenizePieces(pieces, ',').recs, JSON.stringify(pieces)).toEqual([
        { line: 1, fields: ['a', 'b'] },
        { line: 2, fields: ['c', 'd'] },
      ]);
    }
  });

  it('random records survive quoting and any chunking, also across the 64 KiB pieces of one big push', () => {
    const alphabet = ['a', 'B', '1', '.', ',', ';', '\t', '|', ' ', '"', '\n', '\r\n', '°', 'x', '""'];
    let bigRounds = 0;
    fc.assert(
      fc.property(fc.noBias(fc.nat(59)), draws(4096), (round, { next: r }) => {
        const sep = at([',', ';', '\t', '|'], round % 4, 'separators');
        const newline = round % 3 === 0 ? '\r\n' : '\n';
        const big = round % 13 === 0;
        const nRows = big ? 30000 : 1 + Math.floor(r() * 8);
        const nCols = 2 + Math.floor(r() * 4);
        const expected: Rec[] = [];
        const lines: string[] = [];
        let line = 1;
        for (let i = 0; i < nRows; i++) {
          const fields: string[] = [];
          for (let j = 0; j < nCols; j++) {
            let f = '';
            const len = Math.floor(r() * 7);
            for (let k = 0; k < len; k++) f += alphabet[Math.floor(r() * alphabet.length)];
            fields.push(f);
          }
          expected.push({ fields, line });
          line += 1 + fields.reduce((n, f) => n + f.split('\n').length - 1, 0);
          lines.push(fields.map((f) => (/["\r\n]/.test(f) || f.includes(sep) || r() < 0.2 ? `"${f.replace(/"/g, '""')}"` : f)).join(sep));
        }
        const text = lines.join(newline) + (r() < 0.5 ? newline : '');
        if (big) expect(text.length).toBeGreaterThan(3 * 65536);
        expect(tokenizeAll(text, sep), `round ${round} whole`).toEqual(expected);
        const max = big ? 5000 : 7;
        expect(tokenizeChunked(text, sep, () => 1 + Math.floor(r() * max)), `round ${round} chunked: ${big ? '' : JSON.stringify(text)}`).toEqual(expected);
        if (big) bigRounds++;
      }),
      runs(20240305, 60),
    );
    // the 64 KiB pieces of one big push were exercised
    expect(bigRounds).toBeGreaterThan(0);
  });

  it('numbers records by their physical start line, counting line breaks inside quotes; LF and CR LF may mix', () => {
    const text = 'a,b\n"x\ny",2\n\nc,"3\r\n4"\r\nlast,5';
    const recs = tokenizeChunked(text, ',', () => 2);
    expect(recs.map((x) => x.line)).toEqual([1, 2, 5, 7]);
    expect(at(recs, 1, 'records').fields).toEqual(['x\ny', '2']);
    expect(at(recs, 2, 'records').fields).toEqual(['c', '3\r\n4']);
    expect(at(recs, 3, 'records').fields).toEqual(['last', '5']);
  });

  it('numbers lines right when the end of the file parses several records at once', () => {
    const { t, recs } = collector(',');
    t.push('h,' + 'x'.repeat(100)); // no line break yet: held
    t.push('\n"a\nb",1\nc,2\n'); // shorter than what is held: waits for the end
    expect(recs).toEqual([]);
    t.end();
    expect(recs).toEqual([
      { line: 1, fields: ['h', 'x'.repeat(100)] },
      { line: 2, fields: ['a\nb', '1'] },
      { line: 4, fields: ['c', '2'] },
    ]);
  });

  it('ends records at a lone CR too, when the file breaks its lines that way', () => {
    const expected: Rec[] = [
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['c', 'd'] },
      { line: 4, fields: ['e', 'f\rg'] },
    ];
    const text = 'a;b\rc;d\r\re;"f\rg"\r';
    expect(tokenizeAll(text, ';')).toEqual(expected);
    for (const pieces of everySplit(text)) expect(tokenizePieces(pieces, ';').recs, JSON.stringify(pieces)).toEqual(expected);
  });

  it('skips empty lines but keeps lines of blank fields', () => {
    expect(tokenizeAll('\n\r\na,b\n\n,\n \n', ',')).toEqual([
      { line: 3, fields: ['a', 'b'] },
      { line: 5, fields: ['', ''] },
      { line: 6, fields: [' '] },
    ]);
  });

  it('keeps text after a closing quote and counts the field as malformed', () => {
    const recs: (string | undefined)[][] = [];
    const t = new CsvTokenizer(',', (rec) => recs.push([rec.fields[0], rec.fields[1]]));
    t.push('"ab"cd,2\n');
    t.end();
    expect(recs).toEqual([['abcd', '2']]);
    expect(t.malformedQuoteCount).toBe(1);
  });

  it('text after a closing quote ends at the next separator, not at a later quote, wherever the text is cut', () => {
    const text = 'a,b\n"12"5,"x"y z,3\n"ok",4\n"q""r"s,"t"\n"m\nn"o,"1"2,"3"4\r\n"p",5\n"u"  ,"v"w,';
    const expected: Rec[] = [
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['125', 'xy z', '3'] },
      { line: 3, fields: ['ok', '4'] },
      { line: 4, fields: ['q"rs', 't'] },
      { line: 5, fields: ['m\nno', '12', '34'] },
      { line: 7, fields: ['p', '5'] },
      { line: 8, fields: ['u', 'vw', ''] },
    ];
    expect(tokenizeAll(text, ',')).toEqual(expected);
    for (const pieces of everySplit(text)) {
      const got = tokenizePieces(pieces, ',');
      expect(got.recs, JSON.stringify(pieces)).toEqual(expected);
      expect(got.malformed, JSON.stringify(pieces)).toBe(7);
    }
    for (const pieces of everySplit('"u"  ')) expect(tokenizePieces(pieces, ',')).toEqual({ recs: [{ line: 1, fields: ['u  '] }], malformed: 1 });
  });

  // Its speed (linear in the number of such fields) is measured by bench/ingest-core.ts, not here.
  it('a record of many fields with text after the closing quote: every record intact, each field counted once', () => {
    let text = '';
    const expected: Rec[] = [];
    for (let i = 0; i < 300; i++) {
      let line = `t${i}`;
      const fields = [line];
      for (let j = 0; j < 200; j++) {
        line += `;"${j}"${i}`;
        fields.push(`${j}${i}`);
      }
      text += line + '\n';
      expected.push({ line: i + 1, fields });
    }
    const { t, recs } = collector(';');
    for (let o = 0; o < text.length; o += 65536) t.push(text.slice(o, o + 65536));
    t.end();
    expect(recs).toEqual(expected);
    expect(t.malformedQuoteCount).toBe(60_000);
  });

  it('many malformed fields in one big push: every record intact, each field counted once', () => {
    let text = 'Time;A;B\n';
    const expected: Rec[] = [{ line: 1, fields: ['Time', 'A', 'B'] }];
    let bad = 0;
    for (let i = 0; i < 20000; i++) {
      const time = `2024-03-05 ${i}`;
      if (i % 3 === 0) {
        text += `${time};"${i}"5;"ok ${i}"\n`;
        expected.push({ line: i + 2, fields: [time, `${i}5`, `ok ${i}`] });
        bad++;
      } else {
        text += `${time};${i};"x;${i}"\n`;
        expected.push({ line: i + 2, fields: [time, String(i), `x;${i}`] });
      }
    }
    const { t, recs } = collector(';');
    t.push(text);
    t.end();
    expect(recs).toEqual(expected);
    expect(t.malformedQuoteCount).toBe(bad);
  });

  it('spaces between a closing quote and the separator are dropped (papaparse rule), not malformed', () => {
    const { t, recs } = collector(',');
    t.push('"a"  ,b\n"c" \n');
    t.end();
    expect(recs).toEqual([
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['c'] },
    ]);
    expect(t.malformedQuoteCount).toBe(0);
  });

  it('gives only complete records while the file goes on, and the rest at the end', () => {
    const { t, recs } = collector(',');
    t.push('a,b\nc,"d\ne"\nf,');
    t.flush();
    expect(recs).toEqual([
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['c', 'd\ne'] },
    ]);
    expect(t.currentLine).toBe(4);
    t.push('g');
    t.end();
    expect(recs[2]).toEqual({ line: 4, fields: ['f', 'g'] });
    expect(tokenizeAll('a,b\nc,"d\n', ',', { final: false })).toEqual([{ line: 1, fields: ['a', 'b'] }]);
  });

  it('stops a record longer than the limit with a clear error instead of growing without bound', () => {
    const t = new CsvTokenizer(',', () => {}, { maxRecordChars: 1_048_576 });
    t.push('Time,B1.FT-101\n2024-03-05 10:00:00,1\n');
    let error: unknown = null;
    try {
      const piece = 'x'.repeat(65536);
      for (let i = 0; i < 40; i++) t.push(piece); // 2.6 million characters without a line break
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(IngestError);
    expect((error as IngestError).code).toBe('RECORD_TOO_LONG');
    expect((error as IngestError).line).toBe(3);
    expect((error as IngestError).message).toContain('line 3');
  });

  it('a quote left open over many lines is a too-long record as soon as the carried text passes the limit', () => {
    const max = 200_000;
    const t = new CsvTokenizer(',', () => {}, { maxRecordChars: max });
    t.push('a,b\n1,2\n3,"open\n');
    const piece = ('y'.repeat(99) + '\n').repeat(160); // 16 000 characters, line breaks inside the quote
    let pushed = 0;
    let error: IngestError | null = null;
    try {
      for (let i = 0; i < 100; i++) {
        t.push(piece);
        pushed += piece.length;
      }
    } catch (e) {
      error = e as IngestError;
    }
    expect(error?.code).toBe('RECORD_TOO_LONG');
    expect(error?.line).toBe(3);
    expect(pushed).toBeLessThanOrEqual(max + piece.length);
  });

  it('also stops a too-long record that arrives in one piece', () => {
    const t = new CsvTokenizer(',', () => {}, { maxRecordChars: 1000 });
    expect(() => t.push('a,' + 'y'.repeat(5000) + '\nb,c\n')).toThrow(/longer than 1000 characters/);
    const short = new CsvTokenizer(',', () => {}, { maxRecordChars: 1000 });
    const many = 'a,b\n'.repeat(10_000); // 40 000 characters of short records are fine
    short.push(many);
    short.end();
    expect(short.recordCount).toBe(10_000);
  });

  it('reports a quote never closed at the end of the file, with the line it opened on', () => {
    const t = new CsvTokenizer(',', () => {});
    t.push('a,b\n1,2\n"x\ny",3\n4,"open\n2,3\n');
    let error: IngestError | null = null;
    try {
      t.end();
    } catch (e) {
      error = e as IngestError;
    }
    expect(error?.code).toBe('UNTERMINATED_QUOTE');
    expect(error?.line).toBe(5);
    expect(codeOf(() => tokenizeAll('a,"b', ','))).toBe('UNTERMINATED_QUOTE');
    expect(codeOf(() => tokenizeAll('a,"b"', ','))).toBe('none');
  });

  it('refuses a separator that cannot be one', () => {
    for (const sep of ['"', '\n', '\r', ';;', '']) expect(codeOf(() => new CsvTokenizer(sep, () => {})), JSON.stringify(sep)).toBe('INVALID_OPTIONS');
  });
});
