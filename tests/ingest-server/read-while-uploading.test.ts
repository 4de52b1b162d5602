/**
 * Reading a machine upload while it is uploading (src/server/services/ingest-early.ts), on
 * PostgreSQL and the object store: a file of a layout the site reads is done when receiveApiUpload
 * returns, with the same tag hours and summary as the worker's read of the same file; a file the
 * reader gives up on (a layout question, a bad file) goes to the worker, whose verdict is as with the
 * feature off; a repeat stands aside; a body that breaks leaves the upload failed and nothing read;
 * another read holding the site's lock sends the upload to the worker without stalling its PUT.
 * The worker's read is called directly (ingestUpload), so what the endpoint left is seen as it is.
 */
import { Readable } from 'node:stream';
import { and, asc, eq, sql } from 'drizzle-orm';
import { afterEach, expect, it } from 'vitest';
import { sniffLayout } from '~/lib/ingest';
import { db, pgPool } from '~/server/db/client';
import { layoutProfiles, sites, tagHours, tagHourUploads, tags, uploads } from '~/server/db/schema';
import { ingestUpload } from '~/server/services/ingest';
import { receiveApiUpload } from '~/server/services/uploads';
import { objectSize } from '~/server/storage';
import { describeIntegration } from '../support/integration';

const TAG_NAMES = ['RW.PT-1', 'RW.TT-1', 'RW.FT-1', 'RW.LT-1'];

/** A one-minute wide export of four tags (one decimal: no layout question), `rows` minutes from `startIso`. */
function wideFile(startIso: string, rows: number, opts: { decimals?: number; tail?: string } = {}) {
  const t0 = Date.parse(startIso);
  const lines = [['Time', ...TAG_NAMES].join(',')];
  for (let i = 0; i < rows; i++) {
    const values = TAG_NAMES.map((_, j) => (40 + j * 10 + ((i * (j + 3)) % 17) / 7).toFixed(opts.decimals ?? 1));
    lines.push(`${new Date(t0 + i * 60_000).toISOString().slice(0, 19).replace('T', ' ')},${values.join(',')}`);
  }
  return Buffer.from(lines.join('\n') + '\n' + (opts.tail ?? ''));
}

/** The body as a network stream gives it: 16 KiB chunks. */
function chunked(body: Buffer): Readable {
  const parts: Buffer[] = [];
  for (let i = 0; i < body.length; i += 16 * 1024) parts.push(body.subarray(i, i + 16 * 1024));
  return Readable.from(parts);
}

async function newSite(label: string, savedLayoutOf?: Buffer) {
  const [s] = await db().insert(sites).values({ name: `Read while uploading ${label} ${Date.now()}`, timeZone: 'UTC' }).returning();
  if (savedLayoutOf) {
    // The site's saved layout of this shape, as a person confirmed it on the uploads page.
    const sniffed = sniffLayout(savedLayoutOf.subarray(0, 96 * 1024).toString('utf8'), { complete: savedLayoutOf.length < 96 * 1024 });
    await db()
      .insert(layoutProfiles)
      .values({ siteId: s!.id, fingerprint: sniffed.fingerprint, name: 'confirmed layout', profile: { ...sniffed, questions: [] } });
  }
  return s!.id;
}

const row = async (id: string) => (await db().select().from(uploads).where(eq(uploads.id, id)))[0]!;

