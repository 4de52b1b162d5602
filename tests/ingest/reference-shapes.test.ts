import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createFileIngest, mergeHours, sniffLayout, decodeAll } from '~/lib/ingest/index';
import type { Sample, TagHour } from '~/lib/ingest/index';
import { expectClose } from '../support/expect-close';

/** Hour statistics computed with pandas by scripts/ingest-reference.py from the same invented data set. */
interface RefHour {
  hourStart: string;
  mean: number | null;
  min: number | null;
  max: number | null;
  samples: number;
  first: number | null;
  last: number | null;
  coveredFraction: number;
}
const REF = JSON.parse(readFileSync(new URL('../fixtures/ingest-reference.json', import.meta.url), 'utf8')) as {
  timeZone: string;
  shapes: Record<string, Record<string, RefHour[]>>;
};
const bytesOf = (name: string) => new Uint8Array(readFileSync(new URL(`../fixtures/ingest/reference/${name}`, import.meta.url)));

function readShape(name: string, onSample?: (s: Sample) => void): TagHour[] {
  const hours: TagHour[] = [];
  const ingest = createFileIngest({ timeZone: REF.timeZone, onHour: (h) => hours.push(h), onSample });
  const bytes = bytesOf(name);
  for (let o = 0; o < bytes.length; o += 4096) ingest.push(bytes.subarray(o, o + 4096));
  ingest.end();
  return hours;
}

/** Compares the reader's hours of every tag with the reference, hour by hour. */
function compare(hours: TagHour[], ref: Record<string, RefHour[]>, shape: string) {
  for (const [tag, expected] of Object.entries(ref)) {
    const got = hours.filter((h) => h.tag === tag).sort((a, b) => a.hourStartMs - b.hourStartMs);
    expect(got.map((h) => new Date(h.hourStartMs).toISOString()), `${shape} ${tag}: hours`).toEqual(expected.map((e) => e.hourStart));
    got.forEach((h, i) => {
      const e = expected[i]!;
      const label = `pandas reference (scripts/ingest-reference.py), ${shape} ${tag} ${e.hourStart}`;
      expect([h.sampleCount, h.min, h.max, h.first, h.last], label).toEqual([e.samples, e.min, e.max, e.first, e.last]);
      expectClose(h.coveredSeconds / 3600, e.coveredFraction, { rtol: 1e-12, label });
      // one-second brute-force sums in pandas against closed-form trapezoids: rounding only
      if (e.mean === null) expect(h.coveredSeconds).toBe(0);
      else expectClose(h.mean!, e.mean, { rtol: 1e-12, label });
    });
  }
}

describe('every shape of one invented data set reads to the pandas reference, hour by hour', () => {
  it('plain comma file', () => compare(readShape('plain.csv'), REF.shapes['plain.csv']!, 'plain.csv'));

  it('comma file with quoted thousands ("10,954.58")', () => {
    const text = decodeAll(bytesOf('quoted-thousands.csv')).text;
    expect(text).toContain('"10,062.49"');
    compare(readShape('quoted-thousands.csv'), REF.shapes['quoted-thousands.csv']!, 'quoted-thousands.csv');
  });

  it('value and quality pairs: bad codes rejected with their code', () => {
    const profile = sniffLayout(decodeAll(bytesOf('quality-pairs.csv')).text, { complete: true });
    expect(profile.quality?.kind).toBe('pairs');
    compare(readShape('quality-pairs.csv'), REF.shapes['quality-pairs.csv']!, 'quality-pairs.csv');
  });

  it('two overlapping shift files merged sample by sample against the merged truth', () => {
    const a: Sample[] = [];
    const b: Sample[] = [];
    readShape('shift-a.csv', (s) => a.push(s));
    readShape('shift-b.csv', (s) => b.push(s));
    const { hours } = mergeHours(
      [
        { priority: 1, samples: a },
        { priority: 2, samples: b },
      ],
      { timeZone: REF.timeZone },
    );
    compare(hours, REF.shapes['shift-a.csv+shift-b.csv']!, 'shift-a.csv+shift-b.csv');
  });
});
