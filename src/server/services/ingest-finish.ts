/**
 * The end of an upload's transaction: its summary (what the uploads page and the API show), the
 * engine's recompute of the hours it brought queued on the same transaction, and the commit.
 */
import type pg from 'pg';
import { fileVerdict, qualityCodesOf, tagReadCounts, type LayoutProfile } from '~/lib/ingest';
import type { uploads } from '../db/schema';
import { QUEUES, sendJob } from '~/jobs';
import { queue } from '../queue';
import type { StreamResult } from './ingest-stream';
import { storableJson } from './ingest-text';
import { HOUR_MS, hourCeil, hourFloor } from '~/lib/time';

const toIso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/**
 * The hours a file brought get their unit balances (re)computed by the engine's job, queued on the
 * file's own transaction: the job commits with the tag hours or not at all, so a worker killed
 * between the two can never leave hours that are never computed.
 */
async function queueRecompute(siteId: string, firstMs: number | null, lastMs: number | null, client: pg.PoolClient) {
  if (firstMs === null || lastMs === null) return;
  const payload = { siteId, fromMs: hourFloor(firstMs) - HOUR_MS, toMs: hourCeil(lastMs) + HOUR_MS };
  const boss = await queue();
  await sendJob(boss, QUEUES.computeUnitHours, payload, {
    retryLimit: 2,
    retryDelay: 10,
    db: { executeSql: (text: string, values: unknown[]) => client.query(text, values as unknown[]) },
  });
}

/** The upload's summary as stored and shown, and the upload's final state. */
function summaryOf(profile: LayoutProfile, r: StreamResult) {
  const warnings: { code: string; message: string; count: number; lines: number[] }[] = r.report.warnings.map((w) => ({ code: w.code, message: w.message, count: w.count, lines: w.lines }));
  if (r.replaced > 0) {
    warnings.push({
      code: 'REPLACED_HOURS',
      message: `This file's readings took the place of an earlier file's in ${r.replaced} tag hour(s): it holds readings for the same times. The earlier figures are kept in the history.`,
      count: r.replaced,
      lines: [],
    });
  }
  const verdict = fileVerdict(r.report);
  if (verdict.message) warnings.unshift({ code: 'TAGS_MOSTLY_REJECTED', message: verdict.message, count: verdict.problemTags.length, lines: [] });
  const summary = {
    rows: r.report.dataRowCount,
    tags: r.report.tags.length,
    newTags: r.newTags,
    hours: r.hours,
    values: r.report.valueCount,
    rejected: r.report.rejectedCount,
    rejectedStored: r.rejectsStored,
    blank: r.report.blankCount,
    impossible: r.report.tags.reduce((n, t) => n + t.impossibleCount, 0),
    outsideTimeWindow: r.report.tags.reduce((n, t) => n + t.outsideWindowCount, 0),
    replacedHours: r.replaced,
    combinedHours: r.combined,
    replacedOrCombinedHours: r.replaced + r.combined,
    firstTime: toIso(r.report.firstTimeMs),
    lastTime: toIso(r.report.lastTimeMs),
    encoding: r.encoding,
    layout: profile.layout,
    warnings,
    perTag: r.report.tags.map(perTagSummary),
    problemTags: verdict.problemTags,
    problems: verdict.message,
    goodQualityCodes: profile.quality ? qualityCodesOf(r.goodCodes) : undefined,
  };
  return { summary, state: verdict.state };
}

function perTagSummary(t: StreamResult['report']['tags'][number]) {
  const c = tagReadCounts(t);
  return {
    tag: t.tag,
    values: t.valueCount,
    read: c.read,
    rejected: c.rejected,
    notNumbers: t.textCount,
    badQuality: t.badQualityCount,
    impossible: t.impossibleCount,
    outsideTimeWindow: t.outsideWindowCount,
    blank: t.blankCount,
    lostShare: c.lostShare,
    examples: c.examples,
  };
}

/** Closes the upload's transaction with its summary (and the hash taken during the read): the file's tag hours become visible at once. */
export async function finish(up: typeof uploads.$inferSelect, profile: LayoutProfile, r: StreamResult, profileId: string | null, client: pg.PoolClient) {
  const { summary, state } = summaryOf(profile, r);
  // clock_timestamp(): the moment the upload finished (now() would be when its transaction began).
  await client.query(
    `update uploads set status = $6, finished_at = clock_timestamp(), summary = $2, profile_id = $3, bytes_read = $4, rows_read = $5, detection = null,
       sha256 = coalesce($7, sha256) where id = $1`,
    [up.id, storableJson(summary), profileId, r.bytes, r.report.dataRowCount, state, r.sha256],
  );
  await queueRecompute(up.siteId, r.report.firstTimeMs, r.report.lastTimeMs, client);
  await client.query('commit');
  return { summary, state };
}
