/**
 * Two worker processes; the one reading a file is killed with SIGKILL in the middle. The live one
 * takes the upload over within a minute (not after the job's two-hour expiry) and reads it whole,
 * exactly once.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { Readable } from 'node:stream';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, uploads } from '~/server/db/schema';
import { receiveApiUpload } from '~/server/services/uploads';
import { describeIntegration } from '../support/integration';
import { at } from '../support/present';

interface Worker {
  child: ChildProcess;
  out: string;
  exited: boolean;
}
const workers: Worker[] = [];

function startWorker(): Worker {
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/worker/main.ts'], {
    env: { ...process.env, INGEST_SWEEP_SECONDS: '5' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const w: Worker = { child, out: '', exited: false };
  child.stdout!.on('data', (d) => (w.out += String(d)));
  child.stderr!.on('data', (d) => (w.out += String(d)));
  child.on('exit', () => (w.exited = true));
  workers.push(w);
  return w;
}

async function until<T>(what: string, fn: () => Promise<T | null | undefined | false> | T | null | undefined | false, timeoutMs: number): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** A wide one-minute export big enough to take a few seconds to read. */
function bigExport(tagCount: number, rows: number): Buffer {
  const names = Array.from({ length: tagCount }, (_, k) => `KT.FT-${String(k).padStart(3, '0')}`);
  const parts = [`Time,${names.join(',')}\n`];
  const t0 = Date.UTC(2026, 4, 1);
  for (let i = 0; i < rows; i++) {
    let line = new Date(t0 + i * 60_000).toISOString().slice(0, 19).replace('T', ' ');
    for (let k = 0; k < tagCount; k++) line += `,${(10 + k + (i % 60) / 100).toFixed(2)}`;
    parts.push(line + '\n');
  }
  return Buffer.from(parts.join(''));
}

describeIntegration('a reading worker killed while another lives', () => {
  beforeAll(async () => {
    startWorker();
    startWorker();
    await until('two workers ready', () => workers.every((w) => w.out.includes('[worker] ready')), 60_000);
  }, 90_000);

  afterAll(async () => {
    for (const w of workers) if (!w.exited) w.child.kill('SIGTERM');
    await until('workers stopped', () => workers.every((w) => w.exited), 15_000).catch(() => {
      for (const w of workers) if (!w.exited) w.child.kill('SIGKILL');
    });
  });

  it('kill -9 of the reader: the other worker takes over within a minute and the file is read exactly once', async () => {
    const [s] = await db().insert(sites).values({ name: `Takeover site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const tagCount = 60;
    const rows = 14 * 24 * 60;
    const { uploadId } = await receiveApiUpload(s!.id, 'two-weeks.csv', Readable.from([bigExport(tagCount, rows)]), {});
    // Wait until one worker is reading it, then kill that one.
    await until('processing', async () => (await db().select().from(uploads).where(eq(uploads.id, uploadId)))[0]?.status === 'processing', 60_000);
    const reader = await until('the reader', () => workers.find((w) => !w.exited && w.out.includes(`ingest ${uploadId}: picked up`)), 10_000);
    const other = workers.find((w) => w !== reader)!;
    const killedAt = Date.now();
    reader.child.kill('SIGKILL');
    await until('reader dead', () => reader.exited, 10_000);
    expect((await db().select().from(uploads).where(eq(uploads.id, uploadId)))[0]!.status).not.toBe('done');

    // The live worker picks it up within a minute (its sweep runs every 5 s here, 20 s by default),
    // not after the killed job's two-hour expiry.
    await until('the live worker picks it up', () => other.out.includes(`ingest ${uploadId}: picked up`), 60_000);
    const done = await until(
      'taken over and done',
      async () => {
        const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
        return u && ['done', 'failed'].includes(u.status) ? u : null;
      },
      120_000,
    );
    const tookMs = Date.now() - killedAt;
    console.log(`[takeover] upload read to the end ${(tookMs / 1000).toFixed(1)} s after the kill`);
    expect(done.status).toBe('done');
    const summary = done.summary as { rows: number; hours: number; tags: number };
    expect(summary.rows).toBe(rows);
    expect(summary.tags).toBe(tagCount);
    // Exactly once: every tag hour once, from this upload alone.
    const res = await db().execute<{ n: number; single: number; others: number }>(sql`
      select count(*)::int as n,
        (select count(*)::int from tag_hour_uploads tu join tags t2 on t2.seq = tu.tag_id where t2.site_id = ${s!.id} and tu.upload_id = ${uploadId}::uuid) as single,
        (select count(*)::int from tag_hour_uploads tu join tags t2 on t2.seq = tu.tag_id where t2.site_id = ${s!.id} and tu.upload_id <> ${uploadId}::uuid) as others
      from tag_hours th join tags t on t.seq = th.tag_id where t.site_id = ${s!.id}`);
    expect(res.rows[0]!.n).toBe(tagCount * 14 * 24);
    expect(res.rows[0]!.single).toBe(tagCount);
    expect(res.rows[0]!.others).toBe(0);
    const { attempts } = at(await db().select({ attempts: uploads.attempts }).from(uploads).where(and(eq(uploads.id, uploadId))), 0, 'the upload row');
    expect(attempts).toBe(2);
  }, 240_000);
});
