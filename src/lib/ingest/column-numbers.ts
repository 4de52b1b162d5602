/**
 * Number formats per column for quoted cells of a comma-separated file.
 *
 * In a file whose fields are separated by commas, a cell holding a comma can only have been quoted
 * (spreadsheets save formatted numbers that way: "10,954.58", "4,812,373.94"). Such cells keep their
 * own format, decided per column from its cells that hold a comma:
 * - comma thousands groups with a decimal point ("10,954.58") or two or more groups
 *   ("4,812,373"): thousands ',' and decimal '.';
 * - a decimal comma that cannot be a thousands group ("12,5", "0,125", "1.234,56"): decimal ','
 *   (thousands '.' when point groups are seen);
 * - nothing but one group of exactly three digits ("1,234"): either reading fits, so the column
 *   becomes a blocking question for the layout review.
 * Cells without a comma in the same column read the same way (a plain "12.5" also reads with
 * thousands ',' and decimal '.'). Other separators never need this: their quoted numbers follow the
 * file's own decimal mark and thousands separator.
 */
import type { ColumnNumberFormat, LayoutQuestion } from './profile';

const GROUPED = /^[+-]?\d{1,3}(,\d{3})+\.\d*$|^[+-]?\d{1,3}(,\d{3}){2,}$/;
const DECIMAL_COMMA = /^[+-]?\d+,(\d{1,2}|\d{4,})$|^[+-]?0,\d+$|^[+-]?\d{1,3}(\.\d{3})+,\d+$/;
const LEADING_ZERO = /^[+-]?0,\d+$/;
const ONE_GROUP = /^[+-]?\d{1,3},\d{3}$/;
const POINT_GROUPS = /^[+-]?\d{1,3}(\.\d{3})+,\d+$/;

export interface ColumnNumberDecision {
  formats: ColumnNumberFormat[];
  questions: LayoutQuestion[];
  notes: string[];
}

/** The question field of a column whose quoted numbers read two ways. */
export const columnNumberField = (column: number) => `columnNumbers.${column}`;

/**
 * Decides the number format of each column from its cells that hold the separator (quoted).
 * @param cellsByColumn the data cells of each value column (trimmed or not)
 * @param columnName names for messages
 */
export function decideColumnNumbers(
  sep: string,
  cellsByColumn: Map<number, string[]>,
  columnName: (column: number) => string,
): ColumnNumberDecision {
  const out: ColumnNumberDecision = { formats: [], questions: [], notes: [] };
  if (sep !== ',') return out;
  for (const [column, cells] of cellsByColumn) {
    let grouped = 0;
    let decimal = 0;
    let oneGroup = 0;
    let pointGroups = 0;
    let example = '';
    for (const raw of cells) {
      const t = raw.trim();
      if (!t.includes(',')) continue;
      if (!example) example = t;
      if (GROUPED.test(t)) grouped++;
      else if (LEADING_ZERO.test(t)) decimal++;
      else if (ONE_GROUP.test(t)) oneGroup++;
      else if (DECIMAL_COMMA.test(t)) {
        decimal++;
        if (POINT_GROUPS.test(t)) pointGroups++;
      }
    }
    if (grouped + decimal + oneGroup === 0) continue;
    const name = columnName(column);
    if (decimal === 0) {
      out.formats.push({ column, decimalMark: '.', thousandsSeparator: ',' });
      if (grouped > 0) {
        out.notes.push(`Column ${name}: quoted numbers such as '${example}' have commas between thousands and a decimal point.`);
        continue;
      }
      out.questions.push({
        field: columnNumberField(column),
        message:
          `Column ${name} holds quoted numbers such as '${example}' with one comma before exactly three digits: ` +
          `that is ${example.replace(',', '')} with a comma between thousands, or ${example.replace(',', '.')} with a decimal comma. ` +
          'Choose how the export writes this column.',
        choices: ['thousands', 'decimal'],
        blocking: true,
      });
      continue;
    }
    if (grouped === 0) {
      out.formats.push({ column, decimalMark: ',', thousandsSeparator: pointGroups > 0 ? '.' : '' });
      out.notes.push(`Column ${name}: quoted numbers such as '${example}' have a decimal comma.`);
      continue;
    }
    // both readings occur: the majority decides and the operator confirms
    const thousands = grouped >= decimal;
    out.formats.push(thousands ? { column, decimalMark: '.', thousandsSeparator: ',' } : { column, decimalMark: ',', thousandsSeparator: pointGroups > 0 ? '.' : '' });
    out.questions.push({
      field: columnNumberField(column),
      message:
        `Column ${name}: ${grouped} quoted number(s) read with commas between thousands, ${decimal} with a decimal comma. ` +
        `Read with ${thousands ? 'commas between thousands' : 'a decimal comma'}; confirm.`,
      choices: ['thousands', 'decimal'],
      blocking: false,
    });
  }
  return out;
}

/**
 * Applies the operator's answer ('thousands' or 'decimal') to a column's number format, and drops
 * the question: returns the new columnNumbers list.
 */
export function answerColumnNumbers(formats: ColumnNumberFormat[] | undefined, column: number, answer: 'thousands' | 'decimal'): ColumnNumberFormat[] {
  const rest = (formats ?? []).filter((f) => f.column !== column);
  const chosen: ColumnNumberFormat = answer === 'thousands' ? { column, decimalMark: '.', thousandsSeparator: ',' } : { column, decimalMark: ',', thousandsSeparator: '' };
  return [...rest, chosen].sort((a, b) => a.column - b.column);
}

/** True when a cell (trimmed) holds the separator: in a comma file, it was quoted. */
export function holdsSeparator(cell: string, sep: string): boolean {
  return sep === ',' && cell.includes(',');
}
