/**
 * Server-level fuzz: a few hundred hostile exports posted through the token API (the guard and the
 * /api/v1 files endpoint, with a site token) and read by the real worker handlers. Every upload ends
 * in a final state with a catalogued reason when it stops; nothing impossible is stored; the good
 * data stored before is unchanged. FUZZ_SERVER_FILES (default 200) and FUZZ_SEED tune the run.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import fc from 'fast-check';
import { beforeAll, expect, it } from 'vitest';
import { hostileExport } from '../../fuzz/ingest-cases';
import { INGEST_ERROR_CATALOGUE } from '~/lib/ingest/errors';
import { POST as postFile } from '~/pages/api/v1/sites/[siteId]/files';
import { GET as getUpload } from '~/pages/api/v1/uploads/[uploadId]';
import { db } from '~/server/db/client';
import { sites, tagHours, tags, uploads } from '~/server/db/schema';
import { guard } from '~/server/guard';
import { queue } from '~/server/queue';
import { issueApiToken } from '~/server/tokens';
import { registerHandlers } from '~/worker/handlers';
import { describeIntegration } from '../support/integration';

let siteId: string;
let secret: string;

/** One request through the guard and the endpoint, as the server runs them. */
async function call(method: string, path: string, params: Record<string, string>, handler: (ctx: never) => Response | Promise<Response>, body?: Uint8Array, headers: Record<string, string> = {}) {
  const url = new URL(`http://127.0.0.1${path}`);
  const request = new Request(url, { method, body: body as BodyInit | undefined, headers: { authorization: `Bearer ${secret}`, 'content-type': 'text/csv', ...headers }, duplex: 'half' } as RequestInit);
  const locals = {} as App.Locals;
  const ctx = { request, url, params, locals, redirect: (p: string, s = 302) => new Response(null, { status: s, headers: { location: p } }) };
  return guard(ctx, async () => handler(ctx as never));
}

async function snapshotGood() {
  const rows = await db()
    .select({ hour: tagHours.hourStart, mean: tagHours.mean, min: tagHours.min, max: tagHours.max, samples: tagHours.samples, flags: tagHours.flags })
    .from(tagHours)
    .innerJoin(tags, eq(tags.seq, tagHours.tagId))
    .where(and(eq(tags.siteId, siteId), eq(tags.name, 'GOODTAG.PT-1')))
    .orderBy(asc(tagHours.hourStart));
  return rows.map((r) => ({ ...r, hour: r.hour.toISOString() }));
}

