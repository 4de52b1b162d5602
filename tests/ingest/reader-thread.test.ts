/**
 * The reader's thread (src/server/services/ingest-thread.ts and ingest-thread-pool.ts): a file read
 * on it must give the writer exactly what the same read on the calling thread gives (hours, rejected
 * cells, report), with the site's options rebuilt from plain data; a problem of the file comes back
 * as the same catalogued error; a writer that refuses a batch ends the read without losing the
 * thread for the next one.
 */
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { createFileIngest, IngestError, sniffLayout, type RejectedCell, type TagHour } from '~/lib/ingest/index';
import { NUMBER_FIELDS, createHourUnpacker } from '~/lib/ingest/hour-pack';
import { readOptionsOf, type SiteReadFacts } from '~/server/services/ingest-options';
import { startThreadRead, stopReaderThreads } from '~/server/services/ingest-thread-pool';
import { fixtureBytes } from './helpers';

const KEYS = ['tag', 'meanMethod', 'flatline', ...NUMBER_FIELDS] as const;
const plain = (h: TagHour) => Object.fromEntries(KEYS.map((k) => [k, h[k]]));

/** Two days of one-minute rows: an analog tag with a valid range, a status tag, text and blanks. */
function generated(): Uint8Array {
  const lines = ['Timestamp,FT-101,XV-7,TT-3'];
  const start = Date.UTC(2025, 8, 1);
  for (let i = 0; i < 2 * 1440; i++) {
    const t = new Date(start + i * 60_000).toISOString().slice(0, 19).replace('T', ' ');
    const ft = i % 97 === 0 ? 'Bad' : (50 + 10 * Math.sin(i / 30)).toFixed(2);
    const xv = Math.floor(i / 180) % 2;
    const tt = i % 13 === 0 ? '' : (400 + (i % 60) * 2.5).toFixed(1);
    lines.push(`${t},${ft},${xv},${tt}`);
  }
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

const facts: SiteReadFacts = {
  timeZone: 'Europe/Berlin',
  timeWindow: { minMs: Date.UTC(2000, 0, 1), maxMs: Date.UTC(2030, 0, 1) },
  goodQualityCodes: ['192'],
  tags: [
    { name: 'FT-101', kind: 'analog', flatlineLimitSeconds: 3600, validMin: 42, validMax: 58, unitHint: 't/h' },
    { name: 'XV-7', kind: 'status', flatlineLimitSeconds: 14_400, validMin: null, validMax: null, unitHint: null },
  ],
  links: [],
};

function readHere(bytes: Uint8Array) {
  const hours: TagHour[] = [];
  const rejects: RejectedCell[] = [];
  const profile = sniffLayout(new TextDecoder().decode(bytes.subarray(0, 65536)), { complete: bytes.length <= 65536 });
  const ingest = createFileIngest({ ...readOptionsOf(facts), profile, onHour: (h) => hours.push(h), onRejectedCell: (c) => rejects.push(c) });
  for (let o = 0; o < bytes.length; o += 65536) ingest.push(bytes.subarray(o, o + 65536));
  const { report, encoding } = ingest.end();
  return { hours, rejects, report, encoding: encoding.encoding, profile };
}

async function readOnThread(bytes: Uint8Array, chunk = 4096, refuseAt = Infinity) {
  const hours: TagHour[] = [];
  const rejects: RejectedCell[] = [];
  const unpack = createHourUnpacker();
  const profile = sniffLayout(new TextDecoder().decode(bytes.subarray(0, 65536)), { complete: bytes.length <= 65536 });
  const read = await startThreadRead(facts, profile, {
    onHours: (batch) => {
      if (hours.length >= refuseAt) throw new Error('the writer refused the batch');
      unpack(batch, (h) => hours.push(h));
    },
    onRejects: (cells) => rejects.push(...cells),
  });
  if (!read) throw new Error('no reader thread');
  try {
    for (let o = 0; o < bytes.length; o += chunk) await read.push(bytes.subarray(o, o + chunk));
    const { report, encoding } = await read.end();
    return { hours, rejects, report, encoding };
  } finally {
    read.drop();
  }
}

describe('the reader thread', () => {
  afterEach(() => {
    delete process.env.INGEST_READ_THREADS;
  });
  afterAll(() => stopReaderThreads());

  it('gives the same hours, rejected cells and report as a read on the calling thread', async () => {
    const bytes = generated();
    const here = readHere(bytes);
    const there = await readOnThread(bytes);
    expect(here.hours.length).toBeGreaterThan(100);
    expect(here.rejects.length).toBeGreaterThan(10);
    expect(here.hours.some((h) => h.outOfRangeCount > 0)).toBe(true);
    expect(there.hours.map(plain)).toEqual(here.hours.map(plain));
    expect(there.rejects).toEqual(here.rejects);
    expect(there.report).toEqual(here.report);
    expect(there.encoding).toBe(here.encoding);
  }, 60_000);

  it('a problem of the file comes back as the catalogued error, and the thread reads the next file', async () => {
    const err = await readOnThread(fixtureBytes('header-only.csv')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(IngestError);
    expect((err as IngestError).code).toBe('HEADER_ONLY');
    const again = await readOnThread(generated());
    expect(again.hours.length).toBe(readHere(generated()).hours.length);
  }, 60_000);

  it('a writer that refuses a batch ends the read with its error; the thread serves the next read', async () => {
    const err = await readOnThread(generated(), 4096, 0).catch((e: unknown) => e);
    expect((err as Error).message).toBe('the writer refused the batch');
    const again = await readOnThread(generated());
    expect(again.hours.map(plain)).toEqual(readHere(generated()).hours.map(plain));
  }, 60_000);

  it('INGEST_READ_THREADS=0 gives no thread: the caller reads on its own', async () => {
    process.env.INGEST_READ_THREADS = '0';
    const profile = sniffLayout('Timestamp,A\n2025-01-01 00:00:00,1\n', { complete: true });
    expect(await startThreadRead(facts, profile, { onHours: () => undefined, onRejects: () => undefined })).toBeNull();
  });
});
