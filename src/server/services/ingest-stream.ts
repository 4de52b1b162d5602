/**
 * The read of one upload: the raw object streams through the ingest core and its tag hours are
 * written inside ONE transaction on a dedicated connection, batch by batch while the file is still
 * being read (ingest-write.ts); the transaction commits only when the whole file is read
 * (ingest-finish.ts), so a failure or a killed worker leaves no tag hour of it behind. Progress goes
 * through another connection, so the uploads page sees it live.
 */
import { createHash } from 'node:crypto';
import PQueue from 'p-queue';
import { and, eq, isNull } from 'drizzle-orm';
import type pg from 'pg';
import { createFileIngest, qualityCodesOf, type LayoutProfile, type RejectedCell, type TagHour } from '~/lib/ingest';
import { createHourUnpacker } from '~/lib/ingest/hour-pack';
import { readOptionsOf, type SiteReadFacts } from './ingest-options';
import { startThreadRead } from './ingest-thread-pool';
import { db } from '../db/client';
import { siteQualityCodes, tagLinks, tags, uploads } from '../db/schema';
import { objectStream } from '../storage';
import { mergeOverlappedHours, type ClashKey, type RereadOptions } from './ingest-merge';
import { TagHourCopy, insertRejects, noteUploadTags, writeHours, type UploadTagSpans } from './ingest-write';
import { HOUR_MS } from '~/lib/time';

/** Tag hours written per statement. */
const STAGE_BATCH = 5000;
/** Rejected cells kept per upload for its report (the counts are always complete). */
export const MAX_STORED_REJECTS = 100_000;
/** How often progress is written while a file streams [ms]. */
const PROGRESS_EVERY_MS = 500;
/** Batches in flight on the connection while the parser reads on (bounded, so memory stays flat). */
const MAX_IN_FLIGHT = 3;

export interface StreamResult {
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
  /** SHA-256 of the bytes read, when the read was asked to hash them (an upload not hashed yet). */
  sha256: string | null;
}

type Upload = typeof uploads.$inferSelect;

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
  return { minMs: start.getTime(), maxMs: nowMs + (Number.isFinite(hours) && hours >= 0 ? hours : 24) * HOUR_MS };
}

/** The site's good quality codes (the defaults when it set none). */
export async function goodQualityCodes(siteId: string): Promise<string[]> {
  const [row] = await db().select().from(siteQualityCodes).where(eq(siteQualityCodes.siteId, siteId));
  return qualityCodesOf(row?.goodCodes);
}

/** What the site knows of its tags, and the reading options every read of this upload uses. */
async function siteContext(up: Upload, profile: LayoutProfile, timeZone: string, siteCreatedAt: Date) {
  const known = await db().select().from(tags).where(eq(tags.siteId, up.siteId));
  // The quantity and unit of each linked tag (the plant model knows them better than the file).
  const linked = await db()
    .select({ name: tags.name, quantity: tagLinks.quantity, engUnit: tagLinks.engUnit })
    .from(tagLinks)
    .innerJoin(tags, eq(tags.id, tagLinks.tagId))
    .where(and(eq(tags.siteId, up.siteId), isNull(tagLinks.validTo)));
  const goodCodes = await goodQualityCodes(up.siteId);
  // Plain data, so the reader's thread builds the same options (ingest-options.ts).
  const facts: SiteReadFacts = {
    timeZone,
    timeWindow: timeWindowFor(siteCreatedAt),
    goodQualityCodes: goodCodes,
    tags: known.map((t) => ({ name: t.name, kind: t.kind, flatlineLimitSeconds: t.flatlineLimitSeconds, validMin: t.validMin, validMax: t.validMax, unitHint: t.unitHint })),
    links: linked,
  };
  const rereadOptions: RereadOptions = readOptionsOf(facts);
  const tagId = new Map(known.map((t) => [t.name, String(t.seq)])); // tags.seq, the key of tag hours
  const unitOf = new Map<string, string | null>();
  const descOf = new Map<string, string | null>();
  for (const c of profile.wide?.columns ?? []) {
    unitOf.set(c.tag, c.unit);
    descOf.set(c.tag, c.description);
  }
  return { goodCodes, facts, rereadOptions, tagId, unitOf, descOf };
}

/**
 * Writes run one after another on the transaction's connection while the parser reads on (the
 * database works on the other core); the parser waits while MAX_IN_FLIGHT batches wait behind the
 * running one (p-queue's back-pressure), so memory stays bounded. The first failure stops the rest.
 */
