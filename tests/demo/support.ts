/**
 * Helpers of the demo-plant tests: generate a short period, read it back through the real ingest
 * core (the same sniffing and hourly aggregation the worker uses), and turn hourly means into SI.
 */
import { createFileIngest, type TagHour } from '~/lib/ingest';
import { converterFor } from '~/lib/units';
import { generateExports, type ExportFile, type GenerateOptions } from '../../scripts/demo/generate';
import type { MinuteTruth } from '../../scripts/demo/plant';
import { DEMO_P_ATM_Pa, DEMO_TAGS, DEMO_TIME_ZONE, tagOf } from '../../scripts/demo/site';

export interface Generated {
  files: ExportFile[];
  /** true values of every minute (UTC ms -> truth) */
  truth: Map<number, MinuteTruth>;
}

export function generate(opts: GenerateOptions): Generated {
  const truth = new Map<number, MinuteTruth>();
  const files = [...generateExports(opts, (ms, t) => truth.set(ms, t))];
  return { files, truth };
}

/** Hourly statistics of every tag, read from the files by the ingest core. */
export class Hours {
  readonly byTag = new Map<string, Map<number, TagHour>>();
  constructor(files: readonly ExportFile[]) {
    for (const f of files) {
      const ingest = createFileIngest({
        timeZone: DEMO_TIME_ZONE,
        onHour: (h) => {
          let m = this.byTag.get(h.tag);
          if (!m) this.byTag.set(h.tag, (m = new Map()));
          m.set(h.hourStartMs, h);
        },
      });
      ingest.push(new TextEncoder().encode(f.text));
      const res = ingest.end();
      if (res.profile.questions.some((q) => q.blocking)) throw new Error(`${f.name}: the ingest asks ${JSON.stringify(res.profile.questions)}`);
    }
  }
  /** Hour starts (UTC ms) present for the boiler's steam flow, in order. */
  hourStarts(): number[] {
    return [...(this.byTag.get(tagOf('b1.steam.m').tag)?.keys() ?? [])].sort((a, b) => a - b);
  }
  /** The hour's statistics of a tag key. */
  stat(key: string, hourMs: number): TagHour | undefined {
    return this.byTag.get(tagOf(key).tag)?.get(hourMs);
  }
  /** Hourly mean of a tag key in SI (Pa absolute, K, kg/s, W, mol/s, fraction); NaN when absent. */
  si(key: string, hourMs: number): number {
    const h = this.stat(key, hourMs);
    if (!h || h.mean === null) return NaN;
    return toSI(key, h.mean);
  }
}

/** A reading of a tag key in its export unit, to SI. */
export function toSI(key: string, value: number): number {
  const t = tagOf(key);
  if (t.quantity === 'ratio' || t.quantity === 'speed') return value;
  return converterFor(t.unit, t.quantity, { p_atm_Pa: DEMO_P_ATM_Pa }).toSI(value);
}

/** The export's rows as records of cells by tag name (first three lines are the header). */
export function rows(file: ExportFile): { time: string; cells: Map<string, string> }[] {
  const lines = file.text.split('\r\n').filter((l) => l.length > 0);
  const names = lines[0]!.split(',');
  return lines.slice(3).map((l) => {
    const c = l.split(',');
    return { time: c[0]!, cells: new Map(names.slice(1).map((n, i) => [n, c[i + 1]!])) };
  });
}

/** Mean of the finite numbers. */
export function mean(xs: readonly number[]): number {
  const f = xs.filter(Number.isFinite);
  return f.reduce((a, b) => a + b, 0) / f.length;
}

export const TAG_COUNT = DEMO_TAGS.length;
export const HOUR_ms = 3_600_000;
export const DAY_ms = 86_400_000;
