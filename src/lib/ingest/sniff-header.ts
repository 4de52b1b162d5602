/**
 * The sniffer's header and column steps: which header line names the columns (and which hold units
 * and descriptions), whether the export is wide or long, and the profile's column descriptions.
 * Each step returns its notes, questions and confidence.
 */
import { IngestError } from './errors';
import type { LayoutProfile, QualityPairs, WideColumn } from './profile';
import { detectQualityColumns } from './quality-columns';
import { isBlank, isUnitLike, QUALITY_NAMES, splitNameUnit, statsAt, TAG_NAMES, UNIT_NAMES, VALUE_NAMES } from './sniff-cells';
import type { ColumnStats, Rec } from './sniff-cells';
import { noNotes } from './sniff-time';
import type { SniffNotes } from './sniff-time';

export interface HeaderFinding extends SniffNotes {
  tagRec: Rec | null;
  unitRec: Rec | null;
  descRec: Rec | null;
  columnNames: string[];
}

/**
 * Finds the names row (the one naming the time column, else the first full, unique, non-unit row;
 * rows before it are preamble) and after it the units and descriptions rows. Throws
 * DUPLICATE_HEADERS when a name repeats.
 */
export function findHeaderRows(candidates: Rec[], keywordRow: number, valueIdx: number[], m: number): HeaderFinding {
  const found = noNotes();
  const unitScore = (r: Rec) => {
    const cells = valueIdx.map((j) => r.fields[j] ?? '').filter((f) => !isBlank(f));
    return cells.length === 0 ? 0 : cells.filter(isUnitLike).length / cells.length;
  };
  let tagRec: Rec | null = candidates[keywordRow] ?? null;
  if (!tagRec) {
    for (const r of candidates) {
      if (unitScore(r) >= 0.6) continue;
      const names = valueIdx.map((j) => (r.fields[j] ?? '').trim()).filter((f) => f.length > 0);
      if (names.length >= 0.8 * valueIdx.length && new Set(names).size === names.length) {
        tagRec = r;
        break;
      }
    }
  }
  const after = tagRec ? candidates.slice(candidates.indexOf(tagRec) + 1) : candidates;
  let unitRec: Rec | null = null;
  for (const r of after) if (unitScore(r) >= 0.6 && (!unitRec || unitScore(r) > unitScore(unitRec))) unitRec = r;
  let descRec: Rec | null = null;
  for (const r of after) {
    if (r === unitRec) continue;
    const filled = valueIdx.filter((j) => !isBlank(r.fields[j] ?? '')).length;
    if (filled >= 0.5 * valueIdx.length) {
      descRec = r;
      break;
    }
  }
  if (unitRec) found.notes.push(`Units in header line ${unitRec.line}.`);
  if (descRec) found.notes.push(`Descriptions in header line ${descRec.line}.`);
  const columnNames: string[] = [];
  for (let j = 0; j < m; j++) {
    const n = tagRec ? (tagRec.fields[j] ?? '').trim() : '';
    columnNames.push(n.length > 0 ? n : `column ${j + 1}`);
  }
  if (tagRec) {
    assertUniqueNames(tagRec);
    found.notes.push(`Names in header line ${tagRec.line}.`);
  } else {
    found.confidence *= 0.5;
    found.questions.push({
      field: 'columnNames',
      message: 'No header line with column names was found; columns are named by position. Name them or export with a header.',
      choices: [],
      blocking: false,
    });
  }
  return { ...found, tagRec, unitRec, descRec, columnNames };
}

/** Duplicated names are fatal: samples could not be told apart. */
function assertUniqueNames(tagRec: Rec): void {
  const seen = new Map<string, number[]>();
  tagRec.fields.forEach((f, j) => {
    const n = f.trim();
    if (n.length === 0) return;
    seen.set(n, [...(seen.get(n) ?? []), j + 1]);
  });
  const dups = [...seen].filter(([, cols]) => cols.length > 1);
  if (dups.length > 0) {
    throw new IngestError(
      'DUPLICATE_HEADERS',
      `Column names appear more than once: ${dups.map(([n, cols]) => `'${n}' (columns ${cols.join(', ')})`).join('; ')}. ` +
        'Samples of such columns cannot be told apart; export each tag once.',
      { duplicates: Object.fromEntries(dups) },
      tagRec.line,
    );
  }
}

export interface LayoutFinding extends SniffNotes {
  layout: 'wide' | 'long';
  tagColumn: number;
  valueColumn: number;
  qualityColumn: number;
  unitColumn: number;
}

/** What the sample's columns are, as the layout step sees them. */
export interface ColumnEvidence {
  data: Rec[];
  stats: ColumnStats[];
  timeCols: number[];
  valueIdx: number[];
  m: number;
}

