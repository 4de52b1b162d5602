/**
 * Every CSV the product writes goes through here: Papa.unparse with its formula escaping, CR LF line
 * ends (RFC 4180, as spreadsheets expect) and a final line end.
 *
 * Formula escaping (CSV injection): a text cell that starts with = + - @ TAB or CR gets a leading
 * apostrophe and quotes, so a spreadsheet shows it as text instead of running it. The pattern is
 * Papa's own (what `escapeFormulae: true` uses) with one exception: a plain decimal number written as
 * text ('-2.00', fixed decimals kept) stays a number. JavaScript numbers are never escaped.
 */
import Papa from 'papaparse';

/** Papa's formula starts (escapeFormulae: true), except a plain decimal number such as -2.00. */
export const CSV_FORMULA_START = /^(?!-?\d+(\.\d+)?$)[=+\-@\t\r]/;

/** A cell: text, a number (written as JavaScript prints it), a boolean; null and undefined are empty. */
export type CsvCell = string | number | boolean | null | undefined;

/**
 * Rows of cells as CSV text (a row of no cells is a blank line). Cells with a delimiter, quote, line
 * break or ';' (the delimiter of spreadsheets set to a comma-decimal locale) are quoted.
 */
export function toCsv(rows: readonly (readonly CsvCell[])[]): string {
  if (!rows.length) return '';
  const text = Papa.unparse(rows as CsvCell[][], {
    newline: '\r\n',
    escapeFormulae: CSV_FORMULA_START,
    quotes: (value: unknown) => typeof value === 'string' && value.includes(';'),
  });
  return text + '\r\n';
}

/** One row as one CSV record, without its line end (for writers that stream records). */
export function csvLine(cells: readonly CsvCell[]): string {
  return cells.length ? toCsv([cells]).slice(0, -2) : '';
}
