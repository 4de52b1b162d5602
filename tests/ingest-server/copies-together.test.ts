/**
 * Two copies of the same file sent at the same moment (a scheduled export retried while the first
 * attempt still uploads): each finds no earlier copy read when its own upload ends, so the check
 * before the commit decides. The bytes must be read once: the copy read second stands aside for the
 * first, by the worker's path and by reading while uploading.
 */
import { PassThrough, Readable } from 'node:stream';
import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, uploads } from '~/server/db/schema';
import { ingestUpload } from '~/server/services/ingest';
import { receiveApiUpload } from '~/server/services/uploads';
import { describeIntegration } from '../support/integration';

/** A day of ten-minute rows of three tags, different per site so no test sees another's copies. */
function exportText(seed: number): Buffer {
  const lines = ['Timestamp,CT-1,CT-2,CT-3'];
  const start = Date.UTC(2026, 4, 2);
  for (let i = 0; i < 144; i++) {
    const t = new Date(start + i * 600_000).toISOString().slice(0, 19).replace('T', ' ');
    lines.push(`${t},${(40 + seed + Math.sin(i / 7)).toFixed(2)},${(3 + Math.cos(i / 5)).toFixed(3)},${(120 + (i % 12)).toFixed(1)}`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}

async function newSite() {
  const [s] = await db().insert(sites).values({ name: `Copies test site ${Date.now()}`, timeZone: 'UTC' }).returning();
  return s!.id;
}

/** Starts a machine upload whose body arrives in two halves: the second when `finish` is called. */
function slowUpload(siteId: string, body: Buffer) {
  const stream = new PassThrough();
  stream.write(body.subarray(0, body.length >> 1));
  const done = receiveApiUpload(siteId, 'copy-1.csv', stream, {});
  return { done, finish: () => stream.end(body.subarray(body.length >> 1)) };
}

async function rowOf(id: string) {
  const [row] = await db().select().from(uploads).where(eq(uploads.id, id));
  return row!;
}

/** The upload that waits for the PUT of `first` to be in its record before going on. */
async function untilRecorded(siteId: string, count: number) {
  for (let i = 0; i < 100; i++) {
    if ((await db().select().from(uploads).where(eq(uploads.siteId, siteId))).length >= count) return;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error('the first upload was never recorded');
}

describeIntegration('two copies of one file sent together', () => {
  let body: Buffer;
  beforeAll(() => {
    body = exportText(1);
  });

  it('both waiting for the worker: the later-made copy stands aside for the earlier, whichever is read first', async () => {
    const siteId = await newSite();
    const first = slowUpload(siteId, body);
    await untilRecorded(siteId, 1);
    // The second copy arrives whole while the first is still arriving: no copy is read yet.
    const second = await receiveApiUpload(siteId, 'copy-2.csv', Readable.from([body]), {});
    expect(second.duplicateOf).toBeNull();
    first.finish();
    const a = await first.done;
    expect(a.duplicateOf).toBeNull();
    // The worker takes the later-made copy first.
    expect((await ingestUpload(second.uploadId)).kind).toBe('done');
    expect((await ingestUpload(a.uploadId)).kind).toBe('done');
    const [ra, rb] = [await rowOf(a.uploadId), await rowOf(second.uploadId)];
    expect(rb.duplicateOf).toBe(a.uploadId);
    expect(ra.duplicateOf).toBeNull();
    expect(ra.summary).toMatchObject({ hours: 72, replacedHours: 0, combinedHours: 0 });
  }, 60_000);

  it('one read while uploading, the other by the worker: the copy read second stands aside for the first', async () => {
    const siteId = await newSite();
    const first = slowUpload(siteId, body);
    await untilRecorded(siteId, 1);
    // The second copy declares its length, so it is read while it arrives and is done at once.
    const second = await receiveApiUpload(siteId, 'copy-2.csv', Readable.from([body]), {}, body.length);
    expect(second.readWhileUploading).toBe(true);
    expect((await rowOf(second.uploadId)).status).toBe('done');
    first.finish();
    const a = await first.done;
    expect((await ingestUpload(a.uploadId)).kind).toBe('done');
    const ra = await rowOf(a.uploadId);
    expect(ra.duplicateOf).toBe(second.uploadId);
    const rb = await rowOf(second.uploadId);
    expect(rb.summary).toMatchObject({ hours: 72, replacedHours: 0 });
  }, 60_000);
});
