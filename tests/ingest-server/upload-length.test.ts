/**
 * A machine upload with a declared length (the request's Content-Length) streams into the store as
 * one PUT: the stored bytes are the file's, and a body shorter or longer than declared fails with
 * its reason, the upload marked failed and no object left behind for a retry to misread.
 */
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, uploads } from '~/server/db/schema';
import { objectSize, objectStream } from '~/server/storage';
import { receiveApiUpload } from '~/server/services/uploads';
import { describeIntegration } from '../support/integration';

let siteId: string;
const body = Buffer.from('Time,LT.PT-1\n2026-01-05 00:00:00,4.5\n2026-01-05 00:01:00,4.6\n');

async function stored(key: string): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of await objectStream(key)) parts.push(c as Buffer);
  return Buffer.concat(parts);
}

/** The body in two chunks, as a network stream gives it. */
const streamOf = (b: Buffer) => Readable.from([b.subarray(0, 20), b.subarray(20)]);

describeIntegration('machine uploads with a declared length', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Upload length site ${Date.now()}`, timeZone: 'UTC' }).returning();
    siteId = s!.id;
  });

  it('stores exactly the bytes sent, with and without a declared length, and hashes them', async () => {
    for (const size of [body.length, undefined]) {
      const { uploadId } = await receiveApiUpload(siteId, `len-${size ?? 'none'}.csv`, streamOf(body), {}, size);
      const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
      expect(u!.sizeBytes).toBe(body.length);
      expect(u!.sha256).toBe(createHash('sha256').update(body).digest('hex'));
      expect((await stored(u!.objectKey)).equals(body)).toBe(true);
    }
  });

  it.each([
    ['shorter', body.length + 50, /ended after \d+ of the \d+ bytes/],
    ['longer', body.length - 10, /more than the \d+ bytes its Content-Length declared/],
  ])('a body %s than declared fails with its reason and leaves no object', async (label, declared, reason) => {
    const name = `${label}-${Date.now()}.csv`;
    await expect(receiveApiUpload(siteId, name, streamOf(body), {}, declared)).rejects.toThrow(reason);
    const [u] = await db().select().from(uploads).where(eq(uploads.fileName, name));
    expect(u!.status).toBe('failed');
    expect(u!.failureReason).toMatch(reason);
    expect(await objectSize(u!.objectKey)).toBeNull();
  });
});
