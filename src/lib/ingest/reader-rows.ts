/**
 * The reader's cell steps, one per layout: a wide row (one time, a cell per tag, passed to the sink
 * as one row in reused arrays) and a long row (tag, time, value and maybe quality, passed as one
 * sample). Each marks every cell's status, counts it and rejects what is not a usable number.
 */
import type { CsvRecord } from './csv';
import { isBlankAt, parseNumberAt } from './numbers';
import type { LayoutProfile } from './profile';
import { classifyQuality, QualityClass } from './quality';
import type { QualityJudge } from './quality-codes';
import { IngestError } from './errors';
import { CellStatus } from './reader-types';
import type { SampleSink } from './reader-types';
import { badTagName } from './reader-tally';
import type { ReadTally, Rejecter, TagTable } from './reader-tally';

/** Decimal mark and thousands separator codes of the file (-1: none). */
export interface NumberCodes {
  dec: number;
  thou: number;
}

/** The number format of a value column (quoted cells of a comma file keep their own: column-numbers.ts). */
export function numberCodesOf(p: LayoutProfile): (col: number) => NumberCodes {
  const file: NumberCodes = { dec: p.decimalMark.charCodeAt(0), thou: p.thousandsSeparator === '' ? -1 : p.thousandsSeparator.charCodeAt(0) };
  const colFormat = new Map((p.columnNumbers ?? []).map((f) => [f.column, f]));
  return (col) => {
    const f = colFormat.get(col);
    if (!f) return file;
    return { dec: f.decimalMark.charCodeAt(0), thou: f.thousandsSeparator === '' ? -1 : f.thousandsSeparator.charCodeAt(0) };
  };
}

/** The quality column of each wide value column, or -1. */
function wideQualityColumns(p: LayoutProfile, valueCols: Int32Array): Int32Array {
  const out = new Int32Array(valueCols.length).fill(-1);
  const q = p.quality;
  if (!q) return out;
  const pairOf = new Map(q.pairs.map((x) => [x.value, x.quality]));
  valueCols.forEach((col, k) => {
    out[k] = q.kind === 'row' ? (q.rowColumn ?? -1) : (pairOf.get(col) ?? -1);
  });
  return out;
}

interface RowStepContext {
  p: LayoutProfile;
  tags: TagTable;
  tally: ReadTally;
  reject: Rejecter;
  sink: SampleSink;
}

/**
 * The wide row step. Call after the wide tags are in the table (their limits are taken here).
 * @param valueCols the value column of tag k
 */
export function createWideRowStep(c: RowStepContext, valueCols: Int32Array, judge: QualityJudge): (rec: CsvRecord, t: number) => void {
  const { tags, tally, reject, sink } = c;
  const codesOf = numberCodesOf(c.p);
  const nWide = valueCols.length;
  const values = new Float64Array(nWide);
  const status = new Uint8Array(nWide);
  const decK = Int32Array.from(valueCols, (col) => codesOf(col).dec);
  const thouK = Int32Array.from(valueCols, (col) => codesOf(col).thou);
  const qualityCols = wideQualityColumns(c.p, valueCols);
  const limMin = tags.limMin;
  const limMax = tags.limMax;
  const tagStates = tags.states;
  if (tagStates.length < nWide) throw new IngestError('READER_FAULT', `The wide row step has ${nWide} value columns but only ${tagStates.length} tags are in the table.`);
  let prevRowTimeMs = NaN;

  return function readWideRow(rec: CsvRecord, t: number): void {
    if (t === prevRowTimeMs) tally.duplicates.add(rec.line);
    else if (t < prevRowTimeMs) tally.backwards.add(rec.line);
    prevRowTimeMs = t;
    const fields = rec.fields;
    const count = rec.count;
    // hot loop: every per-column array has nWide entries (the tag table at least as many, checked
    // above) and a field index below count (= fields.length) is inside the record
    for (let k = 0; k < nWide; k++) {
      const col = valueCols[k]!;
      if (col >= count) {
        values[k] = NaN;
        status[k] = CellStatus.Blank;
        tagStates[k]!.blankCount++;
        continue;
      }
      const f = fields[col]!;
      const v = parseNumberAt(f, 0, f.length, decK[k]!, thouK[k]!);
      if (v === v) {
        if (v < limMin[k]! || v > limMax[k]!) {
          values[k] = NaN;
          status[k] = CellStatus.Text;
          reject(k, rec, col, t, 'impossible');
          continue;
        }
        values[k] = v;
        status[k] = CellStatus.Ok;
        const qc = qualityCols[k]!;
        if (qc >= 0 && qc < count) {
          const qt = fields[qc]!;
          const q = judge(qt);
          if (q === QualityClass.Bad) {
            values[k] = NaN;
            status[k] = CellStatus.BadQuality;
            reject(k, rec, col, t, 'bad-quality', qt.trim());
          } else if (q === QualityClass.Uncertain) {
            status[k] = CellStatus.Uncertain;
            tagStates[k]!.uncertainCount++;
          }
        }
      } else if (isBlankAt(f, 0, f.length)) {
        values[k] = NaN;
        status[k] = CellStatus.Blank;
        tagStates[k]!.blankCount++;
      } else {
        values[k] = NaN;
        status[k] = CellStatus.Text;
        reject(k, rec, col, t, 'text');
      }
    }
    sink.addRow(t, values, status);
  };
}

