/**
 * What the row reader (reader.ts) is given and what it gives: cell statuses, the sample sink, its
 * options, rejected cells, warnings and the read report.
 */
import type { ValueLimits } from './limits';

/** Per-cell status codes passed with values. */
export const CellStatus = {
  /** A number, usable. */
  Ok: 0,
  /** Empty cell: no sample (ignored by the aggregator, counted by the reader). */
  Blank: 1,
  /** Text that is not a number ('Shutdown', 'I/O Timeout', '#N/A'): a rejected sample. */
  Text: 2,
  /** A number whose quality says bad: a rejected sample. */
  BadQuality: 3,
  /** A number whose quality says uncertain (or is unknown): used, and counted. */
  Uncertain: 4,
} as const;
export type CellStatus = (typeof CellStatus)[keyof typeof CellStatus];

/** Receives what the reader reads. The hour aggregator implements it. */
export interface SampleSink {
  /** Announces a tag before its first sample; indexes are dense from 0 in order of appearance. */
  addTag(tagIndex: number, tag: string): void;
  /** Wide files: one row; values[k] and status[k] belong to tag k (arrays are reused: copy if kept). */
  addRow(timeMs: number, values: Float64Array, status: Uint8Array): void;
  /** Long files: one sample. */
  addSample(tagIndex: number, timeMs: number, value: number, status: number): void;
}

export interface RejectedCell {
  tag: string;
  timeMs: number;
  line: number;
  /** text: not a number; bad-quality: the historian said bad; impossible: outside the quantity's
   *  possible range (see limits.ts); outside-window: the row's time is outside the accepted window. */
  reason: RejectReason;
  text: string;
  /** bad-quality: the quality code the file gave the sample. */
  code?: string;
}

export type RejectReason = 'text' | 'bad-quality' | 'impossible' | 'outside-window';

/** Longest tag name accepted [characters]. */
export const MAX_TAG_NAME_CHARS = 200;

export interface RowReaderOptions {
  /** The site's IANA time zone, for local times. */
  timeZone: string;
  sink: SampleSink;
  /** Longest record accepted [characters]; default 1 048 576. */
  maxRecordChars?: number;
  /** Lines listed per warning at most; default 20. */
  maxListedLines?: number;
  /** Distinct rejected texts kept per tag at most; default 10. */
  maxRejectedExamples?: number;
  /** Called for every rejected cell (for a server that stores them); optional. */
  onRejectedCell?: (cell: RejectedCell) => void;
  /** Called for every data row whose time cannot be read (the row is skipped); optional. */
  onTimeError?: (line: number, text: string) => void;
  /**
   * Possible values of a tag in its own unit; values outside are rejected as 'impossible'. Default:
   * from the unit in the file's units row (wide files), else the magnitude limit only (limits.ts).
   */
  valueLimits?: (tag: string, unitText: string | null) => ValueLimits | null;
  /** Accepted times [UTC ms, inclusive]; rows outside have their cells rejected as 'outside-window'. */
  timeWindow?: { minMs: number; maxMs: number };
  /** Wide files with quality columns: the site's good codes (default DEFAULT_GOOD_QUALITY_CODES). */
  goodQualityCodes?: readonly string[];
}

export type IngestWarningCode =
  | 'RAGGED_ROWS'
  | 'UNREADABLE_TIMES'
  | 'DUPLICATE_TIMES'
  | 'BACKWARDS_TIMES'
  | 'DST_REPEATED_HOUR'
  | 'DST_GAP'
  | 'UNKNOWN_QUALITY'
  | 'MALFORMED_QUOTES'
  | 'BLANK_TAG_NAMES'
  | 'TIMES_OUTSIDE_WINDOW'
  | 'IMPOSSIBLE_VALUES'
  | 'COLUMNS_WITHOUT_NUMBERS'
  | 'BAD_TAG_NAMES';

export interface IngestWarning {
  code: IngestWarningCode;
  message: string;
  count: number;
  /** First lines affected (1-based physical lines), up to the cap. */
  lines: number[];
}

export interface TagReadSummary {
  tag: string;
  /** Numeric cells (good or uncertain). */
  valueCount: number;
  blankCount: number;
  textCount: number;
  badQualityCount: number;
  uncertainCount: number;
  /** Numbers outside the quantity's possible range (rejected). */
  impossibleCount: number;
  /** Cells of rows whose time is outside the accepted window (rejected). */
  outsideWindowCount: number;
  /** Distinct rejected texts with counts (up to the cap), most frequent first. */
  rejectedTexts: { text: string; count: number }[];
  /** First lines with a rejected cell. */
  rejectedLines: number[];
}

export interface ReadReport {
  dataRowCount: number;
  headerRowCount: number;
  /** Numeric cells over all tags. */
  valueCount: number;
  rejectedCount: number;
  blankCount: number;
  firstTimeMs: number | null;
  lastTimeMs: number | null;
  tags: TagReadSummary[];
  warnings: IngestWarning[];
}

export interface RowReader {
  push(text: string): void;
  /** Ends the input and returns the report. Throws HEADER_ONLY when no data row was read. */
  end(): ReadReport;
  /** Tags known so far, by index. */
  readonly tags: readonly string[];
  /** During a sink call: the text of tag k's cell in the current row (wide) or of the value cell (long). */
  cellText(k: number): string;
  /** During a sink call: the time cell text of the current row (two cells joined by a space). */
  timeText(): string;
  /** During a sink call: the current line. */
  readonly line: number;
}