/** Jobs queued for the worker's read of the upload. */
async function workerJobs(uploadId: string): Promise<number> {
  const r = await db().execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where name = 'ingest-file' and data->>'uploadId' = ${uploadId}`);
  return r.rows[0]!.n;
}

/** The site's tag hours by tag name and hour (the tags' keys differ between sites). */
async function siteHours(siteId: string) {
  const rows = await db()
    .select({ tag: tags.name, h: tagHours })
    .from(tagHours)
    .innerJoin(tags, eq(tags.seq, tagHours.tagId))
    .where(eq(tags.siteId, siteId))
    .orderBy(asc(tags.name), asc(tagHours.hourStart));
  return rows.map(({ tag, h }) => ({ ...h, tagId: undefined, tag }));
}

async function hoursOfUpload(uploadId: string): Promise<number> {
  return (await db().select().from(tagHourUploads).where(eq(tagHourUploads.uploadId, uploadId))).length;
}

/** Runs fn with reading while uploading off (INGEST_WHILE_UPLOADING_MAX_MB=0). */
async function featureOff<T>(fn: () => Promise<T>): Promise<T> {
  process.env.INGEST_WHILE_UPLOADING_MAX_MB = '0';
  try {
    return await fn();
  } finally {
    delete process.env.INGEST_WHILE_UPLOADING_MAX_MB;
  }
}

/** The upload ends within `ms` or the test fails with the reason (a stalled PUT never ends). */
function within<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`${what} did not end within ${ms} ms`)), ms))]);
}

describeIntegration('reading a machine upload while it is uploading', () => {
  afterEach(() => {
    delete process.env.INGEST_WHILE_UPLOADING_MAX_MB;
  });

  it("(a) a file of the site's saved layout is done when the endpoint answers, with the worker's tag hours and summary", async () => {
    const body = wideFile('2026-06-01T00:00:00Z', 6000); // about 220 KB: read well past the layout's head
    const early = await newSite('early', body);
    const worker = await newSite('worker', body);

    const out = await receiveApiUpload(early, 'shift.csv', chunked(body), {}, body.length);
    expect(out.readWhileUploading).toBe(true);
    expect(out.duplicateOf).toBeNull();
    const read = await row(out.uploadId);
    expect(read.status).toBe('done');
    expect(read.startedAt).not.toBeNull();
    expect(read.sizeBytes).toBe(body.length);
    expect(read.bytesRead).toBe(body.length);
    expect(await workerJobs(out.uploadId)).toBe(0);

    const other = await featureOff(() => receiveApiUpload(worker, 'shift.csv', chunked(body), {}, body.length));
    expect(other.readWhileUploading).toBe(false);
    expect((await row(other.uploadId)).status).toBe('queued');
    expect((await ingestUpload(other.uploadId)).kind).toBe('done');
    const byWorker = await row(other.uploadId);

    expect(read.summary).toEqual(byWorker.summary);
    expect(read.sha256).toBe(byWorker.sha256);
    expect(read.rowsRead).toBe(byWorker.rowsRead);
    const hours = await siteHours(early);
    expect(hours.length).toBe(100 * TAG_NAMES.length);
    expect(hours).toEqual(await siteHours(worker));
    expect(await hoursOfUpload(out.uploadId)).toBe(TAG_NAMES.length);
  });

  it('(a) a first file whose own layout is certain is read while uploading and its layout kept for the site, as the worker keeps it', async () => {
    const body = wideFile('2026-06-06T00:00:00Z', 3000);
    const siteId = await newSite('detected');
    const out = await receiveApiUpload(siteId, 'first.csv', chunked(body), {}, body.length);
    expect(out.readWhileUploading).toBe(true);
    const read = await row(out.uploadId);
    expect(read.status).toBe('done');
    const [profile] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.siteId, siteId));
    expect(read.profileId).toBe(profile!.id);
    expect(profile!.name).toBe('detected from first.csv');
  });

  const givenUp: [string, () => Buffer, boolean][] = [
    // Three decimals everywhere: a decimal mark or a thousands separator? A machine upload never guesses.
    ['a layout question', () => wideFile('2026-06-02T00:00:00Z', 3000, { decimals: 3 }), false],
    ['two columns of one name', () => Buffer.from('Time,RW.PT-1,RW.PT-1\n2026-06-02 00:00:00,1.5,2.5\n2026-06-02 00:01:00,1.6,2.6\n'), false],
    ['a file that is not text', () => Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(4000, 0)]), false],
    // Good rows well past the head, then a quote never closed: the read stops near the end.
    ['a quote never closed at the end', () => wideFile('2026-06-02T00:00:00Z', 6000, { tail: '2026-06-06 04:00:00,"41.5,42.5,43.5,44.5\n' }), true],
  ];
  for (const [label, make, saved] of givenUp) {
    it(`(b) ${label}: the reader gives up, the upload is queued for the worker, whose verdict is as with the feature off`, async () => {
      const body = make();
      const siteId = await newSite(`gives up ${label}`, saved ? body : undefined);

      const before = await featureOff(() => receiveApiUpload(siteId, 'export.csv', chunked(body), {}, body.length));
      expect((await row(before.uploadId)).startedAt).toBeNull();
      await ingestUpload(before.uploadId);
      const today = await row(before.uploadId);

      const out = await receiveApiUpload(siteId, 'export.csv', chunked(body), {}, body.length);
      expect(out.readWhileUploading).toBe(false);
      const left = await row(out.uploadId);
      // The reader began (it set startedAt) and gave up: queued for the worker, nothing read.
      expect(left.startedAt).not.toBeNull();
      expect(left.status).toBe('queued');
      expect(left.failureReason).toBeNull();
      expect(await workerJobs(out.uploadId)).toBe(1);
      expect(await objectSize(left.objectKey)).toBe(body.length);
      expect(await hoursOfUpload(out.uploadId)).toBe(0);

      await ingestUpload(out.uploadId);
      const verdict = await row(out.uploadId);
      expect(today.status).toBe('failed');
      expect(verdict.status).toBe(today.status);
      expect(verdict.failureReason).toBe(today.failureReason);
      expect((verdict.summary as { code?: string }).code).toBe((today.summary as { code?: string }).code);
      expect(verdict.attempts).toBe(1);
      expect((await siteHours(siteId)).length).toBe(0);
    });
  }

  it('(c) a repeat of an earlier upload stands aside and writes no tag hour', async () => {
    const body = wideFile('2026-06-03T00:00:00Z', 3000);
    const siteId = await newSite('repeat', body);
    const first = await featureOff(() => receiveApiUpload(siteId, 'once.csv', chunked(body), {}, body.length));
    expect((await ingestUpload(first.uploadId)).kind).toBe('done');
    const hoursBefore = await siteHours(siteId);
    expect(hoursBefore.length).toBeGreaterThan(0);

    const again = await receiveApiUpload(siteId, 'once (again).csv', chunked(body), {}, body.length);
    expect(again.duplicateOf).toBe(first.uploadId);
    const u = await row(again.uploadId);
    // Read while uploading (startedAt) and rolled back at the repeat check before its commit.
    expect(u.startedAt).not.toBeNull();
    expect(u.status).toBe('done');
    expect(u.duplicateOf).toBe(first.uploadId);
    expect(u.sha256).toBe((await row(first.uploadId)).sha256);
    expect(await hoursOfUpload(again.uploadId)).toBe(0);
    expect(await workerJobs(again.uploadId)).toBe(0);
    expect(await siteHours(siteId)).toEqual(hoursBefore);
    const tagRows = await db().select().from(tags).where(eq(tags.siteId, siteId));
    expect(tagRows.every((t) => t.lastUploadId === first.uploadId)).toBe(true);
  });

  it('(d) a body that breaks mid-way leaves the upload failed, no tag hour, no object and the site free', async () => {
    const body = wideFile('2026-06-04T00:00:00Z', 6000);
    const siteId = await newSite('broken', body);
    const part = body.subarray(0, 160 * 1024);
    async function* breaks() {
      for (let i = 0; i < part.length; i += 16 * 1024) yield part.subarray(i, i + 16 * 1024);
      await new Promise((r) => setTimeout(r, 300)); // the reader is well into the file by now
      throw new Error('connection reset by peer');
    }
    await expect(within(receiveApiUpload(siteId, 'broken.csv', Readable.from(breaks()), {}, body.length), 20_000, 'the broken upload')).rejects.toThrow(/did not arrive whole/);
    const [u] = await db().select().from(uploads).where(and(eq(uploads.siteId, siteId), eq(uploads.fileName, 'broken.csv')));
    expect(u!.startedAt).not.toBeNull();
    expect(u!.status).toBe('failed');
    expect(u!.failureReason).toMatch(/connection reset by peer/);
    expect(await objectSize(u!.objectKey)).toBeNull();
    expect(await hoursOfUpload(u!.id)).toBe(0);
    expect((await siteHours(siteId)).length).toBe(0);
    expect((await db().select().from(tags).where(eq(tags.siteId, siteId))).length).toBe(0);
    expect(await workerJobs(u!.id)).toBe(0);
    // The reader's transaction is gone: the site's ingest lock is free for the next read.
    const probe = await pgPool().connect();
    try {
      const { rows } = await probe.query('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', ['ingest-site:' + siteId]);
      expect(rows[0].ok).toBe(true);
      await probe.query('select pg_advisory_unlock(hashtextextended($1, 0))', ['ingest-site:' + siteId]);
    } finally {
      probe.release();
    }
  });

  it('the settings: a body above INGEST_WHILE_UPLOADING_MAX_MB, or one beside a running read with INGEST_WHILE_UPLOADING_AT_ONCE=1, goes to the worker', async () => {
    const body = wideFile('2026-06-07T00:00:00Z', 6000); // about 220 KB
    const siteId = await newSite('settings', body);
    const otherSite = await newSite('settings beside', body);

    process.env.INGEST_WHILE_UPLOADING_MAX_MB = '0.1'; // 104,857 bytes
    const big = await receiveApiUpload(siteId, 'big.csv', chunked(body), {}, body.length);
    delete process.env.INGEST_WHILE_UPLOADING_MAX_MB;
    expect(big.readWhileUploading).toBe(false);
    expect((await row(big.uploadId)).startedAt).toBeNull();
    expect(await workerJobs(big.uploadId)).toBe(1);

    // One read while uploading runs (its client sends slowly); the next upload meanwhile is not read so.
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    async function* slow() {
      yield body.subarray(0, 64 * 1024);
      await held;
      yield body.subarray(64 * 1024);
    }
    const first = receiveApiUpload(otherSite, 'slow.csv', Readable.from(slow()), {}, body.length);
    await new Promise((r) => setTimeout(r, 200)); // the slow upload's reader has begun
    const small = wideFile('2026-06-09T00:00:00Z', 600);
    const beside = await within(receiveApiUpload(siteId, 'beside.csv', chunked(small), {}, small.length), 20_000, 'the upload beside');
    expect(beside.readWhileUploading).toBe(false);
    expect((await row(beside.uploadId)).startedAt).toBeNull();
    expect(await workerJobs(beside.uploadId)).toBe(1);
    release();
    const slowOut = await within(first, 20_000, 'the slow upload');
    expect(slowOut.readWhileUploading).toBe(true);
    expect((await row(slowOut.uploadId)).status).toBe('done');
  });

  it("(e) with the site's ingest lock held by another read, the upload is queued for the worker and its PUT completes", async () => {
    const body = wideFile('2026-06-05T00:00:00Z', 40_000); // about 1.5 MB: far more than the branches hold
    const siteId = await newSite('busy', body);
    const other = await pgPool().connect();
    try {
      await other.query('begin');
      await other.query('select pg_advisory_xact_lock(hashtextextended($1, 0))', ['ingest-site:' + siteId]);
      const out = await within(receiveApiUpload(siteId, 'busy.csv', chunked(body), {}, body.length), 20_000, 'the upload beside a busy site');
      expect(out.readWhileUploading).toBe(false);
      const u = await row(out.uploadId);
      expect(u.startedAt).not.toBeNull();
      expect(u.status).toBe('queued');
      expect(u.sizeBytes).toBe(body.length);
      expect(await objectSize(u.objectKey)).toBe(body.length);
      expect(await workerJobs(out.uploadId)).toBe(1);
      await other.query('commit');
      expect((await ingestUpload(out.uploadId)).kind).toBe('done');
      expect(await hoursOfUpload(out.uploadId)).toBe(TAG_NAMES.length);
    } finally {
      await other.query('rollback').catch(() => undefined);
      other.release();
    }
  });
});
