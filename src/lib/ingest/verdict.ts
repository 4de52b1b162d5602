/**
 * How a read file ends: plainly read, or read with problems when a tag lost more than half of its
 * values. The per-tag counts come from the read report; "lost" means rejected for any reason (not a
 * number, a bad quality code, physically impossible, time outside the accepted window). Blank cells
 * are no values and lose nothing.
 */
import type { ReadReport, TagReadSummary } from './reader';

/** Largest share of a tag's values that may be rejected before the file ends read-with-problems. */
export const MAX_TAG_LOSS_SHARE = 0.5;

export interface TagReadCounts {
  tag: string;
  /** Values read (good or uncertain numbers). */
  read: number;
  /** Values rejected, all reasons. */
  rejected: number;
  notNumbers: number;
  badQuality: number;
  impossible: number;
  outsideTimeWindow: number;
  blank: number;
  /** rejected / (read + rejected); 0 for a tag without any value cell. */
  lostShare: number;
  /** Distinct rejected texts (with the quality code or the reason) and their counts. */
  examples: { text: string; count: number }[];
}

export type FileVerdictState = 'done' | 'read-with-problems';

export interface FileVerdict {
  state: FileVerdictState;
  /** Tags that lost more than MAX_TAG_LOSS_SHARE of their values, worst first. */
  problemTags: { tag: string; read: number; rejected: number; lostShare: number }[];
  /** One sentence for the report, or null when the file read plainly. */
  message: string | null;
}

export function tagReadCounts(t: TagReadSummary): TagReadCounts {
  const rejected = t.textCount + t.badQualityCount + t.impossibleCount + t.outsideWindowCount;
  const total = t.valueCount + rejected;
  return {
    tag: t.tag,
    read: t.valueCount,
    rejected,
    notNumbers: t.textCount,
    badQuality: t.badQualityCount,
    impossible: t.impossibleCount,
    outsideTimeWindow: t.outsideWindowCount,
    blank: t.blankCount,
    lostShare: total === 0 ? 0 : rejected / total,
    examples: t.rejectedTexts.slice(0, 3),
  };
}

/** The end state of a read file from its report. */
export function fileVerdict(report: ReadReport, maxShare = MAX_TAG_LOSS_SHARE): FileVerdict {
  const problemTags = report.tags
    .map(tagReadCounts)
    .filter((c) => c.lostShare > maxShare)
    .sort((a, b) => b.lostShare - a.lostShare)
    .map(({ tag, read, rejected, lostShare }) => ({ tag, read, rejected, lostShare }));
  if (problemTags.length === 0) return { state: 'done', problemTags, message: null };
  const listed = problemTags
    .slice(0, 5)
    .map((t) => `${t.tag} (${t.rejected} of ${t.read + t.rejected} rejected)`)
    .join(', ');
  return {
    state: 'read-with-problems',
    problemTags,
    message:
      `${problemTags.length} tag(s) lost more than half of their values: ${listed}${problemTags.length > 5 ? ' ...' : ''}. ` +
      'Their hours hold only what was read; the rejected cells and their reasons are in the rejects file.',
  };
}