describeIntegration('hostile exports through the token API', () => {
  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Token fuzz site ${Date.now()}`, timeZone: 'Europe/Berlin' }).returning();
    siteId = s!.id;
    secret = (await issueApiToken({ siteId, name: 'fuzz', role: 'operator', createdBy: null })).secret;
    await registerHandlers(await queue());
  });

  it('each upload ends read or stopped with a catalogued reason; the good data stored before is unchanged', async () => {
    // Good data first, in a tag and at times the fuzzed files never name.
    const good = ['Time,GOODTAG.PT-1', ...Array.from({ length: 180 }, (_, i) => `${new Date(Date.UTC(2025, 0, 15) + i * 60_000).toISOString().slice(0, 19).replace('T', ' ')},${(40 + (i % 9) / 10).toFixed(1)}`)].join('\n') + '\n';
    const first = await call('POST', `/api/v1/sites/${siteId}/files`, { siteId }, postFile as never, new TextEncoder().encode(good), { 'x-file-name': 'good.csv' });
    expect(first.status).toBe(202);
    const goodId = ((await first.json()) as { uploadId: string }).uploadId;
    for (let t0 = Date.now(); ; ) {
      const [u] = await db().select().from(uploads).where(eq(uploads.id, goodId));
      if (u!.status === 'done') break;
      expect(['queued', 'processing']).toContain(u!.status);
      if (Date.now() - t0 > 30_000) throw new Error('good file not read');
      await new Promise((r) => setTimeout(r, 100));
    }
    const before = await snapshotGood();
    expect(before.length).toBe(3);

    // A name with a NUL byte answers 400 with the error shape.
    const nul = await call('POST', `/api/v1/sites/${siteId}/files?name=${encodeURIComponent('a\u0000b.csv')}`, { siteId }, postFile as never, new TextEncoder().encode(good));
    expect(nul.status).toBe(400);
    expect(((await nul.json()) as { error: { code: string } }).error.code).toBe('VALIDATION_FAILED');

    const n = Number(process.env.FUZZ_SERVER_FILES ?? 200);
    const seed = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : Date.now() % 2 ** 31;
    const files = fc.sample(hostileExport, { numRuns: n, seed });
    const ids: string[] = [];
    for (const [k, bytes] of files.entries()) {
      const res = await call('POST', `/api/v1/sites/${siteId}/files`, { siteId }, postFile as never, bytes, { 'x-file-name': `fuzz-${k}.csv` });
      expect(res.status, `seed ${seed} file ${k}`).toBe(202);
      ids.push(((await res.json()) as { uploadId: string }).uploadId);
    }
    // Every upload reaches a final state (read, read with problems, stopped, or waiting for a person).
    const FINAL = ['done', 'read-with-problems', 'failed', 'needs-review'];
    const t0 = Date.now();
    let rows: (typeof uploads.$inferSelect)[] = [];
    for (;;) {
      rows = await db().select().from(uploads).where(inArray(uploads.id, ids));
      if (rows.every((u) => FINAL.includes(u.status))) break;
      if (Date.now() - t0 > 20 * 60_000) throw new Error(`seed ${seed}: uploads still ${rows.filter((u) => !FINAL.includes(u.status)).map((u) => `${u.fileName} ${u.status}`).join(', ')}`);
      await new Promise((r) => setTimeout(r, 250));
    }
    const counts: Record<string, number> = {};
    for (const u of rows) {
      const code = u.summary?.code;
      const key = u.status === 'failed' ? `failed ${code}` : u.duplicateOf ? 'done (repeat)' : u.status;
      counts[key] = (counts[key] ?? 0) + 1;
      if (u.status === 'failed') {
        // A file problem has its catalogued code and a reason; never 'a reason outside the file'.
        expect(code && code in INGEST_ERROR_CATALOGUE, `seed ${seed} ${u.fileName}: ${u.failureReason}`).toBe(true);
        expect(u.failureReason).not.toMatch(/outside the file/);
      }
      if (u.status === 'read-with-problems') {
        // Read, but a tag lost more than half its values: the summary says which, in words.
        expect((u.summary as { problems?: string | null }).problems ?? '', `seed ${seed} ${u.fileName}`).toMatch(/\S/);
      }
      if (u.status === 'done' && !u.duplicateOf) {
        const s = u.summary as { values: number; perTag: { notNumbers: number; impossible: number }[] };
        const bad = s.perTag.reduce((a, t) => a + t.notNumbers + t.impossible, 0);
        expect(bad, `seed ${seed} ${u.fileName}: most values rejected yet done`).toBeLessThanOrEqual(s.values + bad);
        expect(bad <= 0.5 * (s.values + bad), `seed ${seed} ${u.fileName}`).toBe(true);
        expect(u.finishedAt!.getTime()).toBeGreaterThanOrEqual(u.startedAt!.getTime());
      }
    }
    console.log(`[token-fuzz] seed ${seed}: ${n} files: ${JSON.stringify(counts)}`);

    // Nothing impossible and nothing outside the site's window was stored.
    const worst = (
      await db().execute<{ worst: number | null; last: Date | null }>(
        sql`select max(greatest(abs(th.max), abs(th.min), abs(th.mean))) as worst, max(th.hour_start) as last from tag_hours th join tags t on t.seq = th.tag_id where t.site_id = ${siteId}`,
      )
    ).rows[0]!;
    expect(Number(worst.worst ?? 0)).toBeLessThanOrEqual(1e18);
    expect(new Date(worst.last!).getTime()).toBeLessThan(Date.now() + 2 * 86_400_000);

    // The good data is as it was.
    expect(await snapshotGood()).toEqual(before);

    // An upload's state answers through the token API too.
    const one = await call('GET', `/api/v1/uploads/${ids[0]}`, { uploadId: ids[0]! }, getUpload as never);
    expect(one.status).toBe(200);
  }, 30 * 60_000);
});
