import { GetObjectCommand } from '@aws-sdk/client-s3';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { from as copyFrom } from 'pg-copy-streams';
import { and, eq, sql } from 'drizzle-orm';
import type pg from 'pg';
import {
  IngestError,
  createDecoder,
  createFileIngest,
  previewRows,
  sniffLayout,
  type LayoutProfile,
  type RejectedCell,
  type TagHour,
} from '../../lib/ingest';
import { db, pgPool } from '../db/client';
import { TAG_HOUR_FLAGS, layoutProfiles, sites, tags, uploads } from '../db/schema';
import { ensureMonthPartitions } from '../db/partitions';
import { QUEUES } from '../../jobs';
import { queue } from '../queue';
import { bucket, objectStream, s3 } from '../storage';

/** Bytes read from the start of a file to decide its layout. */
const SAMPLE_BYTES = 96 * 1024;
/** Tag hours written per statement. */
const STAGE_BATCH = 5000;
/** Rejected cells kept per upload for its report (the counts are always complete). */
export const MAX_STORED_REJECTS = 100_000;
/** How often progress is written while a file streams [ms]. */
const PROGRESS_EVERY_MS = 500;
/** Attempts before an upload that keeps failing for reasons outside the file is marked failed. */
export const MAX_ATTEMPTS = 3;

export type IngestOutcome =
  | { kind: 'done'; summary: Record<string, unknown> }
  | { kind: 'needs-review' }
  | { kind: 'failed'; reason: string }
  | { kind: 'skipped'; why: string };

async function headBytes(key: string, n: number, size: number | null): Promise<Uint8Array> {
  if (size === 0) throw new IngestError('EMPTY_FILE', 'The file is empty (0 bytes). Export the data again and upload the new file.');
  const out = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key, Range: `bytes=0-${n - 1}` }));
  const chunks: Buffer[] = [];
  for await (const c of out.Body as Readable) chunks.push(c as Buffer);
  return new Uint8Array(Buffer.concat(chunks));
}

/** Decides the layout from the file's first bytes: a saved profile of the site, or a fresh sniff. */
async function decideLayout(up: typeof uploads.$inferSelect, timeZone: string) {
  if (up.profileId) {
    const [p] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.id, up.profileId));
    if (p) return { profile: p.profile as unknown as LayoutProfile, saved: true as const };
  }
  const bytes = await headBytes(up.objectKey, SAMPLE_BYTES, up.sizeBytes);
  const decoder = createDecoder();
  const text = decoder.push(bytes) + (bytes.length < SAMPLE_BYTES ? decoder.end() : '');
  const complete = bytes.length < SAMPLE_BYTES;
  const sniffed = sniffLayout(text, { complete, encoding: decoder.decision?.encoding ?? null });
  const [known] = await db()
    .select()
    .from(layoutProfiles)
    .where(and(eq(layoutProfiles.siteId, up.siteId), eq(layoutProfiles.fingerprint, sniffed.fingerprint)));
  if (known) return { profile: known.profile as unknown as LayoutProfile, saved: true as const, profileId: known.id };
  let preview: unknown[] = [];
  try {
    preview = previewRows(text, sniffed, 8, { timeZone });
  } catch {
    preview = [];
  }
  return { profile: sniffed, saved: false as const, preview, encoding: decoder.decision };
}

/**
 * Reads one upload: decides its layout, then streams the raw object through the ingest core and
 * writes its tag hours in one transaction. A per-upload advisory lock keeps two workers off the same
 * file; a crash rolls the transaction back, so the next attempt starts from the start.
 */
export async function ingestUpload(uploadId: string): Promise<IngestOutcome> {
  const client = await pgPool().connect();
  try {
    const { rows } = await client.query('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', ['ingest:' + uploadId]);
    if (!rows[0].ok) return { kind: 'skipped', why: 'another worker is reading this upload' };
    try {
      return await ingestLocked(uploadId, client);
    } finally {
      await client.query('select pg_advisory_unlock(hashtextextended($1, 0))', ['ingest:' + uploadId]);
    }
  } finally {
    client.release();
  }
}

