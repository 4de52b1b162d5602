import { readFileSync } from 'node:fs';
import { createFileIngest, decodeAll, sniffLayout } from '~/lib/ingest/index';
import type { FileIngestOptions, FileIngestResult, LayoutProfile, TagHour } from '~/lib/ingest/index';
import { at } from '../support/present';

export function fixtureBytes(name: string): Uint8Array {
  return new Uint8Array(readFileSync(new URL(`../fixtures/ingest/${name}`, import.meta.url)));
}

export function fixtureText(name: string): string {
  return decodeAll(fixtureBytes(name)).text;
}

export function fixtureProfile(name: string): LayoutProfile {
  return sniffLayout(fixtureText(name), { complete: true });
}

/** UTC epoch ms from an ISO string (written out in tests as the expected instant). */
export const utc = (iso: string): number => Date.parse(iso);

/** Runs the whole pipeline over a fixture, fed in chunks of `chunkBytes`. */
export function ingestFixture(
  name: string,
  options: Omit<FileIngestOptions, 'onHour'> & { chunkBytes?: number },
): { hours: TagHour[]; result: FileIngestResult } {
  const hours: TagHour[] = [];
  const bytes = fixtureBytes(name);
  const ingest = createFileIngest({ ...options, onHour: (h) => hours.push(h) });
  const step = options.chunkBytes ?? bytes.length;
  for (let o = 0; o < bytes.length; o += step) ingest.push(bytes.subarray(o, Math.min(bytes.length, o + step)));
  const result = ingest.end();
  return { hours, result };
}

export function hourOf(hours: TagHour[], tag: string, startIso: string): TagHour {
  const h = hours.find((x) => x.tag === tag && x.hourStartMs === utc(startIso));
  if (!h) throw new Error(`no hour ${startIso} for ${tag}; have ${hours.filter((x) => x.tag === tag).map((x) => new Date(x.hourStartMs).toISOString()).join(', ')}`);
  return h;
}

/**
 * Reference time-weighted statistics of a piecewise-linear (or step) signal over [fromMs, toMs),
 * by brute-force sampling at the midpoints of 1-second steps. Independent of the aggregator's
 * closed-form trapezoid sums.
 */
export function referenceStats(
  points: [number, number][],
  fromMs: number,
  toMs: number,
  mode: 'linear' | 'step',
  maxGapMs = 900_000,
): { mean: number; std: number; coveredSeconds: number } {
  let sum = 0;
  let sum2 = 0;
  let n = 0;
  for (let t = fromMs + 500; t < toMs; t += 1000) {
    let value: number | null = null;
    for (let i = 0; i + 1 < points.length; i++) {
      const [t0, v0] = at(points, i, 'points');
      const [t1, v1] = at(points, i + 1, 'points');
      if (t >= t0 && t < t1 && t1 - t0 <= maxGapMs) {
        value = mode === 'step' ? v0 : v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
        break;
      }
    }
    if (value === null) continue;
    sum += value;
    sum2 += value * value;
    n++;
  }
  const mean = sum / n;
  return { mean, std: Math.sqrt(Math.max(0, sum2 / n - mean * mean)), coveredSeconds: n };
}
