/**
 * A browser upload is hashed while it is read (one download of the stored file, not two), and a
 * repeat of an earlier upload is still told as such: before the commit when the file is read, before
 * the question when its layout must be asked. Runs the real worker handlers on PostgreSQL and the
 * object store.
 */
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { and, eq, sql } from 'drizzle-orm';
import { afterEach, beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, tagHours, tags, uploads, user } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { completeBrowserUpload, createBrowserUpload, receiveApiUpload } from '~/server/services/uploads';
import { s3 } from '~/server/storage';
import { registerHandlers } from '~/worker/handlers';
import { describeIntegration } from '../support/integration';

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const FINAL = ['done', 'read-with-problems', 'failed', 'needs-review'];
let siteId: string;
let userId: string;

/** A one-minute wide export of two tags: `rows` minutes from `startIso`. */
function wideFile(startIso: string, rows: number, value: (i: number) => string, header = 'Time,BH.PT-1,BH.TT-1') {
  const t0 = Date.parse(startIso);
  const lines = [header, ',barg,degC'];
  for (let i = 0; i < rows; i++) lines.push(`${new Date(t0 + i * 60_000).toISOString().slice(0, 19).replace('T', ' ')},${value(i)},${value(i + 3)}`);
  return Buffer.from(lines.join('\n') + '\n');
}

/** Record, presigned PUT straight into the store, complete: as the uploads page does. */
async function browserPut(name: string, body: Buffer, declared?: string) {
  const c = await createBrowserUpload(siteId, { fileName: name, sizeBytes: body.length, contentType: 'text/csv', sha256: declared }, userId);
  expect((await fetch(c.url, { method: 'PUT', body: new Uint8Array(body), headers: c.headers })).status).toBe(200);
  return c;
}

async function waitFor(uploadId: string, timeoutMs = 30_000) {
  const t0 = Date.now();
  for (;;) {
    const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
    if (u && FINAL.includes(u.status)) return u;
    if (Date.now() - t0 > timeoutMs) throw new Error(`upload ${uploadId} stayed ${u?.status}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Counts whole-object GETs (no Range: the layout's look at the head is not a download) per key. */
function countDownloads() {
  const counts = new Map<string, number>();
  s3().middlewareStack.add(
    (next, context) => async (args) => {
      const input = args.input as { Key?: string; Range?: string };
      if (context.commandName === 'GetObjectCommand' && input.Key && !input.Range) counts.set(input.Key, (counts.get(input.Key) ?? 0) + 1);
      return next(args);
    },
    { step: 'initialize', name: 'countDownloads' },
  );
  return counts;
}

async function hourCount(tagName: string, dayIso: string) {
  const [t] = await db().select().from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, tagName)));
  if (!t) return 0;
  const rows = await db().select().from(tagHours).where(eq(tagHours.tagId, t.seq));
  return rows.filter((h) => h.hourStart.toISOString().startsWith(dayIso)).length;
}

describeIntegration('browser uploads: hashed during the read, repeats told before the commit', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Browser hash site ${Date.now()}`, timeZone: 'UTC' }).returning();
    siteId = s!.id;
    const [u] = await db().select().from(user).where(eq(user.email, 'operator@demo.lossline.test'));
    userId = u!.id;
    await registerHandlers(await queue());
    // The site's layout: a machine file of this shape decides it and saves it.
    const first = await receiveApiUpload(siteId, 'first.csv', Readable.from([wideFile('2026-05-01T00:00:00Z', 120, (i) => String(40 + (i % 7) / 10))]), {});
    expect((await waitFor(first.uploadId)).status).toBe('done');
  });
  afterEach(() => {
    s3().middlewareStack.remove('countDownloads');
  });

  it('a browser upload of a known layout is downloaded once, and its hash is the hash of its bytes', async () => {
    const body = wideFile('2026-05-02T00:00:00Z', 180, (i) => String(50 + (i % 11) / 10));
    const downloads = countDownloads();
    const c = await browserPut('second.csv', body, sha(body));
    await completeBrowserUpload(c.uploadId);
    const u = await waitFor(c.uploadId);
    expect(u.status).toBe('done');
    expect(u.sha256).toBe(sha(body));
    expect(u.duplicateOf).toBeNull();
    expect(downloads.get(c.objectKey)).toBe(1);
    expect(await hourCount('BH.PT-1', '2026-05-02')).toBe(3);
  });

  it('two browser copies of the same bytes completed together: one is read, the other stands aside for it', async () => {
    const body = wideFile('2026-05-03T00:00:00Z', 120, (i) => String(60 + (i % 5) / 10));
    const a = await browserPut('third.csv', body);
    const b = await browserPut('third (copy).csv', body);
    await Promise.all([completeBrowserUpload(a.uploadId), completeBrowserUpload(b.uploadId)]);
    const [ua, ub] = await Promise.all([waitFor(a.uploadId), waitFor(b.uploadId)]);
    const read = [ua, ub].filter((u) => u.duplicateOf === null);
    const aside = [ua, ub].filter((u) => u.duplicateOf !== null);
    expect(read.length).toBe(1);
    expect(aside.length).toBe(1);
    expect(aside[0]!.duplicateOf).toBe(read[0]!.id);
    expect(aside[0]!.status).toBe('done');
    expect(aside[0]!.sha256).toBe(sha(body));
    expect(read[0]!.sha256).toBe(sha(body));
    expect(read[0]!.summary?.replacedHours).toBe(0);
    expect(await hourCount('BH.PT-1', '2026-05-03')).toBe(2);
    // The hours carry the one upload that was read.
    const [t] = await db().select().from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, 'BH.PT-1')));
    const counted = await db().execute<{ n: number }>(
      sql`select count(distinct upload_id)::int as n from tag_hour_uploads where tag_id = ${t!.seq} and first_hour <= '2026-05-03T23:00Z' and last_hour >= '2026-05-03T00:00Z'`,
    );
    expect(counted.rows[0]?.n).toBe(1);
  });

  it('a repeat of a browser upload still waiting for its layout answer stands aside instead of asking again', async () => {
    // A new shape (another header): the site has no layout for it, so a browser upload asks.
    const body = wideFile('2026-05-04T00:00:00Z', 60, (i) => String(70 + (i % 3) / 10), 'Stamp,BH.PT-1,BH.TT-1');
    const first = await browserPut('new-shape.csv', body);
    await completeBrowserUpload(first.uploadId);
    const asked = await waitFor(first.uploadId);
    expect(asked.status).toBe('needs-review');
    expect(asked.sha256).toBe(sha(body));
    const again = await browserPut('new-shape (copy).csv', body);
    await completeBrowserUpload(again.uploadId);
    const u = await waitFor(again.uploadId);
    expect(u.status).toBe('done');
    expect(u.duplicateOf).toBe(first.uploadId);
    expect(await hourCount('BH.PT-1', '2026-05-04')).toBe(0);
  });
});
