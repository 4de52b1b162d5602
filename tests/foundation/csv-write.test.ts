import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvLine, toCsv } from '~/lib/csv-write';

/** Reads CSV back as a spreadsheet would (quotes undone). */
const read = (csv: string) => Papa.parse<string[]>(csv.replace(/\r\n$/, ''), { newline: '\r\n' }).data;

describe('CSV writer (Papa.unparse with formula escaping)', () => {
  it('writes a text a spreadsheet would run as a formula as text, with a leading apostrophe', () => {
    const evil = ['=1+2', '+SUM(A1)', '-2+3', '@SUM(1+1)', '\tx', '=HYPERLINK("http://x","y")'];
    const [row] = read(toCsv([evil]));
    expect(row).toEqual(evil.map((c) => `'${c}`));
  });

  it('keeps numbers, negative ones and decimal numbers written as text, as numbers', () => {
    expect(csvLine([-3.5, '-3.5', '-2.00', '12', 0])).toBe('-3.5,-3.5,-2.00,12,0');
    // a decimal number followed by anything else is not a number
    expect(read(toCsv([['-3.5+1', '-1e3']]))[0]).toEqual(["'-3.5+1", "'-1e3"]);
  });

  it('quotes cells with a comma, quote, line break or semicolon; empty for null; CR LF after every record', () => {
    const csv = toCsv([['a,b', 'say "hi"', 'two\nlines', 'x; y', null, undefined, true], [], ['end']]);
    expect(csv).toBe('"a,b","say ""hi""","two\nlines","x; y",,,true\r\n\r\nend\r\n');
    expect(read(csv)[0]).toEqual(['a,b', 'say "hi"', 'two\nlines', 'x; y', '', '', 'true']);
  });

  it('writes nothing for no rows and a record without its line end for csvLine', () => {
    expect(toCsv([])).toBe('');
    expect(csvLine([])).toBe('');
    expect(csvLine(['unit', 'kind'])).toBe('unit,kind');
  });
});
