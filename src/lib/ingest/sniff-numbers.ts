/**
 * The sniffer's number step: the file's decimal mark and thousands separator from the evidence of
 * its value cells, and the columns whose quoted cells keep a format of their own (column-numbers.ts).
 */
import type { ColumnNumberFormat, LayoutQuestion } from './profile';
import { decideColumnNumbers, holdsSeparator } from './column-numbers';
import { isNumericLike } from './sniff-cells';
import type { Rec, Separator } from './sniff-cells';
import type { SniffNotes } from './sniff-time';

type Thousands = '' | ',' | '.' | ' ' | "'";

export interface NumberFinding extends SniffNotes {
  decimalMark: '.' | ',';
  thousandsSeparator: Thousands;
  columnNumbers: ColumnNumberFormat[];
}

/**
 * Decides how the numbers of the value columns are written.
 * @param nameOf how a column is named in messages
 */
export function decideNumbers(data: Rec[], numberCols: number[], sep: Separator, nameOf: (j: number) => string): NumberFinding {
  const numberCells: string[] = [];
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
  const notes = [dec.note];
  const questions = dec.question ? [dec.question] : [];
  let confidence = dec.confidence;
  const columnNumbers = decideColumnNumbers(sep, cellsByColumn, nameOf);
  notes.push(...columnNumbers.notes);
  questions.push(...columnNumbers.questions);
  if (columnNumbers.questions.length > 0) confidence *= 0.5;
  return { notes, questions, confidence, decimalMark: dec.decimalMark, thousandsSeparator: dec.thousandsSeparator, columnNumbers: columnNumbers.formats };
}

/** Counts of the ways the sample's numbers write their marks. */
interface MarkCounts {
  /** Only read one way: with a decimal point, with a decimal comma. */
  point: number;
  comma: number;
  /** One mark followed by exactly three digits: a decimal or a thousands group. */
  comma3: number;
  point3: number;
  /** Evidence of a thousands separator. */
  thComma: number;
  thPoint: number;
  thSpace: number;
  thApos: number;
}

function countMarks(cells: string[]): MarkCounts {
  const n: MarkCounts = { point: 0, comma: 0, comma3: 0, point3: 0, thComma: 0, thPoint: 0, thSpace: 0, thApos: 0 };
  for (const raw of cells) {
    const t = raw.trim().replace(/^[+-]/, '').replace(/[eE][+-]?\d+$/, '');
    if (!/\d/.test(t)) continue;
    const hasP = t.includes('.');
    const hasC = t.includes(',');
    if (/\d[ \u00a0\u202f]\d{3}(\D|$)/.test(t)) n.thSpace++;
    if (/\d'\d{3}(\D|$)/.test(t)) n.thApos++;
    if (hasP && hasC) {
      if (t.lastIndexOf('.') > t.lastIndexOf(',')) {
        n.point++;
        n.thComma++;
      } else {
        n.comma++;
        n.thPoint++;
      }
      continue;
    }
    if (hasC) {
      const [whole = '', fraction = '', ...more] = t.split(',');
      if (more.length > 0) n.thComma++;
      else if (fraction.length === 3 && whole.length >= 1 && whole !== '0') n.comma3++;
      else n.comma++;
    } else if (hasP) {
      const [whole = '', fraction = '', ...more] = t.split('.');
      if (more.length > 0) n.thPoint++;
      else if (fraction.length === 3 && whole.length >= 1 && whole !== '0') n.point3++;
      else n.point++;
    }
  }
  return n;
}

function decimalEvidence(cells: string[], sep: Separator): {
  decimalMark: '.' | ',';
  thousandsSeparator: Thousands;
  note: string;
  question: LayoutQuestion | null;
  confidence: number;
} {
  const n = countMarks(cells);
  const { decimalMark, question, confidence } = decideDecimalMark(n, sep);
  let note = markNote(n, decimalMark, question !== null);
  let thousandsSeparator: Thousands = '';
  if (decimalMark === '.' && (n.thComma > 0 || (n.comma3 > 0 && !question))) thousandsSeparator = ',';
  else if (decimalMark === ',' && (n.thPoint > 0 || (n.point3 > 0 && !question))) thousandsSeparator = '.';
  else if (n.thSpace > 0) thousandsSeparator = ' ';
  else if (n.thApos > 0) thousandsSeparator = "'";
  if (thousandsSeparator === sep) thousandsSeparator = '';
  if (thousandsSeparator) note += ` Thousands separator ${JSON.stringify(thousandsSeparator)}.`;
  return { decimalMark, thousandsSeparator, note, question, confidence };
}

/** The note on the decimal mark, as decided by {@link decideDecimalMark}. */
function markNote(n: MarkCounts, decimalMark: '.' | ',', asked: boolean): string {
  if (n.comma > 0 && n.point === 0) return `Decimal comma: ${n.comma} number(s) such as '12,5' only read one way.`;
  if (n.point > 0 && n.comma === 0) return `Decimal point: ${n.point} number(s) such as '12.5' only read one way.`;
  if (n.point > 0 && n.comma > 0) return `Numbers disagree: ${n.point} read with a decimal point, ${n.comma} with a decimal comma.`;
  if (asked) return `Every number with a mark has exactly three digits after it (such as '1,234'), which reads as a decimal or a thousands group.`;
  return `No number in the sample has a decimal mark; assumed a decimal ${decimalMark === '.' ? 'point' : 'comma'} (usual with this separator).`;
}

function decideDecimalMark(n: MarkCounts, sep: Separator): { decimalMark: '.' | ','; question: LayoutQuestion | null; confidence: number } {
  if (n.comma > 0 && n.point === 0) return { decimalMark: ',', question: null, confidence: 1 };
  if (n.point > 0 && n.comma === 0) return { decimalMark: '.', question: null, confidence: 1 };
  if (n.point > 0 && n.comma > 0) {
    const decimalMark = n.point >= n.comma ? '.' : ',';
    const note = markNote(n, decimalMark, true);
    return { decimalMark, question: markQuestion(`${note} Read with a decimal ${decimalMark === '.' ? 'point' : 'comma'}; confirm which one the export uses.`), confidence: 0.5 };
  }
  if (n.comma3 > 0 || n.point3 > 0) {
    let decimalMark: '.' | ',' = sep === ';' || n.comma3 > 0 ? ',' : '.';
    if (sep === ',' && n.comma3 > 0) decimalMark = '.';
    const note = markNote(n, decimalMark, true);
    return { decimalMark, question: markQuestion(`${note} Read with a decimal ${decimalMark === '.' ? 'point' : 'comma'}; confirm.`), confidence: 0.5 };
  }
  return { decimalMark: sep === ';' ? ',' : '.', question: null, confidence: 0.9 };
}

const markQuestion = (message: string): LayoutQuestion => ({ field: 'decimalMark', message, choices: ['.', ','], blocking: false });
