/**
 * The reader's last steps: the warnings of what was counted, the errors of a file that gave no data
 * row, and the read report.
 */
import { IngestError } from './errors';
import type { LayoutProfile } from './profile';
import { MAX_TAG_NAME_CHARS } from './reader-types';
import type { IngestWarning, IngestWarningCode, ReadReport, TagReadSummary } from './reader-types';
import type { ReadTally, TagState, TagTable, WarningCounter } from './reader-tally';
import type { LocalClockStats } from './time';
import { isoUtc } from './time';
import { fixed } from '../format';

/** A count in the words of a warning, grouped by the one formatter (src/lib/format.ts). */
const n = (count: number) => fixed(count, 0);

/** What the report is made from. */
export interface ReadEnd {
  p: LayoutProfile;
  tags: TagTable;
  tally: ReadTally;
  clock: LocalClockStats;
  malformedQuoteCount: number;
  window: { minMs: number; maxMs: number };
}

const windowIso = (ms: number) => (Number.isFinite(ms) ? isoUtc(ms) : 'open');
const quoted = (xs: Iterable<string>) => [...xs].map((x) => `'${x}'`).join(', ');

/** Usable numbers of a tag (wide files count them from the rows). */
function valueCountOf(e: ReadEnd, st: TagState): number {
  return e.p.wide ? e.tally.dataRows - st.blankCount - st.textCount - st.impossibleCount - st.badQualityCount : st.valueCount;
}

/** Throws when no data row was read: every time outside the window, or none readable (HEADER_ONLY). */
export function assertDataRows(e: ReadEnd): void {
  const t = e.tally;
  if (t.dataRows > 0) return;
  if (t.outsideWindow.count > 0) {
    throw new IngestError(
      'TIMES_OUTSIDE_WINDOW',
      `Every row's time lies outside the accepted window (${windowIso(e.window.minMs)} to ${windowIso(e.window.maxMs)}), for example ` +
        `${quoted(t.outsideWindowExamples)}. Check the clock of the exporting system and the time settings of the layout.`,
      { rows: t.outsideWindow.count, minIso: windowIso(e.window.minMs), maxIso: windowIso(e.window.maxMs) },
    );
  }
  throw new IngestError(
    'HEADER_ONLY',
    t.badTime.count > 0
      ? `No row has a readable time (${n(t.badTime.count)} tried, for example ${quoted(t.badTimeExamples)}). Check the time settings of the layout.`
      : 'The file has header lines but no data rows. Export a time range that contains data.',
    { unreadableTimes: t.badTime.count },
  );
}

/** The read report (call after assertDataRows). */
export function readReport(e: ReadEnd): ReadReport {
  let valueCount = 0;
  let rejectedCount = 0;
  let blankCount = 0;
  const tags: TagReadSummary[] = e.tags.states.map((st) => {
    const valueCountK = valueCountOf(e, st);
    valueCount += valueCountK;
    rejectedCount += st.textCount + st.badQualityCount + st.impossibleCount + st.outsideWindowCount;
    blankCount += st.blankCount;
    return {
      tag: st.tag,
      valueCount: valueCountK,
      blankCount: st.blankCount,
      textCount: st.textCount,
      badQualityCount: st.badQualityCount,
      uncertainCount: st.uncertainCount,
      impossibleCount: st.impossibleCount,
      outsideWindowCount: st.outsideWindowCount,
      rejectedTexts: [...st.texts].map(([text, count]) => ({ text, count })).sort((a, b) => b.count - a.count),
      rejectedLines: st.rejectedLines,
    };
  });
  const t = e.tally;
  return {
    dataRowCount: t.dataRows,
    headerRowCount: e.p.headerRowCount,
    valueCount,
    rejectedCount,
    blankCount,
    firstTimeMs: Number.isFinite(t.firstTimeMs) ? t.firstTimeMs : null,
    lastTimeMs: Number.isFinite(t.lastTimeMs) ? t.lastTimeMs : null,
    tags,
    warnings: readWarnings(e),
  };
}

