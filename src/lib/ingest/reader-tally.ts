/**
 * What the reader counts while it reads: the tags met (with their possible-value limits and last
 * times), per-tag cell counts and rejected texts, and the per-row warnings. The rejecting step lives
 * here too, as it only updates these counts and tells the caller's onRejectedCell.
 */
import type { CsvRecord } from './csv';
import { fieldText } from './csv';
import { IngestError } from './errors';
import { valueLimitsFor } from './limits';
import type { ValueLimits } from './limits';
import { MAX_TAG_NAME_CHARS } from './reader-types';
import type { RejectedCell, RejectReason, SampleSink, TagReadSummary } from './reader-types';

export class WarningCounter {
  count = 0;
  lines: number[] = [];
  constructor(private readonly cap: number) {}
  add(line: number): void {
    this.count++;
    if (this.lines.length < this.cap) this.lines.push(line);
  }
}

/** A tag's counts while reading: its summary to be, with the rejected texts still in a map. */
export type TagState = Omit<TagReadSummary, 'rejectedTexts'> & { texts: Map<string, number> };

/** The tags met so far, dense from 0 in order of appearance, announced to the sink as they come. */
export class TagTable {
  readonly states: TagState[] = [];
  readonly names: string[] = [];
  readonly index = new Map<string, number>();
  /** Possible values of tag k [its own unit], and why (for messages). */
  limMin: Float64Array<ArrayBuffer> = new Float64Array(16);
  limMax: Float64Array<ArrayBuffer> = new Float64Array(16);
  readonly limWhy: string[] = [];
  /** Long files: the last time of tag k (order checks), NaN before its first row. */
  lastTime = new Float64Array(16).fill(NaN);

  constructor(
    private readonly sink: SampleSink,
    private readonly limitsOf: (tag: string, unit: string | null) => ValueLimits | null,
  ) {}

  add(name: string, unit: string | null = null): number {
    const k = this.states.length;
    this.states.push({ tag: name, valueCount: 0, blankCount: 0, textCount: 0, badQualityCount: 0, uncertainCount: 0, impossibleCount: 0, outsideWindowCount: 0, texts: new Map(), rejectedLines: [] });
    if (k >= this.limMin.length) {
      this.limMin = grow(this.limMin, 0);
      this.limMax = grow(this.limMax, 0);
    }
    if (k >= this.lastTime.length) this.lastTime = grow(this.lastTime, NaN);
    const lim = this.limitsOf(name, unit) ?? valueLimitsFor(null);
    this.limMin[k] = lim.min;
    this.limMax[k] = lim.max;
    this.limWhy[k] = lim.why;
    this.names.push(name);
    this.index.set(name, k);
    this.sink.addTag(k, name);
    return k;
  }

  /** The counts of tag k (an index given by add or indexOf). */
  stateOf(k: number): TagState {
    const st = this.states[k];
    if (st === undefined) throw new IngestError('READER_FAULT', `The reader asked for tag ${k} of ${this.states.length} it has met.`);
    return st;
  }

  /** Index of a tag by name, adding it when new. */
  indexOf(name: string): number {
    return this.index.get(name) ?? this.add(name);
  }
}

function grow(a: Float64Array, fill: number): Float64Array<ArrayBuffer> {
  const grown = new Float64Array(a.length * 2).fill(fill);
  grown.set(a);
  return grown;
}

/** The per-row warnings counted while reading, and the examples their messages quote. */
export class ReadTally {
  readonly ragged: WarningCounter;
  readonly badTime: WarningCounter;
  readonly badTimeExamples: string[] = [];
  readonly duplicates: WarningCounter;
  readonly backwards: WarningCounter;
  readonly unknownQuality: WarningCounter;
  readonly unknownQualityTexts = new Set<string>();
  readonly blankTags: WarningCounter;
  readonly badTagNames: WarningCounter;
  readonly outsideWindow: WarningCounter;
  readonly outsideWindowExamples: string[] = [];
  readonly impossible: WarningCounter;
  readonly impossibleExamples: string[] = [];
  /** Rows read with a time inside the window, and the first and last of those times. */
  dataRows = 0;
  firstTimeMs = Infinity;
  lastTimeMs = -Infinity;

  constructor(readonly cap: number) {
    this.ragged = new WarningCounter(cap);
    this.badTime = new WarningCounter(cap);
    this.duplicates = new WarningCounter(cap);
    this.backwards = new WarningCounter(cap);
    this.unknownQuality = new WarningCounter(cap);
    this.blankTags = new WarningCounter(cap);
    this.badTagNames = new WarningCounter(cap);
    this.outsideWindow = new WarningCounter(cap);
    this.impossible = new WarningCounter(cap);
  }
}

export type Rejecter = (k: number, rec: CsvRecord, col: number, timeMs: number, reason: RejectReason, code?: string) => void;

/**
 * The rejecting step: counts a rejected cell of tag k for its reason, keeps its text among the tag's
 * examples and its line among the first lines, and tells onRejectedCell.
 */
export function createRejecter(tags: TagTable, tally: ReadTally, maxExamples: number, onRejectedCell?: (cell: RejectedCell) => void): Rejecter {
  const cap = tally.cap;
  return function reject(k, rec, col, timeMs, reason, code) {
    const st = tags.stateOf(k);
    const text = fieldText(rec, col).trim();
    if (reason === 'text') st.textCount++;
    else if (reason === 'bad-quality') st.badQualityCount++;
    else if (reason === 'impossible') {
      st.impossibleCount++;
      tally.impossible.add(rec.line);
      if (tally.impossibleExamples.length < 3) tally.impossibleExamples.push(`${st.tag} = ${text.slice(0, 40)} (${tags.limWhy[k]})`);
    } else st.outsideWindowCount++;
    const why = reason === 'bad-quality' ? (code !== undefined ? `bad quality ${code}` : 'bad quality') : reason === 'impossible' ? 'impossible value' : 'time outside window';
    const key = reason === 'text' ? text : `[${why}] ${text}`;
    const n = st.texts.get(key);
    if (n !== undefined) st.texts.set(key, n + 1);
    else if (st.texts.size < maxExamples) st.texts.set(key, 1);
    if (st.rejectedLines.length < cap) st.rejectedLines.push(rec.line);
    onRejectedCell?.(code !== undefined ? { tag: st.tag, timeMs, line: rec.line, reason, text, code } : { tag: st.tag, timeMs, line: rec.line, reason, text });
  };
}

/** Control characters (NUL included) in a name, made visible as spaces for messages. */
export function cleanName(name: string): string {
  // eslint-disable-next-line no-control-regex
  return name.replace(/[\u0000-\u001f\u007f]/g, ' ');
}

/** Why a tag name cannot be stored, or null when it can. */
export function badTagName(name: string): string | null {
  if (name.length > MAX_TAG_NAME_CHARS) return `is longer than ${MAX_TAG_NAME_CHARS} characters (${name.length})`;
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(name)) return 'holds control characters';
  return null;
}

/** Throws BAD_TAG_NAME when a wide column's name cannot be stored. */
export function assertWideTagName(tag: string, column: number): void {
  const bad = badTagName(tag);
  if (bad) throw new IngestError('BAD_TAG_NAME', `The column name starting '${cleanName(tag).slice(0, 40)}' ${bad}. Rename the column in the export.`, { column });
}
