/**
 * Quality (status) columns of wide files, for the layout sniffer.
 *
 * A column is a quality column when its name says so (`Quality`, `Status`, `Q`, `QC`, or the name of
 * another column followed by one of them: `B1.FT-101 Quality`, `B1.FT-101.Q`, `B1.FT-101_status`
 * next to a `B1.FT-101` column; a lone `P-101.Status` is a tag of its own) or, without such
 * a name, when every non-blank cell is a quality word (Good, Bad, Uncertain ...) and none is a number.
 * - Each quality column right after a value column pairs with it (value, quality pairs).
 * - One quality column with a bare name (`Status`) and several value columns: it applies to the
 *   whole row.
 */
import type { QualityPairs } from './profile';

const BARE = /^(quality|q|qual|status|state|qc|quality ?code|qualit[äa]t|flag)$/i;
const SUFFIX = /^(.*\S)[\s._\-:/]+(quality|q|qual|status|state|qc|quality ?code|flag)$/i;

export interface QualityColumnStats {
  nonBlank: number;
  numeric: number;
  quality: number;
}

export interface QualityColumnDecision {
  quality: QualityPairs | null;
  /** Columns that hold quality codes: no tag of their own. */
  columns: number[];
  notes: string[];
}

/** The tag a suffixed quality name refers to ('B1.FT-101 Quality' -> 'B1.FT-101'), or null. */
export function qualityNameTarget(name: string): string | null {
  const target = SUFFIX.exec(name.trim())?.[1];
  return target !== undefined ? target.trim() : null;
}

/** A suffixed name counts only when the tag it names is a column too ('P-101.Status' alone is a tag). */
function isQualityColumn(name: string, s: QualityColumnStats | undefined, allNames: Set<string>): boolean {
  const n = name.trim();
  if (BARE.test(n)) return true;
  const target = qualityNameTarget(n);
  if (target && allNames.has(target)) return true;
  return !!s && s.nonBlank > 0 && s.numeric === 0 && s.quality === s.nonBlank;
}

/**
 * Finds quality columns among a wide file's value columns.
 * @param names column names by index ('' when the file has none)
 * @param valueIdx the non-time columns
 */
export function detectQualityColumns(names: string[], valueIdx: number[], stats: QualityColumnStats[]): QualityColumnDecision {
  const allNames = new Set(names.map((n) => n.trim()));
  const qCols = valueIdx.filter((j) => isQualityColumn(names[j] ?? '', stats[j], allNames));
  const none: QualityColumnDecision = { quality: null, columns: [], notes: [] };
  if (qCols.length === 0 || qCols.length === valueIdx.length) return none;
  const isQ = new Set(qCols);
  const valueCols = valueIdx.filter((j) => !isQ.has(j));
  const label = (j: number) => `${j + 1} ('${names[j] || `column ${j + 1}`}')`;
  const onlyQ = qCols.length === 1 ? qCols[0] : undefined;
  if (onlyQ !== undefined && BARE.test((names[onlyQ] ?? '').trim()) && valueCols.length > 1) {
    return {
      quality: { kind: 'row', pairs: [], rowColumn: onlyQ },
      columns: qCols,
      notes: [`Column ${label(onlyQ)} holds one quality code for the whole row.`],
    };
  }
  const pairs: { value: number; quality: number }[] = [];
  for (const q of qCols) {
    const target = qualityNameTarget(names[q] ?? '');
    const byName = target ? valueCols.find((j) => (names[j] ?? '').trim() === target) : undefined;
    const value = byName ?? (valueCols.includes(q - 1) ? q - 1 : undefined);
    if (value === undefined || pairs.some((p) => p.value === value)) return none;
    pairs.push({ value, quality: q });
  }
  pairs.sort((a, b) => a.value - b.value);
  return {
    quality: { kind: 'pairs', pairs, rowColumn: null },
    columns: qCols,
    notes: [`Value and quality pairs: ${pairs.map((p) => `${label(p.value)} with ${p.quality + 1}`).join(', ')}.`],
  };
}