/** The warnings of a read, in a fixed order. */
export function readWarnings(e: ReadEnd): IngestWarning[] {
  const out: IngestWarning[] = [];
  const t = e.tally;
  const add = (code: IngestWarningCode, c: WarningCounter, message: string) => {
    if (c.count > 0) out.push({ code, message, count: c.count, lines: c.lines });
  };
  add('RAGGED_ROWS', t.ragged, `${n(t.ragged.count)} row(s) do not have ${n(e.p.columnCount)} fields; missing cells were read as blank, extra cells ignored.`);
  add('UNREADABLE_TIMES', t.badTime, `${n(t.badTime.count)} row(s) have a time that cannot be read (for example ${quoted(t.badTimeExamples)}); those rows were skipped.`);
  add('DUPLICATE_TIMES', t.duplicates, `${n(t.duplicates.count)} row(s) repeat the time of the row before (for the same tag); the later value wins.`);
  add('BACKWARDS_TIMES', t.backwards, `${n(t.backwards.count)} row(s) have a time earlier than the row before (for the same tag); the aggregator drops them.`);
  out.push(...clockWarnings(e.clock));
  add('UNKNOWN_QUALITY', t.unknownQuality, `${n(t.unknownQuality.count)} quality cell(s) are not known words or codes (${quoted(t.unknownQualityTexts)}); their values were used as uncertain.`);
  if (e.malformedQuoteCount > 0) {
    out.push({ code: 'MALFORMED_QUOTES', message: `${n(e.malformedQuoteCount)} quoted field(s) have text after the closing quote; it was kept.`, count: e.malformedQuoteCount, lines: [] });
  }
  add('BLANK_TAG_NAMES', t.blankTags, `${n(t.blankTags.count)} row(s) have no tag name and were skipped.`);
  add('BAD_TAG_NAMES', t.badTagNames, `${n(t.badTagNames.count)} row(s) have a tag name longer than ${n(MAX_TAG_NAME_CHARS)} characters or made of control characters; they were skipped.`);
  add(
    'TIMES_OUTSIDE_WINDOW',
    t.outsideWindow,
    `${n(t.outsideWindow.count)} row(s) have a time outside the accepted window (${windowIso(e.window.minMs)} to ${windowIso(e.window.maxMs)}), for example ` +
      `${quoted(t.outsideWindowExamples)}; their cells were rejected.`,
  );
  add('IMPOSSIBLE_VALUES', t.impossible, `${n(t.impossible.count)} value(s) are physically impossible and were rejected, for example ${quoted(t.impossibleExamples)}.`);
  const empty = e.tags.states.filter((st) => valueCountOf(e, st) === 0 && st.textCount + st.impossibleCount > 0);
  if (empty.length > 0) {
    out.push({
      code: 'COLUMNS_WITHOUT_NUMBERS',
      message:
        `${n(empty.length)} tag(s) hold no usable number in the whole file: ` +
        empty
          .slice(0, 10)
          .map((st) => `${st.tag} (for example '${[...st.texts.keys()][0] ?? ''}')`)
          .join(', ') +
        (empty.length > 10 ? ' ...' : '') +
        '. Check that the export writes values for them (NaN, error words and fill values are not readings).',
      count: empty.length,
      lines: [],
    });
  }
  return out;
}

/** The daylight-saving warnings of the local clock. */
function clockWarnings(cs: LocalClockStats): IngestWarning[] {
  const out: IngestWarning[] = [];
  const repeated = cs.repeatedFirstPassCount + cs.repeatedSecondPassCount;
  if (repeated > 0) {
    out.push({
      code: 'DST_REPEATED_HOUR',
      message:
        `${n(repeated)} local time(s) fall in the hour repeated when clocks go back; resolved by order: ` +
        `${n(cs.repeatedFirstPassCount)} read as the first pass (summer offset), ${n(cs.repeatedSecondPassCount)} as the second pass (after the time stepped back).` +
        (cs.repeatedSecondPassCount === 0 ? ' No step back was seen, so none was read as the second pass; check those rows.' : ''),
      count: repeated,
      lines: cs.repeatedLines,
    });
  }
  if (cs.gapCount > 0) {
    out.push({
      code: 'DST_GAP',
      message: `${n(cs.gapCount)} local time(s) fall in the hour skipped when clocks go forward, so they never happened on a correct clock; read with the offset before the change (02:30 as 03:30 summer time).`,
      count: cs.gapCount,
      lines: cs.gapLines,
    });
  }
  return out;
}
