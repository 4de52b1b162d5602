/**
 * The whole ingest of one file as one streaming object: bytes in, tag hours out through onHour.
 * The first 64 KiB of text are held to sniff the layout (unless a stored profile is given), then
 * everything streams with flat memory.
 */
import { createHourAggregator } from './aggregate';
import type { TagHour, TagOptions } from './aggregate';
import { createDecoder } from './decode';
import type { EncodingDecision } from './decode';
import { IngestError } from './errors';
import { fixed } from '../format';
import type { LayoutProfile } from './profile';
import { createRowReader } from './reader';
import type { ReadReport, RejectedCell, RowReader, RowReaderOptions } from './reader';
import { sniffLayout } from './sniff';
import { createSampleEmitter, teeSinks } from './merge';
import type { Sample } from './merge';

export interface FileIngestOptions {
  timeZone: string;
  /** A stored (answered) profile for files of this shape; sniffed from the file when absent. */
  profile?: LayoutProfile;
  /** Called with the sniffed profile before reading starts; returns it with questions answered
   *  (for example from the operator's earlier answers for the same fingerprint). */
  answer?: (sniffed: LayoutProfile) => LayoutProfile;
  tagOptions?: (tag: string) => Partial<TagOptions>;
  maxGapSeconds?: number;
  onHour: (hour: TagHour) => void;
  /** Instead of onHour: each hour in the packed layout (see HourAggregatorOptions.onHourFields). */
  onHourFields?: (tag: string, fields: Float64Array) => void;
  onRejectedCell?: (cell: RejectedCell) => void;
  /** Characters of text held for sniffing; default 65536. */
  sampleChars?: number;
  maxRecordChars?: number;
  /** Possible values per tag (see RowReaderOptions.valueLimits). */
  valueLimits?: RowReaderOptions['valueLimits'];
  /** Accepted times (see RowReaderOptions.timeWindow). */
  timeWindow?: RowReaderOptions['timeWindow'];
  /**
   * Largest share of the non-blank value cells that may be rejected as not numbers or impossible
   * before the whole file stops with MOSTLY_REJECTED (a layout that does not fit the file, such as
   * the wrong decimal mark); default 0.5. Bad-quality cells and rows outside the time window do not
   * count: the source said so.
   */
  maxRejectedShare?: number;
  /** Every sample read, as an object (for re-reading the samples of overlapped hours; slower). */
  onSample?: (sample: Sample) => void;
  /** Good quality codes of wide files with quality columns (see RowReaderOptions). */
  goodQualityCodes?: readonly string[];
}

export interface FileIngestResult {
  encoding: EncodingDecision;
  profile: LayoutProfile;
  report: ReadReport;
}

export interface FileIngest {
  push(chunk: Uint8Array): void;
  /** True while pushed bytes are still held (the encoding is not decided yet): they must not be reused. */
  readonly holdsInput: boolean;
  /** Ends the file: flushes every open hour. Throws IngestError for fatal problems. */
  end(): FileIngestResult;
}

/** Bytes decoded and parsed at a time. */
const PIECE_BYTES = 65536;

export function createFileIngest(options: FileIngestOptions): FileIngest {
  const decoder = createDecoder();
  const sampleChars = options.sampleChars ?? 65536;
  const aggregator = createHourAggregator({
    timeZone: options.timeZone,
    tagOptions: options.tagOptions,
    maxGapSeconds: options.maxGapSeconds,
    onHour: options.onHour,
    onHourFields: options.onHourFields,
  });
  let held = '';
  let profile: LayoutProfile | null = null;
  let reader: RowReader | null = null;

  function start(complete: boolean): void {
    if (options.profile) profile = options.profile;
    else {
      const sniffed = sniffLayout(held, { complete, encoding: decoder.decision?.encoding ?? null });
      profile = options.answer ? options.answer(sniffed) : sniffed;
    }
    const onSample = options.onSample;
    const sink = onSample ? teeSinks(aggregator, createSampleEmitter(onSample, { cellText: (k) => reader!.cellText(k) })) : aggregator;
    reader = createRowReader(profile, {
      timeZone: options.timeZone,
      sink,
      onRejectedCell: options.onRejectedCell,
      maxRecordChars: options.maxRecordChars,
      valueLimits: options.valueLimits,
      timeWindow: options.timeWindow,
      goodQualityCodes: options.goodQualityCodes,
    });
    reader.push(held);
    held = '';
  }

  function feed(text: string): void {
    if (text.length === 0) return;
    if (reader) {
      reader.push(text);
      return;
    }
    held += text;
    if (held.length >= sampleChars) start(false);
  }

  return {
    push(chunk: Uint8Array): void {
      // Read in pieces of at most PIECE_BYTES whatever the caller's chunks: a 1 MiB chunk decoded and
      // parsed whole made the read of a 70 MB export twice as slow as 64 KiB pieces (1.67 s against
      // 0.77 s in one process, tests/ingest/pipeline.test.ts checks the pieces give the same hours).
      for (let o = 0; o < chunk.length; o += PIECE_BYTES) feed(decoder.push(o === 0 && chunk.length <= PIECE_BYTES ? chunk : chunk.subarray(o, o + PIECE_BYTES)));
    },
    get holdsInput(): boolean {
      return !decoder.decision;
    },
    end(): FileIngestResult {
      feed(decoder.end());
      if (!reader) start(true);
      const report = reader!.end();
      if (!decoder.decision) throw new IngestError('EMPTY_FILE', 'The file is empty.');
      checkRejectedShare(report, profile!, options.maxRejectedShare ?? 0.5);
      aggregator.flush();
      return { encoding: decoder.decision, profile: profile!, report };
    },
  };
}

/** Stops a file most of whose values were rejected: its layout does not fit it. */
export function checkRejectedShare(report: ReadReport, profile: LayoutProfile, maxShare: number): void {
  let bad = 0;
  for (const t of report.tags) bad += t.textCount + t.impossibleCount;
  const total = report.valueCount + bad;
  if (total === 0 || bad <= maxShare * total) return;
  const examples = report.tags
    .flatMap((t) => t.rejectedTexts.slice(0, 1).map((x) => `${t.tag}: '${x.text.slice(0, 30)}'`))
    .slice(0, 3)
    .join(', ');
  const mark = profile.decimalMark === ',' ? 'a decimal comma' : 'a decimal point';
  throw new IngestError(
    'MOSTLY_REJECTED',
    `${fixed(bad, 0)} of ${fixed(total, 0)} values (${fixed((100 * bad) / total, 0)} %) could not be read as numbers (for example ${examples}), so nothing was stored. ` +
      `The layout reads numbers with ${mark}${profile.thousandsSeparator ? ` and '${profile.thousandsSeparator}' between thousands` : ''}: ` +
      'is that right for this file? Check the layout (decimal mark, columns) and upload again.',
    { rejected: bad, values: report.valueCount, decimalMark: profile.decimalMark, question: { field: 'decimalMark', choices: ['.', ','] } },
  );
}