async function ingestLocked(uploadId: string, client: pg.PoolClient): Promise<IngestOutcome> {
  const startedMs = performance.now();
  const [up] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
  if (!up) return { kind: 'skipped', why: 'no such upload' };
  if (up.status !== 'queued' && up.status !== 'processing') return { kind: 'skipped', why: `upload is ${up.status}` };
  const [site] = await db().select().from(sites).where(eq(sites.id, up.siteId));
  const timeZone = site?.timeZone ?? 'UTC';

  await db()
    .update(uploads)
    .set({ status: 'processing', attempts: sql`${uploads.attempts} + 1`, startedAt: new Date(), rowsRead: 0, bytesRead: 0, failureReason: null })
    .where(eq(uploads.id, uploadId));
  await client.query('delete from upload_rejects where upload_id = $1', [uploadId]);

  try {
    const layout = await decideLayout(up, timeZone);
    let profile = layout.profile;
    let profileId = 'profileId' in layout ? layout.profileId : up.profileId;
    if (!layout.saved) {
      const blocking = profile.questions.some((q) => q.blocking);
      if (up.source === 'browser' || blocking) {
        await db()
          .update(uploads)
          .set({ status: 'needs-review', detection: { profile, preview: layout.preview, encoding: layout.encoding ?? null } as Record<string, unknown> })
          .where(eq(uploads.id, uploadId));
        return { kind: 'needs-review' };
      }
      // A machine upload of a shape the file itself decides: keep the decision as the site's profile.
      const [saved] = await db()
        .insert(layoutProfiles)
        .values({ siteId: up.siteId, fingerprint: profile.fingerprint, name: `detected from ${up.fileName}`, profile: profile as unknown as Record<string, unknown> })
        .onConflictDoUpdate({ target: [layoutProfiles.siteId, layoutProfiles.fingerprint], set: { fingerprint: profile.fingerprint } })
        .returning();
      profile = saved!.profile as unknown as LayoutProfile;
      profileId = saved!.id;
    }
    const result = await readIntoTransaction(up, profile, timeZone, client);
    const summary = await finish(up, profile, result, profileId ?? null, client);
    await queueRecompute(up.siteId, result.report.firstTimeMs, result.report.lastTimeMs);
    if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${uploadId}: read and committed in ${((performance.now() - startedMs) / 1000).toFixed(2)} s`);
    return { kind: 'done', summary };
  } catch (err) {
    await client.query('rollback').catch(() => undefined);
    if (err instanceof IngestError) {
      const where = err.line ? ` (line ${err.line})` : '';
      const reason = `${err.message}${where}`;
      await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: new Date(), summary: { code: err.code, details: err.details } }).where(eq(uploads.id, uploadId));
      return { kind: 'failed', reason };
    }
    const [now] = await db().select({ attempts: uploads.attempts }).from(uploads).where(eq(uploads.id, uploadId));
    if ((now?.attempts ?? MAX_ATTEMPTS) >= MAX_ATTEMPTS) {
      const reason = `Reading stopped ${now?.attempts} times for a reason outside the file (${(err as Error).message}). The raw file is kept; retry when the service is back.`;
      await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: new Date() }).where(eq(uploads.id, uploadId));
      return { kind: 'failed', reason };
    }
    await db().update(uploads).set({ status: 'queued' }).where(eq(uploads.id, uploadId));
    throw err;
  }
}

interface StreamResult {
  report: ReturnType<ReturnType<typeof createFileIngest>['end']>['report'];
  encoding: string;
  hours: number;
  replaced: number;
  newTags: number;
  rejectsStored: number;
  bytes: number;
}

/** Batches in flight on the connection while the parser reads on (bounded, so memory stays flat). */
const MAX_IN_FLIGHT = 3;

/**
 * Streams the raw object through the ingest core and writes its tag hours inside ONE transaction
 * on a dedicated connection, batch by batch while the file is still being read; the transaction
 * commits only when the whole file is read, so a failure or a killed worker leaves no tag hour of
 * it behind. Progress goes through another connection, so the uploads page sees it live.
 */
async function readIntoTransaction(up: typeof uploads.$inferSelect, profile: LayoutProfile, timeZone: string, client: pg.PoolClient): Promise<StreamResult> {
  const known = await db().select().from(tags).where(eq(tags.siteId, up.siteId));
  const byName = new Map(known.map((t) => [t.name, t]));
  const tagId = new Map(known.map((t) => [t.name, String(t.seq)])); // tags.seq, the key of tag hours
  const unitOf = new Map<string, string | null>();
  const descOf = new Map<string, string | null>();
  for (const c of profile.wide?.columns ?? []) {
    unitOf.set(c.tag, c.unit);
    descOf.set(c.tag, c.description);
  }

  let batch: TagHour[] = [];
  let rejects: RejectedCell[] = [];
  let rejectsStored = 0;
  let rejectSeq = 0;
  let hours = 0;
  let replaced = 0;
  let newTags = 0;
  let latestExistingMs: number | null = null;
  // Writes run one after another on the transaction's connection while the parser reads on (the
  // database works on the other core); the parser waits when more than MAX_IN_FLIGHT batches are
  // queued, so memory stays bounded.
  let chain: Promise<unknown> = Promise.resolve();
  const pending: Promise<unknown>[] = [];
  let failure: unknown = null;
  let writeMs = 0;
  const enqueue = (work: () => Promise<unknown>) => {
    chain = chain.then(async () => {
      if (failure) return;
      const t0 = performance.now();
      try {
        await work();
      } catch (err) {
        failure ??= err;
      } finally {
        writeMs += performance.now() - t0;
      }
    });
    pending.push(chain);
  };
  /** Lets the parser run ahead of the database by at most MAX_IN_FLIGHT batches. */
  const throttle = async () => {
    while (pending.length > MAX_IN_FLIGHT) await pending.shift();
  };

  async function ensureTags(names: string[]) {
    const missing = [...new Set(names)].filter((n) => !tagId.has(n));
    if (!missing.length) return;
    for (const n of missing) tagId.set(n, ''); // claimed; filled below
    const res = await client.query(
      `insert into tags (site_id, name, unit_hint, description, last_upload_id)
       select $1, n, u, d, $5 from unnest($2::text[], $3::text[], $4::text[]) as x(n, u, d)
       on conflict (site_id, name) do update set last_upload_id = excluded.last_upload_id,
         unit_hint = coalesce(tags.unit_hint, excluded.unit_hint), description = coalesce(tags.description, excluded.description)
       returning seq::text as id, name, (xmax = 0) as inserted`,
      [up.siteId, missing, missing.map((n) => unitOf.get(n) ?? null), missing.map((n) => descOf.get(n) ?? null), up.id],
    );
    for (const r of res.rows as { id: string; name: string; inserted: boolean }[]) {
      tagId.set(r.name, r.id);
      if (r.inserted) newTags++;
    }
  }

  const flushHours = () => {
    if (!batch.length) return;
    const rows = batch;
    batch = [];
    hours += rows.length;
    const names = rows.map((h) => h.tag);
    enqueue(async () => {
      await ensureTags(names);
      replaced += await writeHours(client, up.id, rows, tagId, latestExistingMs);
    });
  };
  const flushRejects = () => {
    if (!rejects.length) return;
    const rows = rejects;
    rejects = [];
    const start = rejectSeq;
    rejectSeq += rows.length;
    enqueue(() => insertRejects(client, up.id, start, rows));
  };

  const ingest = createFileIngest({
    timeZone,
    profile,
    tagOptions: (tag) => {
      const t = byName.get(tag);
      if (!t) return {};
      return {
        kind: t.kind === 'status' ? 'status' : 'analog',
        flatlineLimitSeconds: t.flatlineLimitSeconds,
        validMin: t.validMin ?? undefined,
        validMax: t.validMax ?? undefined,
      };
    },
    onHour: (h) => {
      batch.push(h);
      if (batch.length >= STAGE_BATCH) flushHours();
    },
    onRejectedCell: (cell) => {
      if (rejectsStored >= MAX_STORED_REJECTS) return;
      rejectsStored++;
      rejects.push(cell);
      if (rejects.length >= STAGE_BATCH) flushRejects();
    },
  });

  await client.query('begin');
  // One file of a site at a time writes tag hours, so shared hours are combined in a defined order.
  await client.query('select pg_advisory_xact_lock(hashtextextended($1, 0))', ['ingest-site:' + up.siteId]);
  const latest = await client.query(
    `select max(l.hour_start) as last from tags t
       cross join lateral (select hour_start from tag_hours where tag_id = t.seq order by hour_start desc limit 1) l
     where t.site_id = $1`,
    [up.siteId],
  );
  latestExistingMs = latest.rows[0]?.last ? (latest.rows[0].last as Date).getTime() : null;
  const stream = await objectStream(up.objectKey);
  let bytes = 0;
  let lines = 0;
  let lastProgress = Date.now();
  for await (const chunk of stream) {
    const buf = chunk as Buffer;
    bytes += buf.length;
    for (let i = buf.indexOf(10); i !== -1; i = buf.indexOf(10, i + 1)) lines++;
    ingest.push(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
    await throttle();
    if (failure) throw failure;
    if (Date.now() - lastProgress > PROGRESS_EVERY_MS) {
      lastProgress = Date.now();
      void db().update(uploads).set({ bytesRead: bytes, rowsRead: lines }).where(eq(uploads.id, up.id)).catch(() => undefined);
    }
  }
  const { report, encoding } = ingest.end();
  flushHours();
  flushRejects();
  await chain;
  if (failure) throw failure;
  if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${up.id}: ${hours} tag hours, database writes ${(writeMs / 1000).toFixed(2)} s`);
  return { report, encoding: encoding.encoding, hours, replaced, newTags, rejectsStored, bytes };
}

