import { GetObjectCommand } from '@aws-sdk/client-s3';
import PQueue from 'p-queue';
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { from as copyFrom } from 'pg-copy-streams';
import { and, eq, isNull, sql } from 'drizzle-orm';
import type pg from 'pg';
import {
  IngestError,
  checkLayoutAgainstSample,
  createDecoder,
  valueLimitsFor,
  createFileIngest,
  fileVerdict,
  previewRows,
  qualityCodesOf,
  tagReadCounts,
  sniffLayout,
  type LayoutProfile,
  type RejectedCell,
  type TagHour,
} from '~/lib/ingest';
import { isLinkQuantity, unitsQuantityOf } from '~/lib/plant/kinds';
import { db, pgPool } from '../db/client';
import { TAG_HOUR_FLAGS, layoutProfiles, siteQualityCodes, sites, tagLinks, tags, uploads } from '../db/schema';
import { ensureMonthPartitions } from '../db/partitions';
import { QUEUES, sendJob } from '~/jobs';
import { queue } from '../queue';
import { bucket, objectStream, s3 } from '../storage';
import { findDuplicate, storedObjectMismatch } from './uploads';
import { mergeOverlappedHours, readerFlags, type ClashKey, type RereadOptions } from './ingest-merge';

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

/**
 * The accepted times of a site's files: from its first day minus INGEST_YEARS_BEFORE_SITE years
 * (default 30: historians keep decades and a new site may load its history) to now plus
 * INGEST_FUTURE_HOURS hours (default 24: clocks a little ahead, export time zones). A time outside
 * is no reading of this plant (a year 9999 or 1970 from a broken clock or a mangled cell): its row's
 * cells are rejected with the reason.
 */
export function timeWindowFor(siteCreatedAt: Date, nowMs = Date.now()): { minMs: number; maxMs: number } {
  const years = Number(process.env.INGEST_YEARS_BEFORE_SITE ?? 30);
  const hours = Number(process.env.INGEST_FUTURE_HOURS ?? 24);
  const start = new Date(siteCreatedAt.getTime());
  start.setUTCFullYear(start.getUTCFullYear() - (Number.isFinite(years) && years >= 0 ? years : 30));
  start.setUTCHours(0, 0, 0, 0);
  return { minMs: start.getTime(), maxMs: nowMs + (Number.isFinite(hours) && hours >= 0 ? hours : 24) * 3_600_000 };
}

