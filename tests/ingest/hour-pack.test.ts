/**
 * Packed tag hours (src/lib/ingest/hour-pack.ts): the reader's thread hands its hours over in one
 * Float64Array per batch. Whatever way an hour is packed (from the aggregator's fields or from an
 * hour object), unpacking must give back the very figures the aggregator's onHour gives, nulls and
 * all, for files that exercise every field: gaps, duplicates, bad quality, status tags, flatlines.
 */
import { describe, expect, it } from 'vitest';
import type { TagHour } from '~/lib/ingest/index';
import { HOUR_FIELDS, NUMBER_FIELDS, createHourPacker, createHourUnpacker, type PackedHours } from '~/lib/ingest/hour-pack';
import { createFileIngest } from '~/lib/ingest/index';
import type { FileIngestOptions } from '~/lib/ingest/index';
import { fixtureBytes, ingestFixture } from './helpers';

/**
 * A generated wide file with what the fixtures lack: an hour of text cells only (no mean), lone
 * samples (the samples' mean), a value frozen for six hours (a flatline) and a bad cell per hour.
 */
function oddFile(): Uint8Array {
  const lines = ['Timestamp,A,B,C'];
  const pad = (n: number) => String(n).padStart(2, '0');
  for (let m = 0; m < 8 * 60; m += 10) {
    const h = Math.floor(m / 60);
    const a = h === 2 ? 'n/a' : String(100 + m / 10);
    const b = '5.5';
    const c = m % 120 === 0 ? String(m) : '';
    lines.push(`2025-03-04 ${pad(h)}:${pad(m % 60)}:00,${a},${b},${c}`);
  }
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

function ingestBytes(bytes: Uint8Array, options: Omit<FileIngestOptions, 'onHour'> & { chunkBytes?: number }) {
  const hours: TagHour[] = [];
  const ingest = createFileIngest({ ...options, onHour: (h) => hours.push(h) });
  const step = options.chunkBytes ?? bytes.length;
  for (let o = 0; o < bytes.length; o += step) ingest.push(bytes.subarray(o, Math.min(bytes.length, o + step)));
  ingest.end();
  return { hours };
}

const KEYS = ['tag', 'meanMethod', 'flatline', ...NUMBER_FIELDS] as const;
const plain = (h: TagHour) => Object.fromEntries(KEYS.map((k) => [k, h[k]]));

const FILES = ['dst-autumn-berlin.csv', 'duplicate-times.csv', 'status-words.csv', 'wide-units.csv', 'long-quality.csv', 'iso-offset.csv', 'ragged.csv'];

function unpackAll(batches: PackedHours[]): TagHour[] {
  const unpack = createHourUnpacker();
  const out: TagHour[] = [];
  for (const b of batches) unpack(b, (h) => out.push(h));
  return out;
}

describe('packed tag hours', () => {
  it('a tag hour has exactly the packed fields (a new field must be packed too)', () => {
    const { hours } = ingestFixture('wide-units.csv', { timeZone: 'UTC' });
    expect(hours.length).toBeGreaterThan(0);
    expect(Object.keys(hours[0]!).sort()).toEqual([...KEYS].sort());
    expect(HOUR_FIELDS).toBe(KEYS.length);
  });

  const cases = [...FILES.map((name) => ({ name, bytes: fixtureBytes(name) })), { name: 'generated odd hours', bytes: oddFile() }];
  const hoursOf = (bytes: Uint8Array, name: string, extra: Partial<FileIngestOptions> & { chunkBytes?: number } = {}) =>
    ingestBytes(bytes, { timeZone: name.includes('berlin') ? 'Europe/Berlin' : 'UTC', maxRejectedShare: 1, ...extra }).hours;

  for (const { name, bytes } of cases) {
    it(`${name}: the aggregator's packed fields unpack to the hours onHour gives`, () => {
      const hours = hoursOf(bytes, name);
      expect(hours.length).toBeGreaterThan(0);
      // Small batches, so names are spread over several batches.
      const fromFields: PackedHours[] = [];
      const packer = createHourPacker(7, (b) => fromFields.push(b));
      hoursOf(bytes, name, { onHourFields: packer.pushFields, chunkBytes: 97 });
      packer.flush();
      expect(unpackAll(fromFields).map(plain)).toEqual(hours.map(plain));
      // And packed from the hour objects themselves.
      const fromObjects: PackedHours[] = [];
      const again = createHourPacker(5, (b) => fromObjects.push(b));
      for (const h of hours) again.push(h);
      again.flush();
      expect(unpackAll(fromObjects).map(plain)).toEqual(hours.map(plain));
    });
  }

  it('the fixtures cover nulls, both mean methods, flatlines and every counter', () => {
    const all = cases.flatMap(({ name, bytes }) => hoursOf(bytes, name));
    expect(all.some((h) => h.mean === null && h.first === null)).toBe(true);
    expect(all.some((h) => h.meanMethod === 'time-weighted')).toBe(true);
    expect(all.some((h) => h.meanMethod === 'samples')).toBe(true);
    expect(all.some((h) => h.flatline)).toBe(true);
    for (const k of ['duplicateCount', 'nonNumericCount', 'badQualityCount'] as const) expect(all.some((h) => h[k] > 0), k).toBe(true);
  });

  it('a batch names only the tags it brings first; a full batch is handed over at once', () => {
    const batches: PackedHours[] = [];
    const packer = createHourPacker(2, (b) => batches.push(b));
    const { hours } = ingestFixture('wide-units.csv', { timeZone: 'UTC' });
    for (const h of hours.slice(0, 5)) packer.push(h);
    expect(batches.map((b) => b.count)).toEqual([2, 2]);
    packer.flush();
    expect(batches.map((b) => b.count)).toEqual([2, 2, 1]);
    const named = batches.flatMap((b) => b.names);
    expect(named).toEqual([...new Set(hours.slice(0, 5).map((h) => h.tag))]);
  });
});
