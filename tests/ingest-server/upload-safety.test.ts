/**
 * Uploads that lie, files that are ambiguous or hostile: nothing is lost, nothing is misread. Runs
 * the real worker handlers on PostgreSQL and the object store.
 */
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { and, asc, eq, sql } from 'drizzle-orm';
import { afterEach, beforeAll, expect, it, vi } from 'vitest';
import { db } from '~/server/db/client';
import { sites, tagHours, tags, uploadRejects, uploads, user } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { completeBrowserUpload, confirmLayout, createBrowserUpload, receiveApiUpload, NewUploadInput } from '~/server/services/uploads';
import { registerHandlers } from '~/worker/handlers';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import { describeIntegration } from '../support/integration';

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
let siteId: string;
let userId: string;

/** A one-minute wide export: `rows` minutes from `startIso`, value(i) per tag. */
function wideFile(startIso: string, rows: number, value: (i: number, tag: string) => string, tagsOf = ['SF.PT-1', 'SF.TT-1']) {
  const t0 = Date.parse(startIso);
  const lines = ['Time,' + tagsOf.join(','), ',' + tagsOf.map((t) => (t.includes('TT') ? 'degC' : 'barg')).join(',')];
  for (let i = 0; i < rows; i++) lines.push(`${new Date(t0 + i * 60_000).toISOString().slice(0, 19).replace('T', ' ')},${tagsOf.map((t) => value(i, t)).join(',')}`);
  return Buffer.from(lines.join('\n') + '\n');
}

async function machineUpload(name: string, body: Buffer, site = siteId) {
  return receiveApiUpload(site, name, Readable.from([body]), {});
}

async function browserCreate(name: string, body: Buffer, declared?: string, size = body.length) {
  return createBrowserUpload(siteId, { fileName: name, sizeBytes: size, contentType: 'text/csv', sha256: declared }, userId);
}