/** SHA-256 of a stored object, streamed (nothing held in memory). */
async function hashObject(key: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of await objectStream(key)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** Text the database can store: no NUL (PostgreSQL text and jsonb refuse it). */
const storable = (text: string) => text.replace(/\u0000/g, '');
const storableJson = (value: unknown) => JSON.stringify(value).replace(/\\u0000/g, '');

export type IngestOutcome =
  | { kind: 'done'; summary: Record<string, unknown> }
  | { kind: 'read-with-problems'; summary: Record<string, unknown> }
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
    // A person confirmed this layout for this very upload: no second guessing.
    const [p] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.id, up.profileId));
    if (p) return { profile: p.profile, saved: true as const, confirmed: true as const };
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
  let preview: unknown[] = [];
  try {
    preview = previewRows(text, sniffed, 8, { timeZone });
  } catch {
    preview = [];
  }
  const sample = { text, complete };
  if (known) return { profile: known.profile, saved: true as const, profileId: known.id, sniffed, preview, sample, encoding: decoder.decision };
  return { profile: sniffed, saved: false as const, preview, encoding: decoder.decision, sample };
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
    // The stored object: its size and type as declared (browser), and its hash computed here. The
    // hash the browser declared is a claim; only the stored bytes decide what is a repeat.
    if (up.source === 'browser') {
      const mismatch = await storedObjectMismatch(up);
      if (mismatch) throw new IngestError('SIZE_MISMATCH', mismatch, { declaredBytes: up.sizeBytes });
    }
    if (!up.sha256) {
      const sha256 = await hashObject(up.objectKey);
      if (up.declaredSha256 && up.declaredSha256 !== sha256) {
        throw new IngestError(
          'HASH_MISMATCH',
          `The stored file's SHA-256 is ${sha256}, not the ${up.declaredSha256} declared for it, so it was not read. Upload the file again.`,
          { declared: up.declaredSha256, stored: sha256 },
        );
      }
      await db().update(uploads).set({ sha256 }).where(eq(uploads.id, uploadId));
      up.sha256 = sha256;
      const duplicate = await findDuplicate(up.siteId, sha256, up.id, { id: up.id, createdAt: up.createdAt });
      if (duplicate) {
        const summary = { duplicateOf: duplicate.id, note: 'Same bytes as an earlier upload: not read again.' };
        await db()
          .update(uploads)
          .set({ status: 'done', duplicateOf: duplicate.id, finishedAt: sql`clock_timestamp()`, summary })
          .where(eq(uploads.id, uploadId));
        return { kind: 'done', summary };
      }
    }

    const layout = await decideLayout(up, timeZone);
    let profile = layout.profile;
    let profileId = 'profileId' in layout ? layout.profileId : up.profileId;
    // The layout against the file's own values (decimal mark, date order): never guess.
    const disagreement = 'sample' in layout && layout.sample ? checkLayoutAgainstSample(layout.sample.text, profile, { timeZone, complete: layout.sample.complete }) : null;
    const machineQuestions = !layout.saved && up.source !== 'browser' ? profile.questions : [];
    if (disagreement || (!layout.saved && up.source === 'browser') || machineQuestions.length > 0 || (!layout.saved && profile.questions.some((q) => q.blocking))) {
      const questions = [...(disagreement ? [disagreement.question] : []), ...profile.questions];
      const asked = { ...profile, questions } as LayoutProfile;
      const detection = {
        profile: asked,
        preview: 'preview' in layout ? layout.preview : [],
        encoding: 'encoding' in layout ? (layout.encoding ?? null) : null,
        disagreement: disagreement ?? null,
      } as Record<string, unknown>;
      if (up.source === 'browser' || questions.length === 0) {
        await db().update(uploads).set({ status: 'needs-review', detection: JSON.parse(storableJson(detection)) }).where(eq(uploads.id, uploadId));
        return { kind: 'needs-review' };
      }
      // A machine upload never guesses: it stops with the question; a person answers it on the
      // uploads page (the confirmed layout reads the file) or the export is fixed.
      const reason = `Not read: the layout is not certain for this file. ${questions.map((q) => q.message).join(' ')}`;
      await db()
        .update(uploads)
        .set({
          status: 'failed',
          failureReason: storable(reason),
          finishedAt: sql`clock_timestamp()`,
          detection: JSON.parse(storableJson(detection)),
          summary: JSON.parse(storableJson({ code: 'LAYOUT_QUESTION', questions, details: disagreement ?? {} })),
        })
        .where(eq(uploads.id, uploadId));
      return { kind: 'failed', reason };
    }
    if (!layout.saved) {
      // A machine upload of a shape the file itself decides: keep the decision as the site's profile.
      // jsonb holds no NUL character: the stored copy goes without them (a header cell may carry one).
      const storable = JSON.parse(storableJson(profile)) as typeof profile;
      const [saved] = await db()
        .insert(layoutProfiles)
        .values({ siteId: up.siteId, fingerprint: profile.fingerprint, name: `detected from ${up.fileName}`, profile: storable })
        .onConflictDoUpdate({ target: [layoutProfiles.siteId, layoutProfiles.fingerprint], set: { fingerprint: profile.fingerprint } })
        .returning();
      // Another file of this shape may have saved its profile first: read with that one; else with this file's own.
      if (JSON.stringify(saved!.profile) !== JSON.stringify(storable)) profile = saved!.profile;
      profileId = saved!.id;
    }
    const result = await readIntoTransaction(up, profile, timeZone, site?.createdAt ?? new Date(), client);
    const { summary, state } = await finish(up, profile, result, profileId ?? null, client);
    if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${uploadId}: read and committed in ${((performance.now() - startedMs) / 1000).toFixed(2)} s`);
    return { kind: state === 'done' ? 'done' : 'read-with-problems', summary };
  } catch (err) {
    await client.query('rollback').catch(() => undefined);
    const fileError = asFileError(err);
    if (fileError) {
      const where = fileError.line ? ` (line ${fileError.line})` : '';
      const reason = storable(`${fileError.message}${where}`);
      await db()
        .update(uploads)
        .set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()`, summary: JSON.parse(storableJson({ code: fileError.code, details: fileError.details })) })
        .where(eq(uploads.id, uploadId));
      return { kind: 'failed', reason };
    }
    const [now] = await db().select({ attempts: uploads.attempts }).from(uploads).where(eq(uploads.id, uploadId));
    if ((now?.attempts ?? MAX_ATTEMPTS) >= MAX_ATTEMPTS) {
      const reason = `Reading stopped ${now?.attempts} times for a reason outside the file (${(err as Error).message}). The raw file is kept; retry when the service is back.`;
      await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()` }).where(eq(uploads.id, uploadId));
      return { kind: 'failed', reason };
    }
    await db().update(uploads).set({ status: 'queued' }).where(eq(uploads.id, uploadId));
    throw err;
  }
}

/**
 * The file's own problems, as catalogued errors: an IngestError; PostgreSQL refusing a value of the
 * file (data exceptions, class 22, and size limits, class 54: text it cannot store); a fault of the
 * reader itself on this file (a TypeError or RangeError from the reading code: retrying cannot
 * help). Anything else (the database or the store unreachable) is outside the file: null.
 */
function asFileError(err: unknown): IngestError | null {
  if (err instanceof IngestError) return err;
  const e = err as { code?: unknown; message?: string; $metadata?: unknown };
  if (typeof e?.code === 'string' && /^(22|54)[0-9A-Z]{3}$/.test(e.code)) {
    return new IngestError(
      'UNSTORABLE_TEXT',
      `The file holds a value the database cannot store (${e.message ?? e.code}). Nothing of it was stored; check the export for unusual characters or enormous cells.`,
      { sqlState: e.code },
    );
  }
  if ((err instanceof TypeError || err instanceof RangeError) && e.$metadata === undefined && typeof e.code !== 'string') {
    return new IngestError(
      'READER_FAULT',
      `Lossline's reader failed on this file (${err.message}): a fault in Lossline, not in the file. The raw file is kept; report the upload so it can be fixed and read again.`,
    );
  }
  return null;
}

