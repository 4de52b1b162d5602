import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CsvTokenizer, fieldText, IngestError, tokenizeAll } from '../../src/lib/ingest/index';

/** Small deterministic generator (mulberry32) so a failure can be replayed. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function tokenizeChunked(text: string, sep: string, sizes: () => number): { fields: string[]; line: number }[] {
  const out: { fields: string[]; line: number }[] = [];
  const t = new CsvTokenizer(sep, (rec) => {
    const fields: string[] = [];
    for (let i = 0; i < rec.count; i++) fields.push(fieldText(rec, i));
    out.push({ fields, line: rec.line });
  });
  let o = 0;
  while (o < text.length) {
    const n = Math.max(1, sizes());
    t.push(text.slice(o, o + n));
    o += n;
  }
  t.end();
  return out;
}

describe('CsvTokenizer', () => {
  it('agrees with papaparse on random quoted CSV, whatever the chunk sizes', () => {
    const r = rng(20240305);
    const alphabet = ['a', 'B', '1', '.', ',', ';', '\t', '|', ' ', '"', '\n', '\r\n', '°', 'x'];
    for (let round = 0; round < 300; round++) {
      const sep = [',', ';', '\t', '|'][round % 4];
      const newline = round % 3 === 0 ? '\r\n' : '\n';
      const rows: string[][] = [];
      const nRows = 1 + Math.floor(r() * 6);
      const nCols = 2 + Math.floor(r() * 4);
      for (let i = 0; i < nRows; i++) {
        const row: string[] = [];
        for (let j = 0; j < nCols; j++) {
          let f = '';
          const len = Math.floor(r() * 6);
          for (let k = 0; k < len; k++) f += alphabet[Math.floor(r() * alphabet.length)];
          row.push(f);
        }
        rows.push(row);
      }
      const text = rows
        .map((row) =>
          row
            .map((f) => (/["\r\n]/.test(f) || f.includes(sep) || r() < 0.2 ? `"${f.replace(/"/g, '""')}"` : f))
            .join(sep),
        )
        .join(newline) + (r() < 0.5 ? newline : '');
      const expected = Papa.parse<string[]>(text, { delimiter: sep, newline, quoteChar: '"' }).data.filter(
        (row) => !(row.length === 1 && row[0] === ''),
      );
      const whole = tokenizeAll(text, sep).map((x) => x.fields);
      const chunked = tokenizeChunked(text, sep, () => 1 + Math.floor(r() * 7)).map((x) => x.fields);
      expect(whole, `round ${round}: ${JSON.stringify(text)}`).toEqual(expected);
      expect(chunked, `round ${round} chunked: ${JSON.stringify(text)}`).toEqual(expected);
      expect(expected).toEqual(rows); // the generator's own rows, as a third opinion
    }
  });

  it('numbers records by their physical start line, counting line breaks inside quotes', () => {
    const text = 'a,b\n"x\ny",2\n\nc,"3\r\n4"\r\nlast,5';
    const recs = tokenizeChunked(text, ',', () => 2);
    expect(recs.map((x) => x.line)).toEqual([1, 2, 5, 7]);
    expect(recs[1].fields).toEqual(['x\ny', '2']);
    expect(recs[2].fields).toEqual(['c', '3\r\n4']);
    expect(recs[3].fields).toEqual(['last', '5']);
  });

  it('ends records at a lone CR too', () => {
    expect(tokenizeAll('a;b\rc;d\r', ';').map((x) => x.fields)).toEqual([
      ['a', 'b'],
      ['c', 'd'],
    ]);
  });

  it('keeps text after a closing quote and counts the field as malformed', () => {
    const recs: string[][] = [];
    const t = new CsvTokenizer(',', (rec) => recs.push([fieldText(rec, 0), fieldText(rec, 1)]));
    t.push('"ab"cd,2\n');
    t.end();
    expect(recs).toEqual([['abcd', '2']]);
    expect(t.malformedQuoteCount).toBe(1);
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

  it('also stops a too-long record that arrives in one piece', () => {
    const t = new CsvTokenizer(',', () => {}, { maxRecordChars: 1000 });
    expect(() => t.push('a,' + 'y'.repeat(5000) + '\nb,c\n')).toThrow(/longer than 1000 characters/);
  });

  it('reports a quote never closed at the end of the file', () => {
    const t = new CsvTokenizer(',', () => {});
    t.push('a,b\n1,"open\n2,3\n');
    let code = '';
    try {
      t.end();
    } catch (e) {
      code = (e as IngestError).code;
    }
    expect(code).toBe('UNTERMINATED_QUOTE');
  });
});