/** The long row step: finds the row's tag (adding it when new), checks its order, reads its sample. */
export function createLongRowStep(c: RowStepContext): (rec: CsvRecord, t: number) => void {
  const { tags, tally, reject, sink } = c;
  const L = c.p.long!;
  const codes = numberCodesOf(c.p)(L.valueColumn);
  const longDec = codes.dec;
  const longThou = codes.thou;
  const qualityOf = createLongQualityStep(L.qualityColumn, tally);
  // consecutive rows usually carry the same tag: compare the raw text before looking it up
  let lastTagIndex = -1;
  let lastTagRaw = '\u0000';

  function tagOf(rec: CsvRecord): number {
    const tc = L.tagColumn;
    const raw = tc < rec.count ? (rec.fields[tc] ?? '') : '';
    if (lastTagIndex >= 0 && raw === lastTagRaw) return lastTagIndex;
    const name = raw.trim();
    if (name.length === 0) {
      tally.blankTags.add(rec.line);
      return -1;
    }
    if (badTagName(name)) {
      tally.badTagNames.add(rec.line);
      return -1;
    }
    const k = tags.indexOf(name);
    lastTagIndex = k;
    lastTagRaw = raw;
    return k;
  }

  return function readLongRow(rec: CsvRecord, t: number): void {
    const k = tagOf(rec);
    if (k < 0) return;
    const prev = tags.lastTime[k] ?? NaN; // NaN: no row of the tag yet
    if (t === prev) tally.duplicates.add(rec.line);
    else if (t < prev) tally.backwards.add(rec.line);
    tags.lastTime[k] = t;
    const st = tags.stateOf(k);
    const qClass = qualityOf(rec);
    const vc = L.valueColumn;
    let value = NaN;
    let cell: number = CellStatus.Blank;
    const tx = vc < rec.count ? rec.fields[vc] : undefined;
    if (tx !== undefined) {
      value = parseNumberAt(tx, 0, tx.length, longDec, longThou);
      if (value === value && (value < (tags.limMin[k] ?? -Infinity) || value > (tags.limMax[k] ?? Infinity))) {
        reject(k, rec, vc, t, 'impossible');
        sink.addSample(k, t, NaN, CellStatus.Text);
        return;
      }
      if (value === value) cell = qClass === QualityClass.Bad ? CellStatus.BadQuality : qClass === QualityClass.Uncertain ? CellStatus.Uncertain : CellStatus.Ok;
      else if (isBlankAt(tx, 0, tx.length)) cell = CellStatus.Blank;
      else cell = CellStatus.Text;
    }
    if (cell === CellStatus.Blank) st.blankCount++;
    else if (cell === CellStatus.Text) reject(k, rec, vc, t, 'text');
    else if (cell === CellStatus.BadQuality) reject(k, rec, vc, t, 'bad-quality');
    else {
      st.valueCount++;
      if (cell === CellStatus.Uncertain) st.uncertainCount++;
    }
    sink.addSample(k, t, cell === CellStatus.Ok || cell === CellStatus.Uncertain ? value : NaN, cell);
  };
}

/** The quality class of a long row (unknown words count and read as uncertain); Good without a quality column. */
function createLongQualityStep(qualityColumn: number | null, tally: ReadTally): (rec: CsvRecord) => number {
  const qualityCache = new Map<string, number>();
  let lastQualityRaw = '\u0000';
  let lastQualityClass = 0;
  return (rec) => {
    const qt = qualityColumn !== null && qualityColumn < rec.count ? rec.fields[qualityColumn] : undefined;
    if (qt === undefined) return QualityClass.Good;
    let c: number | undefined;
    if (qt === lastQualityRaw) {
      c = lastQualityClass;
    } else {
      c = qualityCache.get(qt);
      if (c === undefined) {
        c = classifyQuality(qt);
        if (qualityCache.size < 1000) qualityCache.set(qt, c);
      }
      lastQualityRaw = qt;
      lastQualityClass = c;
    }
    if (c === QualityClass.Unknown) {
      tally.unknownQuality.add(rec.line);
      if (tally.unknownQualityTexts.size < 10) tally.unknownQualityTexts.add(qt.trim());
      return QualityClass.Uncertain;
    }
    return c;
  };
}
