/**
 * Overlapping files merged sample by sample (docs/api.md, "Overlapping files").
 *
 * When a file brings tag hours that are already stored, those hours are recomputed from the samples
 * of every file that brought them: the raw files are re-read from the store (only the samples of the
 * overlapped hours and of the 15 minutes around them are kept), samples are pooled by time, and at
 * the same instant the newer upload's value wins (src/lib/ingest/merge.ts). The previous figures go
 * to tag_hour_history with the upload that changed them; tag_hour_uploads keeps which files brought
 * each tag's hours. Runs inside the new file's transaction, under the site's ingest lock.
 */
import { eq, inArray } from 'drizzle-orm';
import type pg from 'pg';
import { createFileIngest, mergeHours, tagHourKey, type FileIngestOptions, type LayoutProfile, type Sample, type SampleSource, type TagHour } from '~/lib/ingest';
import { db } from '../db/client';
import { TAG_HOUR_FLAGS, layoutProfiles, uploads } from '../db/schema';
import { objectStream } from '../storage';
import { HOUR_MS } from '~/lib/time';

/** An overlapped tag hour: stored figures exist and this file brings the same hour again. */
export interface ClashKey {
  tag: string;
  tagId: string;
  hourStartMs: number;
}

/** Options every re-read uses (the current file's limits, window, codes and tag options). */
export type RereadOptions = Omit<FileIngestOptions, 'onHour' | 'onSample' | 'onRejectedCell' | 'profile' | 'answer'>;

/** Samples kept around an overlapped hour, so segments across its edges are drawn (the largest gap bridged). */
const MARGIN_MS = 900_000;
/** Overlapped tag hours recomputed per pass over the files (bounds the samples held in memory). */
const HOURS_PER_PASS = 20_000;

interface SourceFile {
  uploadId: string;
  objectKey: string;
  profile: LayoutProfile | undefined;
  createdAt: Date;
}

/** Which stored uploads brought hours of the overlapped tags in the overlapped range. */
async function olderSources(client: pg.PoolClient, uploadId: string, keys: ClashKey[]): Promise<{ uploadId: string; tagId: string; first: number; last: number }[]> {
  const ids = [...new Set(keys.map((k) => k.tagId))];
  let lo = Infinity;
  let hi = -Infinity;
  for (const k of keys) {
    lo = Math.min(lo, k.hourStartMs);
    hi = Math.max(hi, k.hourStartMs);
  }
  const res = await client.query(
    `select thu.upload_id, thu.tag_id::text as tag_id, thu.first_hour, thu.last_hour from tag_hour_uploads thu
       join uploads u on u.id = thu.upload_id
     where thu.tag_id = any($1::int[]) and thu.first_hour <= $3 and thu.last_hour >= $2 and thu.upload_id <> $4
       and u.status in ('done', 'read-with-problems')`,
    [ids, new Date(lo).toISOString(), new Date(hi).toISOString(), uploadId],
  );
  return (res.rows as { upload_id: string; tag_id: string; first_hour: Date; last_hour: Date }[]).map((r) => ({
    uploadId: r.upload_id,
    tagId: r.tag_id,
    first: r.first_hour.getTime(),
    last: r.last_hour.getTime(),
  }));
}

async function sourceFiles(uploadIds: string[], own: { uploadId: string; profile: LayoutProfile }): Promise<SourceFile[]> {
  const rows = await db().select().from(uploads).where(inArray(uploads.id, uploadIds));
  const out: SourceFile[] = [];
  for (const u of rows) {
    let profile: LayoutProfile | undefined;
    if (u.id === own.uploadId) profile = own.profile;
    else if (u.profileId) {
      const [p] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.id, u.profileId));
      profile = p?.profile as unknown as LayoutProfile | undefined;
    }
    out.push({ uploadId: u.id, objectKey: u.objectKey, profile, createdAt: u.createdAt });
  }
  // priority: the order the uploads were made (newer wins at the same instant)
  return out.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || a.uploadId.localeCompare(b.uploadId));
}