/** Wide or long: by the column names, else (five columns or fewer) by the data alone. */
export function decideLayout(names: string[], c: ColumnEvidence): LayoutFinding {
  const found = noNotes();
  const isTimeCol = (j: number) => c.timeCols.includes(j);
  const { stats, valueIdx } = c;
  const f: LayoutFinding = {
    ...found,
    layout: 'wide',
    tagColumn: names.findIndex((n) => TAG_NAMES.test(n)),
    valueColumn: names.findIndex((n) => VALUE_NAMES.test(n)),
    qualityColumn: names.findIndex((n) => QUALITY_NAMES.test(n)),
    unitColumn: names.findIndex((n) => UNIT_NAMES.test(n)),
  };
  if (f.tagColumn >= 0 && f.valueColumn >= 0 && !isTimeCol(f.tagColumn) && !isTimeCol(f.valueColumn)) {
    f.layout = 'long';
    f.notes.push(`Long layout: columns named '${names[f.tagColumn]}' and '${names[f.valueColumn]}'.`);
  } else if (c.m <= 5) {
    longByEvidence(f, c);
  }
  if (f.layout === 'long') {
    if (f.qualityColumn < 0 || f.qualityColumn === f.valueColumn || f.qualityColumn === f.tagColumn || isTimeCol(f.qualityColumn)) {
      f.qualityColumn =
        valueIdx.find((k) => {
          const s = statsAt(stats, k);
          return k !== f.tagColumn && k !== f.valueColumn && k !== f.unitColumn && s.nonBlank > 0 && s.quality === s.nonBlank;
        }) ?? -1;
    }
    if (f.qualityColumn >= 0) f.notes.push(`Quality in column ${f.qualityColumn + 1}.`);
  }
  return f;
}

/** Long by evidence: one identifier-like text column whose names repeat or vary, and the time repeats. */
function longByEvidence(f: LayoutFinding, c: ColumnEvidence): void {
  const { stats, valueIdx, data, timeCols } = c;
  const idCols = valueIdx.filter((j) => {
    const s = statsAt(stats, j);
    return s.nonBlank > 0 && s.identifier >= 0.9 * s.nonBlank && s.numeric === 0;
  });
  const j = idCols.length === 1 ? idCols[0] : undefined;
  if (j === undefined) return;
  const timeCells = data.map((r) => timeCols.map((t) => r.fields[t] ?? '').join(' '));
  const timeRepeats = new Set(timeCells).size < timeCells.length;
  if (!timeRepeats && statsAt(stats, j).distinct.size < 2) return;
  const numCols = valueIdx.filter((k) => {
    const s = statsAt(stats, k);
    return k !== j && s.nonBlank > 0 && s.numeric >= 0.5 * s.nonBlank;
  });
  const valueCandidate = numCols.find((k) => {
    const s = statsAt(stats, k);
    return !(s.quality === s.nonBlank && f.qualityColumn === k);
  });
  if (valueCandidate === undefined) return;
  f.layout = 'long';
  f.tagColumn = j;
  f.valueColumn = valueCandidate;
  f.confidence *= 0.8;
  f.notes.push(`Long layout by evidence: column ${j + 1} holds tag names${timeRepeats ? ' and times repeat across rows' : ''}.`);
  f.questions.push({
    field: 'layout',
    message: `Read as a long export (column ${j + 1} = tag, column ${valueCandidate + 1} = value) from the data alone; confirm.`,
    choices: ['long', 'wide'],
    blocking: false,
  });
}

/**
 * The wide value columns (quality columns paired off, name and unit split, units and descriptions
 * from their rows). Throws NO_VALUE_COLUMNS or DUPLICATE_HEADERS.
 */
export function wideColumns(h: HeaderFinding, c: ColumnEvidence): SniffNotes & { wide: NonNullable<LayoutProfile['wide']>; quality: QualityPairs | null } {
  const { tagRec, unitRec, descRec, columnNames } = h;
  const qd = detectQualityColumns(tagRec ? columnNames : columnNames.map(() => ''), c.valueIdx, c.stats);
  const notes = [...qd.notes];
  const cols: WideColumn[] = [];
  for (const j of c.valueIdx) {
    if (qd.columns.includes(j)) continue;
    const rawName = tagRec ? (tagRec.fields[j] ?? '').trim() : '';
    if (rawName.length === 0 && statsAt(c.stats, j).nonBlank === 0) continue; // trailing separator column
    const split = splitNameUnit(rawName);
    const unitCell = unitRec ? (unitRec.fields[j] ?? '').trim() : '';
    const descCell = descRec ? (descRec.fields[j] ?? '').trim() : '';
    cols.push({
      index: j,
      tag: split.tag.length > 0 ? split.tag : `column ${j + 1}`,
      unit: unitCell.length > 0 ? unitCell : split.unit,
      description: descCell.length > 0 ? descCell : null,
    });
  }
  if (cols.length === 0) {
    throw new IngestError('NO_VALUE_COLUMNS', 'Besides the time, the file has no column with values. Include the tags in the export.');
  }
  const tags = new Map<string, number>();
  for (const col of cols) tags.set(col.tag, (tags.get(col.tag) ?? 0) + 1);
  const dupTags = [...tags].filter(([, n]) => n > 1).map(([t]) => t);
  if (dupTags.length > 0) {
    throw new IngestError(
      'DUPLICATE_HEADERS',
      `Tag names appear more than once once units are split off: ${dupTags.map((t) => `'${t}'`).join(', ')}. Export each tag once.`,
      { duplicates: dupTags },
    );
  }
  notes.push(`Wide layout: ${cols.length} value column(s).`);
  return { notes, questions: [], confidence: 1, wide: { columns: cols }, quality: qd.quality };
}

/** The long columns of the profile (a unit column only when it is none of the others). */
export function longColumns(f: LayoutFinding, timeCols: number[]): NonNullable<LayoutProfile['long']> {
  const u = f.unitColumn;
  return {
    tagColumn: f.tagColumn,
    valueColumn: f.valueColumn,
    qualityColumn: f.qualityColumn >= 0 ? f.qualityColumn : null,
    unitColumn: u >= 0 && !timeCols.includes(u) && u !== f.tagColumn && u !== f.valueColumn ? u : null,
  };
}
