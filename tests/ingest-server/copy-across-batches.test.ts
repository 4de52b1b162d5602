/**
 * New tag hours go into PostgreSQL through one COPY kept open across the batches of a read
 * (TagHourCopy in src/server/services/ingest-write.ts). A read that fails after batches went into
 * that COPY must leave nothing of the file (the COPY stopped, the transaction rolled back) and a free
 * connection: the next file of the site reads as usual. And a file of many batches stores every hour.
 */
import { Readable } from 'node:stream';
import { eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, tagHourUploads, tags, uploads } from '~/server/db/schema';
import { ingestUpload } from '~/server/services/ingest';
import { receiveApiUpload } from '~/server/services/uploads';
import { describeIntegration } from '../support/integration';

const TAGS = 40;
const HOURS = 300;

/** Ten-minute rows of 40 tags over 300 hours: 12,000 tag hours, more than two writer batches of 5,000. */
function exportText(tail = ''): Buffer {
  const lines = ['Timestamp,' + Array.from({ length: TAGS }, (_, j) => `CP-${j}`).join(',')];
  const start = Date.UTC(2026, 2, 1);
  for (let i = 0; i < HOURS * 6; i++) {
    const t = new Date(start + i * 600_000).toISOString().slice(0, 19).replace('T', ' ');
    lines.push(`${t},${Array.from({ length: TAGS }, (_, j) => (20 + j + Math.cos(i / 9 + j)).toFixed(2)).join(',')}`);
  }
  return Buffer.from(lines.join('\n') + '\n' + tail);
}

let siteId: string;

/** A machine upload without a Content-Length (read by the worker's path, not while uploading), then read. */
async function upload(name: string, body: Buffer) {
  const { uploadId } = await receiveApiUpload(siteId, name, Readable.from([body]), {});
  const outcome = await ingestUpload(uploadId);
  const [row] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
  return { uploadId, outcome, row: row! };
}

async function storedHours(): Promise<number> {
  const res = await db().execute<{ n: string }>(sql`select count(*)::text as n from tag_hours th join tags t on t.seq = th.tag_id where t.site_id = ${siteId}`);
  return Number(res.rows[0]!.n);
}

describeIntegration('tag hours through one COPY across batches', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `COPY test site ${Date.now()}`, timeZone: 'UTC' }).returning();
    siteId = s!.id;
  });

  it('a read that fails after batches went into the open COPY leaves no tag hour and a free connection', async () => {
    // The file's last line opens a quote that never closes: found at the end, after 10,000 tag hours were written.
    const broken = await upload('broken.csv', exportText('2026-03-13 12:00:00,"1.0\n'));
    expect(broken.outcome.kind).toBe('failed');
    expect(broken.row.status).toBe('failed');
    expect(broken.row.summary).toMatchObject({ code: 'UNTERMINATED_QUOTE' });
    expect(await storedHours()).toBe(0);
    expect(await db().select().from(tagHourUploads).where(eq(tagHourUploads.uploadId, broken.uploadId))).toHaveLength(0);

    // Text from the 101st hour on: the hours before went into the COPY, and at the end the file is
    // judged mostly unreadable (two thirds of its values are no numbers), so nothing of it may stay.
    const lines = exportText().toString().trimEnd().split('\n');
    for (let i = 601; i < lines.length; i++) lines[i] = lines[i]!.replace(/,.*$/, ',n/a'.repeat(TAGS));
    const refused = await upload('mostly-text.csv', Buffer.from(lines.join('\n') + '\n'));
    expect(refused.row.status).toBe('failed');
    expect(refused.row.summary).toMatchObject({ code: 'MOSTLY_REJECTED' });
    expect(await storedHours()).toBe(0);
  }, 60_000);

  it('a file of several batches stores every tag hour once, and which tags it brought', async () => {
    const good = await upload('good.csv', exportText());
    expect(good.row.status).toBe('done');
    expect(await storedHours()).toBe(TAGS * HOURS);
    const brought = await db().select().from(tagHourUploads).where(eq(tagHourUploads.uploadId, good.uploadId));
    expect(brought).toHaveLength(TAGS);
    for (const b of brought) expect(b.lastHour.getTime() - b.firstHour.getTime()).toBe((HOURS - 1) * 3_600_000);
    const named = await db().select().from(tags).where(eq(tags.siteId, siteId));
    expect(named).toHaveLength(TAGS);
  }, 60_000);
});