const toIso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/** TAG_HOUR_FLAGS bits of an hour as the reader made it. */
function flagsOf(h: TagHour): number {
  let f = 0;
  if (h.flatline) f |= TAG_HOUR_FLAGS.flatline;
  if (h.duplicateCount) f |= TAG_HOUR_FLAGS['duplicate-times'];
  if (h.outOfOrderCount) f |= TAG_HOUR_FLAGS['backwards-times'];
  if (h.badQualityCount) f |= TAG_HOUR_FLAGS['bad-quality'];
  if (h.uncertainCount) f |= TAG_HOUR_FLAGS['uncertain-quality'];
  return f;
}
/** Counts are smallint in tag hours (32767 and more is "very many"). */
const count16 = (n: number) => Math.min(32767, n);
const spanOf = (ms: number | null, hourStartMs: number) => (ms === null ? null : ms - hourStartMs);

/**
 * Writes a batch of an upload's tag hours. A tag hour already holding another file's figures (two
 * shift exports sharing an hour) is combined: when the two files' sample spans in that hour do not
 * overlap, the figures are pooled exactly (mean and spread weighted by covered time, extremes,
 * counts); when they overlap, the same readings arrived twice and the newer file's figures replace
 * the older ones for that hour. Either way the previous figures go to tag_hour_history with the
 * upload that replaced them. Returns how many existing hours were touched.
 *
 * Where the writes go (docs/scale.md): the month partitions the batch needs are made first; new
 * hours go in by COPY sorted by their key; which upload brought which tag's hours is one row per
 * upload and tag (tag_hour_uploads), not an array in every tag hour.
 */
