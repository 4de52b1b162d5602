import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { Readable } from 'node:stream';
import { and, asc, eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { tagHoursOf } from '~/server/services/tag-hours';
import { layoutProfiles, sites, tagHourHistory, tagHours, tags, uploadRejects, uploads, user } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { completeBrowserUpload, confirmLayout, createBrowserUpload, receiveApiUpload, rejectsCsv } from '~/server/services/uploads';
import { objectSize } from '~/server/storage';
import { registerHandlers } from '~/worker/handlers';
import { expectClose } from '../support/expect-close';
import { describeIntegration } from '../support/integration';

const FIX = 'tests/fixtures/ingest-server';
const file = (name: string) => readFileSync(`${FIX}/${name}`);
const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let siteId: string;
let userId: string;

/** Uploads like the browser does: record first, presigned PUT straight into the store, then complete. */
async function browserUpload(name: string, body: Buffer, withHash = true) {
  const created = await createBrowserUpload(siteId, { fileName: name, sizeBytes: body.length, contentType: 'text/csv', sha256: withHash ? sha(body) : undefined }, userId);
  const put = await fetch(created.url, { method: 'PUT', body: new Uint8Array(body), headers: created.headers });
  expect(put.status).toBe(200);
  await completeBrowserUpload(created.uploadId);
  return created.uploadId;
}

async function machineUpload(name: string, body: Buffer) {
  return receiveApiUpload(siteId, name, Readable.from([body]), {});
}

async function waitFor(uploadId: string, states: string[], timeoutMs = 20_000) {
  const t0 = Date.now();
  for (;;) {
    const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
    if (u && states.includes(u.status)) return u;
    if (Date.now() - t0 > timeoutMs) throw new Error(`upload ${uploadId} stayed ${u?.status}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A tag's hours as the tag-hours API answers them (covered fraction, flag names, uploads), with the tag's key. */
async function hoursOf(tagName: string) {
  const [t] = await db().select().from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, tagName)));
  if (!t) return [];
  const out = await tagHoursOf(siteId, tagName, new Date('2026-01-01T00:00:00Z'), new Date('2027-01-01T00:00:00Z'));
  return out.hours.map((h) => ({ ...h, hourStart: new Date(h.hourStart), tagId: t.seq }));
}

/**
 * Reference statistics of a one-minute series within one hour, written independently of the ingest
 * core: trapezoids between consecutive samples (linear interpolation), the hour's share only.
 */
function trapezoid(points: [minute: number, value: number][], hourStartMin: number) {
  let area = 0;
  let covered = 0;
  let sq = 0;
  for (let i = 0; i + 1 < points.length; i++) {
    const [m0, v0] = points[i]!;
    const [m1, v1] = points[i + 1]!;
    if (m0 < hourStartMin || m1 > hourStartMin + 60) continue;
    area += ((v0 + v1) / 2) * (m1 - m0);
    // integral of a straight line squared over the segment
    sq += ((v0 * v0 + v0 * v1 + v1 * v1) / 3) * (m1 - m0);
    covered += m1 - m0;
  }
  const mean = area / covered;
  return { mean, std: Math.sqrt(Math.max(0, sq / covered - mean * mean)), coveredMin: covered };
}
const pressure = (m: number) => 40 + 0.01 * (m % 60);

describeIntegration('historian file ingest through the real worker, PostgreSQL and the object store', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Ingest test site ${Date.now()}`, timeZone: 'UTC' }).returning();
    siteId = s!.id;
    const [u] = await db().select().from(user).where(eq(user.email, 'operator@demo.lossline.test'));
    userId = u!.id;
    await registerHandlers(await queue());
  });

  it('a first browser file of a new shape waits for review; the confirmed layout is saved and the file read', async () => {
    const id = await browserUpload('shift-a.csv', file('shift-a.csv'));
    const waiting = await waitFor(id, ['needs-review', 'done', 'failed']);
    expect(waiting.status).toBe('needs-review');
    const detection = waiting.detection as { profile: { fingerprint: string; layout: string; unitRowIndex: number | null }; preview: unknown[] };
    expect(detection.profile.layout).toBe('wide');
    expect(detection.profile.unitRowIndex).not.toBeNull();
    expect(detection.preview.length).toBeGreaterThan(0);

    await confirmLayout(id, detection.profile as never, 'Boiler house one-minute export', userId);
    const done = await waitFor(id, ['done', 'failed']);
    expect(done.failureReason).toBeNull();
    expect(done.status).toBe('done');
    const summary = done.summary as { tags: number; rows: number; rejected: number };
    expect(summary.rows).toBe(150);
    expect(summary.tags).toBe(3);
    expect(summary.rejected).toBe(1);

    // New tags are created unlinked, with the unit from the file's units row as a hint.
    const t = await db().select().from(tags).where(eq(tags.siteId, siteId)).orderBy(asc(tags.name));
    expect(t.map((x) => [x.name, x.unitHint])).toEqual([
      ['HG.FT-112', 't/h'],
      ['HG.PT-110', 'barg'],
      ['HG.TT-111', 'degC'],
    ]);

    // Hour 00:00-01:00: full cover, time-weighted mean by linear interpolation (independent trapezoids).
    const h = await hoursOf('HG.PT-110');
    expect(h.map((x) => x.hourStart.toISOString())).toEqual(['2026-03-10T00:00:00.000Z', '2026-03-10T01:00:00.000Z', '2026-03-10T02:00:00.000Z']);
    const ref0 = trapezoid([...Array.from({ length: 61 }, (_, m) => [m, pressure(m)] as [number, number])], 0);
    expectClose(h[0]!.mean!, ref0.mean, { rtol: 1e-7, label: 'self-consistency: trapezoid mean (stored as float4: 7 digits)' });
    expectClose(h[0]!.std!, ref0.std, { rtol: 1e-6, label: 'self-consistency: time-weighted spread' });
    expect([h[0]!.min, h[0]!.max, h[0]!.first, h[0]!.last, h[0]!.samples]).toEqual([40, 40.59, 40, 40.59, 60]);
    expectClose(h[0]!.coveredFraction, 1, { rtol: 1e-12 });
    // The last hour of the file is covered 02:00-02:29 only.
    expectClose(h[2]!.coveredFraction, 29 / 60, { rtol: 1e-12 });

    // The shutdown marker is counted and kept out of the statistics, and listed in the report.
    const flow = await hoursOf('HG.FT-112');
    expect(flow[2]!.nonNumeric).toBe(1);
    expect(flow[2]!.mean).toBe(30);
    const csv = await rejectsCsv(id);
    expect(csv).toContain('HG.FT-112');
    expect(csv).toContain('Shutdown');
    expect(csv).toContain('not a number');
  });

  it('a later file of the same shape uses the saved layout; a shared hour combines both files exactly', async () => {
    const id = await browserUpload('shift-b.csv', file('shift-b.csv'));
    const done = await waitFor(id, ['done', 'failed', 'needs-review']);
    expect(done.status).toBe('done');
    const [profile] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.siteId, siteId));
    expect(done.profileId).toBe(profile!.id);

    const h = await hoursOf('HG.PT-110');
    expect(h.map((x) => x.hourStart.toISOString())).toEqual([
      '2026-03-10T00:00:00.000Z',
      '2026-03-10T01:00:00.000Z',
      '2026-03-10T02:00:00.000Z',
      '2026-03-10T03:00:00.000Z',
    ]);
    // Hour 02:00: file A holds 02:00-02:29, file B 02:30-03:00 (its 03:00 sample closes the hour).
    // Merged sample by sample, they are one series: the minute 02:29-02:30 between the files is
    // drawn too, so the hour is fully covered (independent trapezoids over the union of samples).
    const merged = trapezoid(Array.from({ length: 61 }, (_, i) => [120 + i, pressure(120 + i)] as [number, number]), 120);
    expectClose(h[2]!.mean!, merged.mean, { rtol: 1e-7, label: 'self-consistency: mean of the merged samples (float4)' });
    expectClose(h[2]!.coveredFraction, 1, { rtol: 1e-12 });
    expect(h[2]!.samples).toBe(60);
    expect(h[2]!.uploadIds.length).toBe(2);
    expect(h[2]!.flags).toContain('combined-files');
  });

  it('the same bytes again are recognised and not read twice, from the browser and from a machine', async () => {
    const before = await hoursOf('HG.PT-110');
    const again = await browserUpload('shift-a (copy).csv', file('shift-a.csv'));
    const u1 = await waitFor(again, ['done', 'failed', 'needs-review']);
    expect(u1.duplicateOf).not.toBeNull();
    const m = await machineUpload('shift-b-again.csv', file('shift-b.csv'));
    expect(m.duplicateOf).not.toBeNull();
    const after = await hoursOf('HG.PT-110');
    expect(after.map((x) => [x.mean, x.samples])).toEqual(before.map((x) => [x.mean, x.samples]));
  });

  it('a newer file with the same readings replaces them for the time both cover; the old figures stay in history', async () => {
    const before = (await hoursOf('HG.PT-110'))[1]!;
    const { uploadId } = await machineUpload('shift-a-corrected.csv', file('shift-a-corrected.csv'));
    const done = await waitFor(uploadId, ['done', 'failed', 'needs-review']);
    expect(done.status).toBe('done');
    const h = (await hoursOf('HG.PT-110'))[1]!;
    expectClose(h.mean!, before.mean! + 1, { rtol: 1e-3 });
    expect(h.flags).toContain('replaced-older-file');
    expect(h.uploadIds).toEqual([uploadId]);
    const hist = await db().select().from(tagHourHistory).where(and(eq(tagHourHistory.tagId, h.tagId), eq(tagHourHistory.replacedByUploadId, uploadId)));
    expect(hist.length).toBe(1);
    expectClose((hist[0]!.previous as { mean: number }).mean, before.mean!, { rtol: 1e-7 });
  });

  for (const [k, [name, expected]] of ([
    ['empty.csv', /empty/i],
    ['header-only.csv', /no data rows/i],
    ['duplicated-headers.csv', /HG\.PT-110/],
    ['binary.csv', /binary|not a text/i],
  ] as const).entries()) {
    it(`bad input ${name}: a clear reason, the raw file kept, no tag hours, and the worker keeps serving`, async () => {
      const siteHours = async () =>
        (await db().select({ n: tagHours.tagId }).from(tagHours).innerJoin(tags, eq(tags.seq, tagHours.tagId)).where(eq(tags.siteId, siteId))).length;
      const hoursBefore = await siteHours();
      const { uploadId } = await machineUpload(name, file(name));
      const failed = await waitFor(uploadId, ['failed', 'done', 'needs-review']);
      expect(failed.status).toBe('failed');
      expect(failed.failureReason).toMatch(expected);
      expect(await objectSize(failed.objectKey)).toBe(file(name).length);
      expect(await siteHours()).toBe(hoursBefore);
      // The worker still reads the next good file.
      const good = await machineUpload(`after-${name}`, Buffer.concat([file('shift-b.csv'), Buffer.from(`2026-03-10 05:0${k}:00,40.00,400.0,30.0\n`)]));
      expect((await waitFor(good.uploadId, ['done', 'failed', 'needs-review'])).status).toBe('done');
    });
  }

  it('a worker killed in the middle leaves the upload to be read again from the start with the same result', async () => {
    const body = Buffer.from(file('shift-a.csv').toString().replace('2026-03-10', '2026-03-11').replaceAll('2026-03-10', '2026-03-11'));
    const { uploadId } = await machineUpload('day-two.csv', body);
    const first = await waitFor(uploadId, ['done', 'failed', 'needs-review']);
    expect(first.status).toBe('done');
    const snapshot = async () => {
      const [t] = await db().select().from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, 'HG.TT-111')));
      return (await hoursOf('HG.TT-111'))
        .filter((x) => x.hourStart.toISOString().startsWith('2026-03-11'))
        .map((x) => [x.hourStart.toISOString(), x.mean, x.samples, x.coveredFraction]);
    };
    const expected = await snapshot();
    // Simulate a crash mid-read: its transaction never committed, so the hours are not there, and the
    // upload is left 'processing'.
    const [t] = await db().select().from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, 'HG.TT-111')));
    await db().delete(tagHours).where(eq(tagHours.tagId, t!.seq));
    await db().delete(uploadRejects).where(eq(uploadRejects.uploadId, uploadId));
    await db().update(uploads).set({ status: 'processing', attempts: 1 }).where(eq(uploads.id, uploadId));
    // A worker starting up finds the half-read upload and queues it again; the running handler reads it.
    const { resumeInterruptedUploads } = await import('~/server/services/ingest');
    expect(await resumeInterruptedUploads()).toBeGreaterThanOrEqual(1);
    const out = await waitFor(uploadId, ['done', 'failed', 'needs-review']);
    expect(out.status).toBe('done');
    const again = (await snapshot()).filter((r) => (r[0] as string) >= '2026-03-11');
    expect(again).toEqual(expected);
  });
});