/** The samples of one stored file that fall in (or next to) the wanted hours of each tag. */
async function rereadSamples(file: SourceFile, windows: Map<string, number[]>, { profile: _own, ...options }: RereadOptions & { profile?: LayoutProfile }): Promise<Sample[]> {
  const kept: Sample[] = [];
  const near = (tag: string, t: number) => {
    const starts = windows.get(tag);
    if (!starts) return false;
    for (const s of starts) if (t >= s - MARGIN_MS && t <= s + HOUR_MS + MARGIN_MS) return true;
    return false;
  };
  const ingest = createFileIngest({
    ...options,
    profile: file.profile,
    onHour: () => undefined,
    onSample: (s) => {
      if (near(s.tag, s.timeMs)) kept.push(s);
    },
  });
  for await (const chunk of await objectStream(file.objectKey)) {
    const buf = chunk as Buffer;
    ingest.push(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
  }
  ingest.end();
  return kept;
}

/**
 * Recomputes the overlapped hours of this upload from the samples of every file that brought them,
 * and writes them with their history. Returns how many hours hold this file's samples only
 * (replaced) and how many hold samples of several files (combined).
 */
export async function mergeOverlappedHours(
  client: pg.PoolClient,
  uploadId: string,
  keys: ClashKey[],
  options: RereadOptions & { profile: LayoutProfile },
): Promise<{ replaced: number; combined: number }> {
  let replaced = 0;
  let combined = 0;
  const sorted = [...keys].sort((a, b) => a.hourStartMs - b.hourStartMs);
  for (let i = 0; i < sorted.length; i += HOURS_PER_PASS) {
    const part = sorted.slice(i, i + HOURS_PER_PASS);
    const r = await mergePass(client, uploadId, part, options);
    replaced += r.replaced;
    combined += r.combined;
  }
  return { replaced, combined };
}

async function mergePass(client: pg.PoolClient, uploadId: string, keys: ClashKey[], options: RereadOptions & { profile: LayoutProfile }) {
  const older = await olderSources(client, uploadId, keys);
  const files = await sourceFiles([...new Set([uploadId, ...older.map((o) => o.uploadId)])], { uploadId, profile: options.profile });
  const sources: SampleSource[] = [];
  for (const [priority, file] of files.entries()) {
    // the wanted hours of each tag this file brought (all overlapped hours for the new file itself)
    const windows = new Map<string, number[]>();
    for (const k of keys) {
      const mine = file.uploadId === uploadId || older.some((o) => o.uploadId === file.uploadId && o.tagId === k.tagId && o.first <= k.hourStartMs && o.last >= k.hourStartMs);
      if (mine) windows.set(k.tag, [...(windows.get(k.tag) ?? []), k.hourStartMs]);
    }
    if (windows.size === 0) continue;
    sources.push({ priority, samples: await rereadSamples(file, windows, options) });
  }
  const own = files.findIndex((f) => f.uploadId === uploadId);
  const wanted = new Set(keys.map((k) => tagHourKey(k.tag, k.hourStartMs)));
  const { hours, contributors } = mergeHours(sources, { timeZone: options.timeZone, tagOptions: options.tagOptions, maxGapSeconds: options.maxGapSeconds, wanted });
  const idOf = new Map(keys.map((k) => [k.tag, k.tagId]));
  let replaced = 0;
  let combined = 0;
  const flagsFor = (h: TagHour) => {
    const from = contributors.get(tagHourKey(h.tag, h.hourStartMs)) ?? [];
    const onlyOwn = from.length === 1 && from[0] === own;
    if (onlyOwn) replaced++;
    else combined++;
    return onlyOwn ? TAG_HOUR_FLAGS['replaced-older-file'] : TAG_HOUR_FLAGS['combined-files'];
  };
  await writeMerged(client, uploadId, hours, idOf, flagsFor);
  return { replaced, combined };
}

/** Keeps the stored figures in the history, then writes the merged ones over them. */
async function writeMerged(client: pg.PoolClient, uploadId: string, hours: TagHour[], idOf: Map<string, string>, flagsFor: (h: TagHour) => number) {
  if (hours.length === 0) return;
  const ids = hours.map((h) => idOf.get(h.tag));
  const starts = hours.map((h) => new Date(h.hourStartMs).toISOString());
  await client.query(
    `insert into tag_hour_history (tag_id, hour_start, replaced_by_upload_id, previous)
     select th.tag_id, th.hour_start, $1, to_jsonb(th) from tag_hours th
       join unnest($2::int[], $3::timestamptz[]) as k(tag_id, hour_start) on k.tag_id = th.tag_id and k.hour_start = th.hour_start`,
    [uploadId, ids, starts],
  );
  await client.query(
    `insert into tag_hours as o (tag_id, hour_start, samples, mean, min, max, std, first, last, covered_s, non_numeric, out_of_range, flags)
     select * from unnest($1::int[], $2::timestamptz[], $3::int[], $4::float4[], $5::float4[], $6::float4[], $7::float4[], $8::float4[], $9::float4[],
       $10::smallint[], $11::smallint[], $12::smallint[], $13::smallint[])
     on conflict (tag_id, hour_start) do update set samples = excluded.samples, mean = excluded.mean, min = excluded.min, max = excluded.max,
       std = excluded.std, first = excluded.first, last = excluded.last,
       covered_s = excluded.covered_s, non_numeric = excluded.non_numeric, out_of_range = excluded.out_of_range, flags = excluded.flags`,
    [
      ids,
      starts,
      hours.map((h) => h.sampleCount),
      hours.map((h) => finiteOrNull(h.mean)),
      hours.map((h) => finiteOrNull(h.min)),
      hours.map((h) => finiteOrNull(h.max)),
      hours.map((h) => finiteOrNull(h.stdDev)),
      hours.map((h) => finiteOrNull(h.first)),
      hours.map((h) => finiteOrNull(h.last)),
      hours.map((h) => Math.round(h.coveredSeconds)),
      hours.map((h) => Math.min(32767, h.nonNumericCount + h.badQualityCount)),
      hours.map((h) => Math.min(32767, h.outOfRangeCount)),
      hours.map((h) => readerFlags(h) | flagsFor(h)),
    ],
  );
}

const finiteOrNull = (v: number | null) => (v === null || !Number.isFinite(v) ? null : v);

/** TAG_HOUR_FLAGS bits of an hour as the reader made it. */
export function readerFlags(h: TagHour): number {
  let f = 0;
  if (h.flatline) f |= TAG_HOUR_FLAGS.flatline;
  if (h.duplicateCount) f |= TAG_HOUR_FLAGS['duplicate-times'];
  if (h.outOfOrderCount) f |= TAG_HOUR_FLAGS['backwards-times'];
  if (h.badQualityCount) f |= TAG_HOUR_FLAGS['bad-quality'];
  if (h.uncertainCount) f |= TAG_HOUR_FLAGS['uncertain-quality'];
  return f;
}
