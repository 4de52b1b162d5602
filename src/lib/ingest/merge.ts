/**
 * Re-aggregation from stored samples, for overlapping uploads.
 *
 * Design: the server keeps the raw samples of every upload (per tag, with the upload as source).
 * When a new file covers hours that are already aggregated, it recomputes those hours from the union
 * of the samples of all uploads covering them, the newer upload winning where spans overlap: inside
 * the time span a higher-priority source covers, samples of lower-priority sources are dropped. Feed
 * the samples of the hours to recompute plus the neighbouring samples just outside them (so segments
 * across the hour boundaries are drawn), and keep only the hours asked for.
 */
import { createHourAggregator } from './aggregate';
import type { TagHour, TagOptions } from './aggregate';
import { CellStatus } from './reader';
import { classifyQuality, QualityClass } from './quality';

/** One stored sample. value null = not a number (raw holds the text) or blank (no raw). */
export interface Sample {
  tag: string;
  /** UTC epoch ms. */
  timeMs: number;
  value: number | null;
  raw?: string;
  /** Quality as read ('good', 'bad', 'uncertain' or the export's code). */
  quality?: string;
}

export interface SampleSource {
  /** Higher wins (for example the upload's sequence number). */
  priority: number;
  /** The time span this source covers [UTC ms]; default: from its first to its last sample, per tag. */
  spanStartMs?: number;
  spanEndMs?: number;
  samples: readonly Sample[];
}

export interface AggregateSamplesOptions {
  timeZone: string;
  tagOptions?: (tag: string) => Partial<TagOptions>;
  maxGapSeconds?: number;
  /** Keep only hours starting at or after this instant [UTC ms]. */
  fromMs?: number;
  /** Keep only hours starting before this instant [UTC ms]. */
  toMs?: number;
}

function statusOf(s: Sample): number {
  if (s.value === null || !Number.isFinite(s.value)) return s.raw && s.raw.trim().length > 0 ? CellStatus.Text : CellStatus.Blank;
  if (s.quality === undefined) return CellStatus.Ok;
  const q = classifyQuality(s.quality);
  return q === QualityClass.Bad ? CellStatus.BadQuality : q === QualityClass.Good ? CellStatus.Ok : CellStatus.Uncertain;
}

/**
 * Aggregates samples from one or several sources into tag hours (sorted by tag, then hour).
 * Pass a plain sample array for a single source.
 */
export function aggregateSamples(input: readonly Sample[] | readonly SampleSource[], options: AggregateSamplesOptions): TagHour[] {
  const sources: SampleSource[] =
    input.length > 0 && 'samples' in (input[0] as object) ? [...(input as readonly SampleSource[])] : [{ priority: 0, samples: input as readonly Sample[] }];
  sources.sort((a, b) => b.priority - a.priority);
  // per tag: kept samples from all sources
  const byTag = new Map<string, { s: Sample; priority: number }[]>();
  const spansByTag = new Map<string, [number, number][]>();
  for (const src of sources) {
    const perTag = new Map<string, Sample[]>();
    for (const s of src.samples) {
      let list = perTag.get(s.tag);
      if (!list) perTag.set(s.tag, (list = []));
      list.push(s);
    }
    for (const [tag, list] of perTag) {
      const higher = spansByTag.get(tag) ?? [];
      let kept = byTag.get(tag);
      if (!kept) byTag.set(tag, (kept = []));
      let lo = Infinity;
      let hi = -Infinity;
      for (const s of list) {
        if (s.timeMs < lo) lo = s.timeMs;
        if (s.timeMs > hi) hi = s.timeMs;
        if (higher.some(([a, b]) => s.timeMs >= a && s.timeMs <= b)) continue;
        kept.push({ s, priority: src.priority });
      }
      higher.push([src.spanStartMs ?? lo, src.spanEndMs ?? hi]);
      spansByTag.set(tag, higher);
    }
  }
  const out: TagHour[] = [];
  const agg = createHourAggregator({
    timeZone: options.timeZone,
    tagOptions: options.tagOptions,
    maxGapSeconds: options.maxGapSeconds,
    onHour: (h) => {
      if (options.fromMs !== undefined && h.hourStartMs < options.fromMs) return;
      if (options.toMs !== undefined && h.hourStartMs >= options.toMs) return;
      out.push(h);
    },
  });
  for (const tag of [...byTag.keys()].sort()) {
    const list = byTag.get(tag)!;
    // time order; within one source keep the given order (stable sort) so the later duplicate wins
    list.sort((a, b) => a.s.timeMs - b.s.timeMs);
    const k = agg.tagIndex(tag);
    for (const { s } of list) {
      const st = statusOf(s);
      agg.addSample(k, s.timeMs, st === CellStatus.Ok || st === CellStatus.Uncertain ? (s.value as number) : NaN, st);
    }
  }
  agg.flush();
  return out;
}