async function writeHours(
  client: pg.PoolClient,
  uploadId: string,
  rows: TagHour[],
  tagId: Map<string, string>,
  latestExistingMs: number | null,
): Promise<number> {
  let minMs = Infinity;
  let maxMs = -Infinity;
  for (const h of rows) {
    if (h.hourStartMs < minMs) minMs = h.hourStartMs;
    if (h.hourStartMs > maxMs) maxMs = h.hourStartMs;
  }
  await ensureMonthPartitions(client, 'tag_hours', minMs, maxMs);
  await noteUploadTags(client, uploadId, rows, tagId);
  // The usual case, new hours only, goes in by COPY. Hours after the site's latest stored hour (read
  // once, under the site's ingest lock) cannot clash; otherwise one query looks for clashes.
  if (latestExistingMs === null || minMs > latestExistingMs) {
    await copyNewHours(client, rows, tagId);
    return 0;
  }
  const ids = rows.map((h) => tagId.get(h.tag));
  const starts = rows.map((h) => isoOf(h.hourStartMs));
  const clash = await client.query(
    `select 1 from tag_hours where tag_id = any($1::int[]) and hour_start between $2 and $3
       and (tag_id, hour_start) in (select * from unnest($1::int[], $4::timestamptz[])) limit 1`,
    [ids, isoOf(minMs), isoOf(maxMs), starts],
  );
  const params = clash.rowCount === 0 ? null : hourParams(uploadId, rows, tagId);
  if (!params) {
    await copyNewHours(client, rows, tagId);
    return 0;
  }
  const res = await client.query(
    `with s as (
       select * from ${UNNEST_HOURS}
     ), hist as (
       insert into tag_hour_history (tag_id, hour_start, replaced_by_upload_id, previous)
       select th.tag_id, th.hour_start, $1, to_jsonb(th) from tag_hours th join s on s.tag_id = th.tag_id and s.hour_start = th.hour_start
       returning 1
     ), ins as (
       insert into tag_hours as o (hour_start, tag_id, samples, mean, min, max, std, first, last, span_start_ms, span_end_ms,
         covered_s, non_numeric, out_of_range, flags)
       select hour_start, tag_id, samples, mean, min, max, std, first, last, span_start_ms, span_end_ms,
         covered_s, non_numeric, out_of_range, flags
       from s
       on conflict (tag_id, hour_start) do update set
         mean = case when ${OVERLAP} then excluded.mean else ${POOLED_MEAN} end,
         std = case when ${OVERLAP} then excluded.std else ${POOLED_STD} end,
         min = case when ${OVERLAP} then excluded.min else least(o.min, excluded.min) end,
         max = case when ${OVERLAP} then excluded.max else greatest(o.max, excluded.max) end,
         first = case when ${OVERLAP} or excluded.span_start_ms < o.span_start_ms then excluded.first else o.first end,
         last = case when ${OVERLAP} or excluded.span_end_ms > o.span_end_ms then excluded.last else o.last end,
         samples = case when ${OVERLAP} then excluded.samples else o.samples + excluded.samples end,
         covered_s = case when ${OVERLAP} then excluded.covered_s else least(3600, o.covered_s + excluded.covered_s) end,
         non_numeric = case when ${OVERLAP} then excluded.non_numeric else least(32767, o.non_numeric + excluded.non_numeric) end,
         out_of_range = case when ${OVERLAP} then excluded.out_of_range else least(32767, o.out_of_range + excluded.out_of_range) end,
         span_start_ms = case when ${OVERLAP} then excluded.span_start_ms else least(o.span_start_ms, excluded.span_start_ms) end,
         span_end_ms = case when ${OVERLAP} then excluded.span_end_ms else greatest(o.span_end_ms, excluded.span_end_ms) end,
         flags = case when ${OVERLAP} then excluded.flags | ${TAG_HOUR_FLAGS['replaced-older-file']}
                 else excluded.flags | o.flags | ${TAG_HOUR_FLAGS['combined-files']} end
       returning 1
     )
     select (select count(*) from hist)::int as replaced, (select count(*) from ins)::int as written`,
    params,
  );
  return (res.rows[0] as { replaced: number }).replaced;
}