function writeQueue() {
  const writes = new PQueue({ concurrency: 1 });
  const state = { failure: null as unknown, writeMs: 0 };
  const enqueue = (work: () => Promise<unknown>) => {
    void writes.add(async () => {
      if (state.failure) return;
      const t0 = performance.now();
      try {
        await work();
      } catch (err) {
        state.failure ??= err;
      } finally {
        state.writeMs += performance.now() - t0;
      }
    });
  };
  const check = () => {
    if (state.failure) throw state.failure;
  };
  const fail = (err: unknown) => {
    state.failure ??= err;
  };
  return { state, enqueue, check, fail, throttle: () => writes.onSizeLessThan(MAX_IN_FLIGHT), idle: () => writes.onIdle() };
}

type SiteContext = Awaited<ReturnType<typeof siteContext>>;

/** The hours and rejected cells of the file, gathered in batches and queued for writing. */
function batchWriter(client: pg.PoolClient, up: Upload, ctx: SiteContext, latestExistingMs: number | null, queue: ReturnType<typeof writeQueue>) {
  const counts = { hours: 0, newTags: 0, rejectsStored: 0 };
  const clashes: ClashKey[] = [];
  const spans: UploadTagSpans = new Map();
  // One COPY open across batches; every query on the connection ends it first (ingest-write.ts).
  const copy = new TagHourCopy(client);
  let batch: TagHour[] = [];
  let rejects: RejectedCell[] = [];
  let rejectSeq = 0;
  async function ensureTags(names: string[]) {
    const missing = [...new Set(names)].filter((n) => !ctx.tagId.has(n));
    if (!missing.length) return;
    await copy.end();
    for (const n of missing) ctx.tagId.set(n, ''); // claimed; filled below
    const res = await client.query(
      `insert into tags (site_id, name, unit_hint, description, last_upload_id)
       select $1, n, u, d, $5 from unnest($2::text[], $3::text[], $4::text[]) as x(n, u, d)
       on conflict (site_id, name) do update set last_upload_id = excluded.last_upload_id,
         unit_hint = coalesce(tags.unit_hint, excluded.unit_hint), description = coalesce(tags.description, excluded.description)
       returning seq::text as id, name, (xmax = 0) as inserted`,
      [up.siteId, missing, missing.map((n) => ctx.unitOf.get(n) ?? null), missing.map((n) => ctx.descOf.get(n) ?? null), up.id],
    );
    for (const r of res.rows as { id: string; name: string; inserted: boolean }[]) {
      ctx.tagId.set(r.name, r.id);
      if (r.inserted) counts.newTags++;
    }
  }
  const flushHours = () => {
    if (!batch.length) return;
    const rows = batch;
    batch = [];
    counts.hours += rows.length;
    queue.enqueue(async () => {
      await ensureTags(rows.map((h) => h.tag));
      clashes.push(...(await writeHours(client, rows, ctx.tagId, latestExistingMs, spans, copy)));
    });
  };
  const flushRejects = () => {
    if (!rejects.length) return;
    const rows = rejects;
    rejects = [];
    const start = rejectSeq;
    rejectSeq += rows.length;
    queue.enqueue(async () => {
      await copy.end();
      await insertRejects(client, up.id, start, rows);
    });
  };
  const onHour = (h: TagHour) => {
    batch.push(h);
    if (batch.length >= STAGE_BATCH) flushHours();
  };
  const onRejectedCell = (cell: RejectedCell) => {
    if (counts.rejectsStored >= MAX_STORED_REJECTS) return;
    counts.rejectsStored++;
    rejects.push(cell);
    if (rejects.length >= STAGE_BATCH) flushRejects();
  };
  const flush = () => {
    flushHours();
    flushRejects();
  };
  /** Ends the open COPY (after the last batch, before anything else runs on the connection). */
  const endCopy = () => copy.end();
  /** After a failure: the queued writes are skipped, the running one ends, and an open COPY is stopped. */
  const stop = async (err: unknown) => {
    queue.fail(err);
    await queue.idle();
    await copy.abort(err instanceof Error ? err : new Error(String(err)));
  };
  return { counts, clashes, spans, onHour, onRejectedCell, flush, endCopy, stop };
}

/** The site's ingest lock is held by another read, and the read was asked not to wait for it. */
export class SiteIngestBusy extends Error {
  constructor(siteId: string) {
    super(`Another file of site ${siteId} is being read.`);
    this.name = 'SiteIngestBusy';
  }
}

/** How a read takes the site's ingest lock: waiting for it (the default), or only tried (`waitForSite: false`). */
export interface SiteLockOptions {
  /** false: when another read holds the site's lock, throw SiteIngestBusy (the transaction is open; roll it back). */
  waitForSite?: boolean;
}

/**
 * Opens the upload's transaction under the site's ingest lock (one file of a site at a time writes
 * tag hours, so shared hours are combined in a defined order) and returns the site's latest stored
 * hour: hours after it cannot clash. With `waitForSite: false` the lock is only tried.
 */