interface StreamResult {
  report: ReturnType<ReturnType<typeof createFileIngest>['end']>['report'];
  encoding: string;
  hours: number;
  /** Stored tag hours whose figures this file replaced (the same times arrived again). */
  replaced: number;
  /** Stored tag hours this file's figures were pooled with (other times of the same hour). */
  combined: number;
  newTags: number;
  rejectsStored: number;
  bytes: number;
  /** The site's good quality codes the file was read with. */
  goodCodes: string[];
}

/** Batches in flight on the connection while the parser reads on (bounded, so memory stays flat). */
const MAX_IN_FLIGHT = 3;

/**
 * Streams the raw object through the ingest core and writes its tag hours inside ONE transaction
 * on a dedicated connection, batch by batch while the file is still being read; the transaction
 * commits only when the whole file is read, so a failure or a killed worker leaves no tag hour of
 * it behind. Progress goes through another connection, so the uploads page sees it live.
 */
async function readIntoTransaction(
  up: typeof uploads.$inferSelect,
  profile: LayoutProfile,
  timeZone: string,
  siteCreatedAt: Date,
  client: pg.PoolClient,
): Promise<StreamResult> {
  const known = await db().select().from(tags).where(eq(tags.siteId, up.siteId));
  // The quantity and unit of each linked tag (the plant model knows them better than the file).
  const linked = await db()
    .select({ name: tags.name, quantity: tagLinks.quantity, engUnit: tagLinks.engUnit })
    .from(tagLinks)
    .innerJoin(tags, eq(tags.id, tagLinks.tagId))
    .where(and(eq(tags.siteId, up.siteId), isNull(tagLinks.validTo)));
  const linkOf = new Map(linked.map((l) => [l.name, l]));
  const goodCodes = await goodQualityCodes(up.siteId);
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
  let combined = 0;
  let newTags = 0;
  let latestExistingMs: number | null = null;
  const clashes: ClashKey[] = [];
  // Writes run one after another on the transaction's connection while the parser reads on (the
  // database works on the other core); the parser waits while MAX_IN_FLIGHT batches wait behind the
  // running one (p-queue's back-pressure), so memory stays bounded.
  const writes = new PQueue({ concurrency: 1 });
  let failure: unknown = null;
  let writeMs = 0;
  const enqueue = (work: () => Promise<unknown>) => {
    void writes.add(async () => {
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
  };
  /** Lets the parser run ahead of the database by at most MAX_IN_FLIGHT batches. */
  const throttle = () => writes.onSizeLessThan(MAX_IN_FLIGHT);

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
      clashes.push(...(await writeHours(client, up.id, rows, tagId, latestExistingMs)));
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

  const rereadOptions: RereadOptions = {
    timeZone,
    timeWindow: timeWindowFor(siteCreatedAt),
    goodQualityCodes: goodCodes,
    valueLimits: (tag, unit) => {
      const link = linkOf.get(tag);
      if (link && isLinkQuantity(link.quantity)) return valueLimitsFor(link.engUnit, unitsQuantityOf(link.quantity));
      return valueLimitsFor(unit ?? byName.get(tag)?.unitHint ?? null);
    },
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
  };
  const ingest = createFileIngest({
    ...rereadOptions,
    profile,
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
  await writes.onIdle();
  if (failure) throw failure;
  // Hours another file brought too: recomputed from the samples of both (ingest-merge.ts).
  if (clashes.length > 0) ({ replaced, combined } = await mergeOverlappedHours(client, up.id, clashes, { ...rereadOptions, profile }));
  if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${up.id}: ${hours} tag hours, database writes ${(writeMs / 1000).toFixed(2)} s`);
  return { report, encoding: encoding.encoding, hours, replaced, combined, newTags, rejectsStored, bytes, goodCodes };
}

const toIso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/** Counts are smallint in tag hours (32767 and more is "very many"). */
const count16 = (n: number) => Math.min(32767, n);
const spanOf = (ms: number | null, hourStartMs: number) => (ms === null ? null : ms - hourStartMs);

/**
 * Writes a batch of an upload's tag hours. Hours not stored yet go in by COPY; a tag hour already
 * holding another file's figures (two shift exports sharing an hour, or the same readings again) is
 * left for ingest-merge.ts, which recomputes it from the samples of both files after the stream:
 * returned as a clash.
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
): Promise<ClashKey[]> {
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
    return [];
  }
  const ids = rows.map((h) => tagId.get(h.tag));
  const starts = rows.map((h) => isoOf(h.hourStartMs));
  const clash = await client.query(
    `select tag_id::text as tag_id, hour_start from tag_hours where tag_id = any($1::int[]) and hour_start between $2 and $3
       and (tag_id, hour_start) in (select * from unnest($1::int[], $4::timestamptz[]))`,
    [ids, isoOf(minMs), isoOf(maxMs), starts],
  );
  const taken = new Set((clash.rows as { tag_id: string; hour_start: Date }[]).map((r) => `${r.tag_id}@${r.hour_start.getTime()}`));
  const fresh = taken.size === 0 ? rows : rows.filter((h) => !taken.has(`${tagId.get(h.tag)}@${h.hourStartMs}`));
  if (fresh.length > 0) await copyNewHours(client, fresh, tagId);
  return rows.filter((h) => taken.has(`${tagId.get(h.tag)}@${h.hourStartMs}`)).map((h) => ({ tag: h.tag, tagId: tagId.get(h.tag)!, hourStartMs: h.hourStartMs }));
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
      readerFlags(h) +
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
      rows.map((r) => storable(r.text.slice(0, 500))),
      rows.map((r) => (r.reason === 'bad-quality' && r.code !== undefined ? `${REJECT_REASON_TEXT[r.reason]} ${storable(r.code.slice(0, 100))}` : REJECT_REASON_TEXT[r.reason])),
    ],
  );
}

/** The site's good quality codes (the defaults when it set none). */
export async function goodQualityCodes(siteId: string): Promise<string[]> {
  const [row] = await db().select().from(siteQualityCodes).where(eq(siteQualityCodes.siteId, siteId));
  return qualityCodesOf(row?.goodCodes);
}

/** The reason of a rejected cell as stored and shown in the rejected-cells report. */
const REJECT_REASON_TEXT: Record<RejectedCell['reason'], string> = {
  text: 'not a number',
  'bad-quality': 'bad quality',
  impossible: 'physically impossible value',
  'outside-window': 'time outside the accepted window',
};

/**
 * The hours a file brought get their unit balances (re)computed by the engine's job, queued on the
 * file's own transaction: the job commits with the tag hours or not at all, so a worker killed
 * between the two can never leave hours that are never computed.
 */
async function queueRecompute(siteId: string, firstMs: number | null, lastMs: number | null, client: pg.PoolClient) {
  if (firstMs === null || lastMs === null) return;
  const HOUR = 3_600_000;
  const payload = { siteId, fromMs: Math.floor(firstMs / HOUR) * HOUR - HOUR, toMs: Math.ceil(lastMs / HOUR) * HOUR + HOUR };
  const boss = await queue();
  await sendJob(boss, QUEUES.computeUnitHours, payload, {
    retryLimit: 2,
    retryDelay: 10,
    db: { executeSql: (text: string, values: unknown[]) => client.query(text, values as unknown[]) },
  });
}

/** Closes the upload's transaction with its summary: the file's tag hours become visible at once. */
async function finish(up: typeof uploads.$inferSelect, profile: LayoutProfile, r: StreamResult, profileId: string | null, client: pg.PoolClient) {
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
    perTag: r.report.tags.map((t) => {
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
    }),
    problemTags: verdict.problemTags,
    problems: verdict.message,
    goodQualityCodes: profile.quality ? qualityCodesOf(r.goodCodes) : undefined,
  };
  // clock_timestamp(): the moment the upload finished (now() would be when its transaction began).
  await client.query(
    `update uploads set status = $6, finished_at = clock_timestamp(), summary = $2, profile_id = $3, bytes_read = $4, rows_read = $5, detection = null where id = $1`,
    [up.id, storableJson(summary), profileId, r.bytes, r.report.dataRowCount, verdict.state],
  );
  await queueRecompute(up.siteId, r.report.firstTimeMs, r.report.lastTimeMs, client);
  await client.query('commit');
  return { summary, state: verdict.state };
}

/**
 * An upload left 'processing' by a worker that died is queued again, to be read from the start (its
 * transaction rolled back). The test of life is the per-upload advisory lock: the reading worker
 * holds it on its own database session for as long as it lives, and PostgreSQL releases it the
 * moment that session ends (a killed process closes its connection). Run at worker start and every
 * INGEST_SWEEP_SECONDS (default 20) by every live worker, so a live worker takes over within a
 * minute rather than after the job's two-hour expiry.
 */
export async function resumeInterruptedUploads(): Promise<number> {
  // 'processing' with the lock free: its reader is gone. 'queued' with no job waiting for it and no
  // job that began in the last 30 s: a worker took its job and died before it began reading.
  const stuck = (
    await db().execute<{ id: string }>(sql`
      select u.id from uploads u
      where u.status = 'processing'
         or (u.status = 'queued' and not exists (
               select 1 from pgboss.job j
               where j.name = ${QUEUES.ingestFile} and j.data->>'uploadId' = u.id::text
                 and (j.state in ('created', 'retry') or (j.state = 'active' and j.started_on > now() - interval '30 seconds'))))`)
  ).rows;
  let resumed = 0;
  for (const { id } of stuck) {
    const client = await pgPool().connect();
    try {
      const { rows } = await client.query('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', ['ingest:' + id]);
      if (!rows[0].ok) continue; // a live worker is reading it right now
      try {
        // Under the lock, so no worker can start on it between the check and the change.
        const moved = await client.query(`update uploads set status = 'queued' where id = $1 and status in ('processing', 'queued')`, [id]);
        if (moved.rowCount !== 1) continue; // it finished in between
        const boss = await queue();
        await sendJob(boss, QUEUES.ingestFile, { uploadId: id }, { singletonKey: `${id}:resume:${Date.now()}`, retryLimit: 2, retryDelay: 5, expireInSeconds: 60 * 60 * 2 });
        resumed++;
      } finally {
        await client.query('select pg_advisory_unlock(hashtextextended($1, 0))', ['ingest:' + id]);
      }
    } finally {
      client.release();
    }
  }
  return resumed;
}

/** Seconds between two looks for uploads a dead worker left 'processing'. */
export function sweepSeconds(): number {
  const s = Number(process.env.INGEST_SWEEP_SECONDS ?? 20);
  return Number.isFinite(s) && s > 0 ? s : 20;
}