/** Which uploads brought which tag's hours: one row per upload and tag, widened batch by batch. */
async function noteUploadTags(client: pg.PoolClient, uploadId: string, rows: TagHour[], tagId: Map<string, string>) {
  const span = new Map<string, [number, number]>();
  for (const h of rows) {
    const id = tagId.get(h.tag)!;
    const s = span.get(id);
    if (!s) span.set(id, [h.hourStartMs, h.hourStartMs]);
    else {
      if (h.hourStartMs < s[0]) s[0] = h.hourStartMs;
      if (h.hourStartMs > s[1]) s[1] = h.hourStartMs;
    }
  }
  const ids = [...span.keys()];
  await client.query(
    `insert into tag_hour_uploads (upload_id, tag_id, first_hour, last_hour)
     select $1, * from unnest($2::int[], $3::timestamptz[], $4::timestamptz[])
     on conflict (upload_id, tag_id) do update set first_hour = least(tag_hour_uploads.first_hour, excluded.first_hour),
       last_hour = greatest(tag_hour_uploads.last_hour, excluded.last_hour)`,
    [uploadId, ids, ids.map((i) => isoOf(span.get(i)![0])), ids.map((i) => isoOf(span.get(i)![1]))],
  );
}

const copyNum = (v: number | null) => (v === null || !Number.isFinite(v) ? '\\N' : String(v));
const copyInt = (v: number | null) => (v === null ? '\\N' : String(v));
/** ISO text of an instant, cached: the tags of a wide file share their hour starts. */
const isoCache = new Map<number, string>();
function isoOf(ms: number): string {
  let s = isoCache.get(ms);
  if (s === undefined) {
    if (isoCache.size > 50_000) isoCache.clear();
    s = new Date(ms).toISOString();
    isoCache.set(ms, s);
  }
  return s;
}