async function beginSiteTransaction(client: pg.PoolClient, siteId: string, options: SiteLockOptions = {}): Promise<number | null> {
  await client.query('begin');
  if (options.waitForSite === false) {
    const { rows } = await client.query('select pg_try_advisory_xact_lock(hashtextextended($1, 0)) as ok', ['ingest-site:' + siteId]);
    if (!rows[0].ok) throw new SiteIngestBusy(siteId);
  } else {
    await client.query('select pg_advisory_xact_lock(hashtextextended($1, 0))', ['ingest-site:' + siteId]);
  }
  const latest = await client.query(
    `select max(l.hour_start) as last from tags t
       cross join lateral (select hour_start from tag_hours where tag_id = t.seq order by hour_start desc limit 1) l
     where t.site_id = $1`,
    [siteId],
  );
  return latest.rows[0]?.last ? (latest.rows[0].last as Date).getTime() : null;
}

/**
 * Streams the raw object through the ingest core and writes its tag hours in the open transaction.
 * With `hash`, the bytes are hashed on the way (SHA-256): an upload whose hash is not known yet (a
 * browser upload) is downloaded once, and the caller checks for a repeat before the commit.
 * `source` gives the bytes instead of the stored object (a read fed by the upload's own body,
 * ingest-early.ts); `options` how the site's ingest lock is taken (beginSiteTransaction).
 */
export async function readIntoTransaction(
  up: Upload,
  profile: LayoutProfile,
  timeZone: string,
  siteCreatedAt: Date,
  client: pg.PoolClient,
  hash = false,
  source?: AsyncIterable<Buffer>,
  options: SiteLockOptions = {},
): Promise<StreamResult> {
  const ctx = await siteContext(up, profile, timeZone, siteCreatedAt);
  const queue = writeQueue();
  const latestExistingMs = await beginSiteTransaction(client, up.siteId, options);
  const writer = batchWriter(client, up, ctx, latestExistingMs, queue);
  const parse = await parser(ctx, profile, writer);
  try {
    const stream = source ?? (await objectStream(up.objectKey));
    const hasher = hash ? createHash('sha256') : null;
    let bytes = 0;
    let lines = 0;
    let lastProgress = Date.now();
    for await (const chunk of stream) {
      const buf = chunk as Buffer;
      bytes += buf.length;
      hasher?.update(buf);
      for (let i = buf.indexOf(10); i !== -1; i = buf.indexOf(10, i + 1)) lines++;
      await parse.push(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
      await queue.throttle();
      queue.check();
      if (Date.now() - lastProgress > PROGRESS_EVERY_MS) {
        lastProgress = Date.now();
        void db().update(uploads).set({ bytesRead: bytes, rowsRead: lines }).where(eq(uploads.id, up.id)).catch(() => undefined);
      }
    }
    const { report, encoding } = await parse.end();
    writer.flush();
    await queue.idle();
    queue.check();
    await writer.endCopy();
    await noteUploadTags(client, up.id, writer.spans);
    let replaced = 0;
    let combined = 0;
    // Hours another file brought too: recomputed from the samples of both (ingest-merge.ts).
    if (writer.clashes.length > 0) ({ replaced, combined } = await mergeOverlappedHours(client, up.id, writer.clashes, { ...ctx.rereadOptions, profile }));
    const { hours, newTags, rejectsStored } = writer.counts;
    if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${up.id}: ${hours} tag hours, database writes ${(queue.state.writeMs / 1000).toFixed(2)} s`);
    return { report, encoding, hours, replaced, combined, newTags, rejectsStored, bytes, goodCodes: ctx.goodCodes, sha256: hasher ? hasher.digest('hex') : null };
  } catch (err) {
    await writer.stop(err);
    throw err;
  } finally {
    parse.drop();
  }
}

/**
 * The parse of the file: on a reader thread when one can be had (ingest-thread-pool.ts), so that
 * it runs beside this thread's download, hash and database writes; else here, as one step of the
 * loop. Either way the writer gets the same hours and rejected cells in the same order.
 */
async function parser(ctx: SiteContext, profile: LayoutProfile, writer: ReturnType<typeof batchWriter>) {
  const unpack = createHourUnpacker();
  const thread = await startThreadRead(ctx.facts, profile, {
    onHours: (batch) => unpack(batch, writer.onHour),
    onRejects: (cells) => cells.forEach(writer.onRejectedCell),
  });
  if (thread) return { push: (bytes: Uint8Array) => thread.push(bytes), end: () => thread.end(), drop: () => thread.drop() };
  const ingest = createFileIngest({ ...ctx.rereadOptions, profile, onHour: writer.onHour, onRejectedCell: writer.onRejectedCell });
  return {
    push: async (bytes: Uint8Array) => ingest.push(bytes),
    end: async () => {
      const { report, encoding } = ingest.end();
      return { report, encoding: encoding.encoding };
    },
    drop: () => undefined,
  };
}