async function waitFor(uploadId: string, states: string[], timeoutMs = 30_000) {
  const t0 = Date.now();
  for (;;) {
    const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
    if (u && states.includes(u.status)) return u;
    if (Date.now() - t0 > timeoutMs) throw new Error(`upload ${uploadId} stayed ${u?.status}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function hoursOf(tagName: string, site = siteId) {
  const [t] = await db().select().from(tags).where(and(eq(tags.siteId, site), eq(tags.name, tagName)));
  if (!t) return [];
  return db().select().from(tagHours).where(eq(tagHours.tagId, t.seq)).orderBy(asc(tagHours.hourStart));
}

const FINAL = ['done', 'failed', 'needs-review'];

describeIntegration('upload safety: declared hashes, sizes, ambiguous layouts, impossible values, atomic jobs', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Upload safety site ${Date.now()}`, timeZone: 'UTC' }).returning();
    siteId = s!.id;
    const [u] = await db().select().from(user).where(eq(user.email, 'operator@demo.lossline.test'));
    userId = u!.id;
    await registerHandlers(await queue());
    // The site's layout: a machine file of this shape that decides itself.
    const first = await machineUpload('first.csv', wideFile('2026-04-01T00:00:00Z', 120, (i) => String(40 + (i % 7) / 10)));
    expect((await waitFor(first.uploadId, FINAL)).status).toBe('done');
  });
  afterEach(() => vi.restoreAllMocks());

  it("a browser upload declaring another file's SHA-256 is refused with the reason, never taken as a repeat", async () => {
    const earlier = wideFile('2026-04-01T00:00:00Z', 120, (i) => String(40 + (i % 7) / 10));
    const other = wideFile('2026-04-02T00:00:00Z', 120, () => '41.5');
    const c = await browserCreate('claims-to-be-first.csv', other, sha(earlier));
    expect((await fetch(c.url, { method: 'PUT', body: new Uint8Array(other), headers: c.headers })).status).toBe(200);
    await completeBrowserUpload(c.uploadId);
    const out = await waitFor(c.uploadId, FINAL);
    expect(out.status).toBe('failed');
    expect(out.duplicateOf).toBeNull();
    expect(out.failureReason).toMatch(/SHA-256/);
    expect(out.summary?.code).toBe('HASH_MISMATCH');
    expect(out.sha256).toBeNull();
    expect((await hoursOf('SF.PT-1')).some((h) => h.hourStart.toISOString().startsWith('2026-04-02'))).toBe(false);

    // The same bytes as the first file, declared or not, are a repeat by the hash computed here.
    for (const declared of [sha(earlier), undefined]) {
      const again = await browserCreate('first-again.csv', earlier, declared);
      await fetch(again.url, { method: 'PUT', body: new Uint8Array(earlier), headers: again.headers });
      await completeBrowserUpload(again.uploadId);
      const dup = await waitFor(again.uploadId, FINAL);
      expect(dup.status).toBe('done');
      expect(dup.duplicateOf).not.toBeNull();
      expect(dup.sha256).toBe(sha(earlier));
    }
  });

  it('a browser upload whose stored bytes are not the declared size, or not text/csv, is never read', async () => {
    const body = wideFile('2026-04-03T00:00:00Z', 60, () => '42');
    const short = await browserCreate('declared-short.csv', body, undefined, body.length - 10);
    const put = await fetch(short.url, { method: 'PUT', body: new Uint8Array(body), headers: short.headers });
    if (put.status === 200) {
      await expect(completeBrowserUpload(short.uploadId)).rejects.toThrow(/bytes/);
      const u = await waitFor(short.uploadId, FINAL);
      expect(u.status).toBe('failed');
      expect(u.summary?.code).toBe('SIZE_MISMATCH');
    } else {
      // the store refused the body outright (the signed length): nothing arrived
      await expect(completeBrowserUpload(short.uploadId)).rejects.toThrow(/not arrived/);
    }
    const typed = await browserCreate('as-binary.csv', body);
    const put2 = await fetch(typed.url, { method: 'PUT', body: new Uint8Array(body), headers: { 'content-type': 'application/octet-stream' } });
    if (put2.status === 200) await expect(completeBrowserUpload(typed.uploadId)).rejects.toThrow(/content type/);
    else await expect(completeBrowserUpload(typed.uploadId)).rejects.toThrow(/not arrived/);
    expect((await hoursOf('SF.PT-1')).some((h) => h.hourStart.toISOString().startsWith('2026-04-03'))).toBe(false);
  });

  it('a machine file matching the saved layout by shape but month-first stops with the date-order question; the answer reads it right', async () => {
    const [s] = await db().insert(sites).values({ name: `Date order site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const hourly = (order: 'dmy' | 'mdy', fromIso: string, n: number) => {
      const lines = ['Stamp,DO.FT-1'];
      for (let i = 0; i < n; i++) {
        const d = new Date(Date.parse(fromIso) + i * 3_600_000);
        const dd = String(d.getUTCDate()).padStart(2, '0');
        const mm = String(d.getUTCMonth() + 1).padStart(2, '0');
        lines.push(`${order === 'dmy' ? `${dd}/${mm}` : `${mm}/${dd}`}/2026 ${String(d.getUTCHours()).padStart(2, '0')}:00,${10 + (i % 3)}`);
      }
      return Buffer.from(lines.join('\n') + '\n');
    };
    const saved = await machineUpload('march.csv', hourly('dmy', '2026-03-20T00:00:00Z', 30), s!.id);
    expect((await waitFor(saved.uploadId, FINAL)).status).toBe('done');
    const october = await machineUpload('october.csv', hourly('mdy', '2026-10-03T00:00:00Z', 72), s!.id);
    const asked = await waitFor(october.uploadId, FINAL);
    expect(asked.status).toBe('failed');
    expect(asked.summary?.code).toBe('LAYOUT_QUESTION');
    expect(asked.failureReason).toMatch(/month first/);
    const stored = (await hoursOf('DO.FT-1', s!.id)).map((h) => h.hourStart.toISOString());
    expect(stored.some((x) => x.startsWith('2026-10') || x.startsWith('2026-04-10') || x.startsWith('2026-05-10'))).toBe(false);
    // A person answers: month first.
    const profile = asked.detection!.profile;
    await confirmLayout(october.uploadId, { ...profile, questions: [], time: { ...profile.time, dateOrder: 'mdy' } }, 'month-first export', userId);
    expect((await waitFor(october.uploadId, FINAL)).status).toBe('done');
    const after = (await hoursOf('DO.FT-1', s!.id)).map((h) => h.hourStart.toISOString());
    expect(after).toContain('2026-10-03T00:00:00.000Z');
    expect(after).toContain('2026-10-05T23:00:00.000Z');
  });

  it("a first machine file with ';' and decimal points is never read with a decimal comma: it stops with the question", async () => {
    const [s] = await db().insert(sites).values({ name: `Decimal site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const lines = ['Time;DM.A;DM.B'];
    for (let i = 0; i < 100; i++) lines.push(`2026-04-04 ${String(Math.floor(i / 60)).padStart(2, '0')}:${String(i % 60).padStart(2, '0')};1.234;5.678`);
    const up = await machineUpload('semicolon.csv', Buffer.from(lines.join('\n') + '\n'), s!.id);
    const out = await waitFor(up.uploadId, FINAL);
    expect(out.status).toBe('failed');
    expect(out.summary?.code).toBe('LAYOUT_QUESTION');
    expect(out.failureReason).toMatch(/decimal|thousands/i);
    expect(await hoursOf('DM.A', s!.id)).toEqual([]);
  });

  it('a year-9999 row and 1e308 are rejected cells with their reasons; a file replacing stored hours says how many', async () => {
    const base = wideFile('2026-04-05T00:00:00Z', 120, () => '40');
    const first = await machineUpload('base.csv', base);
    expect((await waitFor(first.uploadId, FINAL)).status).toBe('done');
    // the same times again, newer: hour 00 of the pressure all 1e308, hour 01 reads 41, one row in 9999
    const text = wideFile('2026-04-05T00:00:00Z', 120, (i, tag) => (i < 60 && tag === 'SF.PT-1' ? '1e308' : '41'))
      .toString()
      .replace('2026-04-05 01:30:00', '9999-12-31 23:00:00');
    const newer = await machineUpload('newer.csv', Buffer.from(text));
    const done = await waitFor(newer.uploadId, [...FINAL, 'read-with-problems']);
    // the pressure lost 61 of its 120 values: more than half
    expect(done.status).toBe('read-with-problems');
    expect((done.summary as { problemTags: { tag: string; rejected: number }[] }).problemTags).toEqual([{ tag: 'SF.PT-1', read: 59, rejected: 61, lostShare: 61 / 120 }]);
    const summary = done.summary as { impossible: number; outsideTimeWindow: number; replacedHours: number; warnings: { code: string; message: string }[] };
    expect(summary.impossible).toBe(60);
    expect(summary.outsideTimeWindow).toBe(2);
    expect(summary.replacedHours).toBeGreaterThan(0);
    expect(summary.warnings.find((w) => w.code === 'REPLACED_HOURS')?.message).toContain(String(summary.replacedHours));
    const reasons = await db().selectDistinct({ reason: uploadRejects.reason }).from(uploadRejects).where(eq(uploadRejects.uploadId, newer.uploadId));
    expect(reasons.map((r) => r.reason).sort()).toEqual(['physically impossible value', 'time outside the accepted window']);
    const h = (await hoursOf('SF.PT-1')).filter((x) => x.hourStart.toISOString().startsWith('2026-04-05'));
    // Merged sample by sample: hour 00 keeps the older 40s (the newer cells there were rejected),
    // and its last minute runs to the newer 41 at 01:00 (trapezoid: 40 + 0.5/60). Hour 01 reads the
    // newer 41s, except 01:30, whose newer row carried the year 9999: the older 40 stays there
    // (two one-minute segments half a unit lower, over the 59 covered minutes: 41 - 1/59).
    expectClose(h[0]!.mean!, 40 + 0.5 / 60, { rtol: 1e-7, label: 'hand-computed trapezoids (float4)' });
    expectClose(h[1]!.mean!, 41 - 1 / 59, { rtol: 1e-7, label: 'hand-computed trapezoids (float4)' });
    const { worst } = at((await db().execute(sql`select max(abs(th.max)) as worst, max(th.hour_start) as last from tag_hours th join tags t on t.seq = th.tag_id where t.site_id = ${siteId}`)).rows as { worst: number }[], 0, 'the largest tag hour');
    expect(Number(worst)).toBeLessThan(1e6);
    const jobs = await db().execute(sql`select max((data->>'toMs')::bigint) as to_ms from pgboss.job where name = 'compute-unit-hours' and data->>'siteId' = ${siteId}`);
    expect(Number((jobs.rows[0] as { to_ms: string }).to_ms)).toBeLessThan(Date.now() + 2 * 86_400_000);
  });

  it("a file's tag hours and its compute job commit together: when the job cannot be queued, no hour is committed", async () => {
    const boss = await queue();
    const original = boss.send.bind(boss);
    let visibleAtSend = -1;
    let failed = false;
    vi.spyOn(boss, 'send').mockImplementation((async (...args: unknown[]) => {
      const name = typeof args[0] === 'string' ? args[0] : (args[0] as { name: string }).name;
      if (name === 'compute-unit-hours' && !failed) {
        failed = true;
        visibleAtSend = (await hoursOf('AT.PT-1')).length;
        throw new Error('queue unreachable (test)');
      }
      return (original as (...a: unknown[]) => unknown)(...args);
    }) as never);
    const up = await machineUpload('atomic.csv', wideFile('2026-04-06T00:00:00Z', 90, () => '43', ['AT.PT-1']));
    const out = await waitFor(up.uploadId, ['done', 'failed'], 40_000);
    expect(failed).toBe(true);
    // Seen from another connection when the send failed: not one hour committed without its job.
    expect(visibleAtSend).toBe(0);
    expect(out.status).toBe('done');
    expect((await hoursOf('AT.PT-1')).length).toBe(2);
    const jobs = await db().execute(sql`select count(*)::int as n from pgboss.job where name = 'compute-unit-hours' and data->>'siteId' = ${siteId}
      and (data->>'fromMs')::bigint <= ${Date.parse('2026-04-06T00:00:00Z')} and (data->>'toMs')::bigint >= ${Date.parse('2026-04-06T01:29:00Z')}`);
    expect((jobs.rows[0] as { n: number }).n).toBeGreaterThanOrEqual(1);
  });

  it('file names with NUL bytes are refused (400); reasons quoting the file never put e-mail addresses in the log', async () => {
    expect(NewUploadInput.safeParse({ fileName: 'a\u0000.csv', sizeBytes: 10 }).success).toBe(false);
    await expect(machineUpload('x\u0000y.csv', Buffer.from('a'))).rejects.toMatchObject({ code: 'VALIDATION_FAILED' });
    const logged: string[] = [];
    vi.spyOn(console, 'log').mockImplementation((...a: unknown[]) => void logged.push(a.join(' ')));
    const up = await machineUpload('mail.csv', Buffer.from('Time,ops@plant.example,ops@plant.example\n2026-04-07 00:00,1,2\n2026-04-07 00:01,1,2\n2026-04-07 00:02,1,2\n'));
    const out = await waitFor(up.uploadId, FINAL);
    expect(out.status).toBe('failed');
    expect(out.failureReason).toContain('ops@plant.example');
    await new Promise((r) => setTimeout(r, 300));
    expect(logged.some((l) => l.includes(up.uploadId))).toBe(true);
    expect(logged.filter((l) => l.includes('@plant.example'))).toEqual([]);
  });

  it("an upload's finish time is when it finished, not when its reading began", async () => {
    const up = await machineUpload('timed.csv', wideFile('2026-04-08T00:00:00Z', 3000, (i) => String(40 + (i % 10))));
    const out = await waitFor(up.uploadId, FINAL);
    expect(out.status).toBe('done');
    // The compute job is queued in the file's own transaction, so its created_on is that transaction's
    // start (PostgreSQL's now()); a finish time taken from now() in that transaction would equal it.
    const [row] = (
      await db().execute(sql`select max(created_on) as began from (
        select created_on, data from pgboss.job where name = 'compute-unit-hours'
        union all select created_on, data from pgboss.archive where name = 'compute-unit-hours') j
        where j.data->>'siteId' = ${siteId}`)
    ).rows as { began: Date }[];
    expect(row!.began).not.toBeNull();
    expect(out.finishedAt!.getTime()).toBeGreaterThan(new Date(row!.began).getTime());
    expect(out.finishedAt!.getTime()).toBeGreaterThan(out.startedAt!.getTime());
  });
});