/**
 * New hours go in by COPY (PostgreSQL's bulk path): several times faster than an INSERT. Sorted by
 * the primary key's order (tag, hour), so each tag's index entries go in as one run.
 */
async function copyNewHours(client: pg.PoolClient, rows: TagHour[], tagId: Map<string, string>) {
  const keyed = rows.map((h) => ({ h, id: Number(tagId.get(h.tag)) }));
  keyed.sort((a, b) => a.id - b.id || a.h.hourStartMs - b.h.hourStartMs);
  let text = '';
  for (const { h, id } of keyed) {
    text +=
      isoOf(h.hourStartMs) +
      '\t' +
      id +
      '\t' +
      h.sampleCount +
      '\t' +
      copyNum(h.mean) +
      '\t' +
      copyNum(h.min) +
      '\t' +
      copyNum(h.max) +
      '\t' +
      copyNum(h.stdDev) +
      '\t' +
      copyNum(h.first) +
      '\t' +
      copyNum(h.last) +
      '\t' +
      copyInt(spanOf(h.firstMs, h.hourStartMs)) +
      '\t' +
      copyInt(spanOf(h.lastMs, h.hourStartMs)) +
      '\t' +
      Math.round(h.coveredSeconds) +
      '\t' +
      count16(h.nonNumericCount + h.badQualityCount) +
      '\t' +
      count16(h.outOfRangeCount) +
      '\t' +
      flagsOf(h) +
      '\n';
  }
  const sink = client.query(
    copyFrom(
      `copy tag_hours (hour_start, tag_id, samples, mean, min, max, std, first, last, span_start_ms, span_end_ms,
         covered_s, non_numeric, out_of_range, flags) from stdin`,
    ),
  );
  await pipeline(Readable.from([text]), sink);
}

const UNNEST_HOURS = `unnest($2::int[], $3::timestamptz[], $4::float4[], $5::float4[], $6::float4[], $7::float4[], $8::float4[],
    $9::float4[], $10::int[], $11::smallint[], $12::smallint[], $13::smallint[], $14::int[], $15::int[], $16::smallint[])
    as x(tag_id, hour_start, mean, min, max, std, first, last, samples, covered_s, non_numeric, out_of_range, span_start_ms, span_end_ms, flags)`;

function hourParams(uploadId: string, rows: TagHour[], tagId: Map<string, string>) {
  return [
    uploadId,
    rows.map((h) => tagId.get(h.tag)),
    rows.map((h) => isoOf(h.hourStartMs)),
    rows.map((h) => h.mean),
    rows.map((h) => h.min),
    rows.map((h) => h.max),
    rows.map((h) => h.stdDev),
    rows.map((h) => h.first),
    rows.map((h) => h.last),
    rows.map((h) => h.sampleCount),
    rows.map((h) => Math.round(h.coveredSeconds)),
    rows.map((h) => count16(h.nonNumericCount + h.badQualityCount)),
    rows.map((h) => count16(h.outOfRangeCount)),
    rows.map((h) => spanOf(h.firstMs, h.hourStartMs)),
    rows.map((h) => spanOf(h.lastMs, h.hourStartMs)),
    rows.map(flagsOf),
  ] as [string, (string | undefined)[], string[], ...unknown[]];
}

async function insertRejects(client: pg.PoolClient, uploadId: string, startSeq: number, rows: RejectedCell[]) {
  await client.query(
    `insert into upload_rejects (upload_id, seq, line, tag, time, raw, reason)
     select $1, * from unnest($2::int[], $3::bigint[], $4::text[], $5::text[], $6::text[], $7::text[])`,
    [
      uploadId,
      rows.map((_, i) => startSeq + i),
      rows.map((r) => r.line),
      rows.map((r) => r.tag),
      rows.map((r) => (Number.isFinite(r.timeMs) ? new Date(r.timeMs).toISOString() : null)),
      rows.map((r) => r.text.slice(0, 500)),
      rows.map((r) => (r.reason === 'text' ? 'not a number' : 'bad quality')),
    ],
  );
}

/** The hours a file brought get their unit balances (re)computed by the engine's job. */
async function queueRecompute(siteId: string, firstMs: number | null, lastMs: number | null) {
  if (firstMs === null || lastMs === null) return;
  const HOUR = 3_600_000;
  const payload = { siteId, fromMs: Math.floor(firstMs / HOUR) * HOUR - HOUR, toMs: Math.ceil(lastMs / HOUR) * HOUR + HOUR };
  const boss = await queue();
  await boss.send(QUEUES.computeUnitHours, payload, { retryLimit: 2, retryDelay: 10 });
}

/** Closes the upload's transaction with its summary: the file's tag hours become visible at once. */
async function finish(up: typeof uploads.$inferSelect, profile: LayoutProfile, r: StreamResult, profileId: string | null, client: pg.PoolClient) {
  const warnings = r.report.warnings.map((w) => ({ code: w.code, message: w.message, count: w.count, lines: w.lines }));
  const summary = {
    rows: r.report.dataRowCount,
    tags: r.report.tags.length,
    newTags: r.newTags,
    hours: r.hours,
    values: r.report.valueCount,
    rejected: r.report.rejectedCount,
    rejectedStored: r.rejectsStored,
    blank: r.report.blankCount,
    replacedOrCombinedHours: r.replaced,
    firstTime: toIso(r.report.firstTimeMs),
    lastTime: toIso(r.report.lastTimeMs),
    encoding: r.encoding,
    layout: profile.layout,
    warnings,
    perTag: r.report.tags.map((t) => ({ tag: t.tag, values: t.valueCount, notNumbers: t.textCount, badQuality: t.badQualityCount, blank: t.blankCount, examples: t.rejectedTexts.slice(0, 3) })),
  };
  await client.query(
    `update uploads set status = 'done', finished_at = now(), summary = $2, profile_id = $3, bytes_read = $4, rows_read = $5, detection = null where id = $1`,
    [up.id, JSON.stringify(summary), profileId, r.bytes, r.report.dataRowCount],
  );
  await client.query('commit');
  return summary;
}

const OVERLAP = `(excluded.span_start_ms is not null and o.span_start_ms is not null and excluded.span_start_ms <= o.span_end_ms and o.span_start_ms <= excluded.span_end_ms)`;
// Weights: covered seconds, or sample counts for hours with no covered time (lone samples).
const W1 = `(case when o.covered_s + excluded.covered_s > 0 then o.covered_s::float8 else o.samples end)`;
const W2 = `(case when o.covered_s + excluded.covered_s > 0 then excluded.covered_s::float8 else excluded.samples end)`;
const POOLED_MEAN = `(case when o.mean is null then excluded.mean when excluded.mean is null then o.mean when ${W1} + ${W2} = 0 then excluded.mean
  else (${W1} * o.mean + ${W2} * excluded.mean) / (${W1} + ${W2}) end)`;
const POOLED_STD = `(case when o.mean is null or o.std is null then excluded.std when excluded.mean is null or excluded.std is null then o.std when ${W1} + ${W2} = 0 then excluded.std
  else sqrt(greatest(0, (${W1} * (o.std ^ 2 + (o.mean - ${POOLED_MEAN}) ^ 2) + ${W2} * (excluded.std ^ 2 + (excluded.mean - ${POOLED_MEAN}) ^ 2)) / (${W1} + ${W2}))) end)`;

/**
 * At worker start: an upload left 'processing' by a worker that died (its transaction rolled back,
 * its advisory lock released) is queued again, to be read from the start.
 */
export async function resumeInterruptedUploads(): Promise<number> {
  const stuck = await db().select({ id: uploads.id }).from(uploads).where(eq(uploads.status, 'processing'));
  let resumed = 0;
  for (const { id } of stuck) {
    const client = await pgPool().connect();
    try {
      const { rows } = await client.query('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', ['ingest:' + id]);
      if (!rows[0].ok) continue; // another worker is reading it right now
      await client.query('select pg_advisory_unlock(hashtextextended($1, 0))', ['ingest:' + id]);
    } finally {
      client.release();
    }
    await db().update(uploads).set({ status: 'queued' }).where(and(eq(uploads.id, id), eq(uploads.status, 'processing')));
    const boss = await queue();
    await boss.send(QUEUES.ingestFile, { uploadId: id }, { singletonKey: `${id}:resume:${Date.now()}`, retryLimit: 2, retryDelay: 5 });
    resumed++;
  }
  return resumed;
}
