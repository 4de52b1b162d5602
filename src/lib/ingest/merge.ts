/**
 * Re-aggregation from samples, for overlapping uploads (src/server/services/ingest-merge.ts).
 *
 * When a new file brings hours that are already stored, the server re-reads the samples of those
 * hours (and of their neighbourhood) from the raw files in the store and recomputes the hours from
 * the union of the samples of every file: samples are pooled by time, and where two files hold a
 * sample of the same tag at the same instant, the higher priority (the newer upload) wins. A source
 * may also declare an explicit span: inside it, lower-priority samples are dropped even where it has
 * none (a file that says "this is the whole truth for this time"). Feed the samples of the hours to
 * recompute plus the neighbouring samples just outside them (so segments across the hour boundaries
 * are drawn), and keep only the hours asked for.
 */
import { IngestError } from './errors';
import { createHourAggregator } from './aggregate';
import type { TagHour, TagOptions } from './aggregate';
import { CellStatus } from './reader';
import type { SampleSink } from './reader';
import { classifyQuality, QualityClass } from './quality';
import { HOUR_MS } from '../time';

/** One stored sample. value null = not a number (raw holds the text) or blank (no raw); a bad
 *  quality makes the sample rejected whatever its value. */
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
  /** Higher wins at the same instant (for example the upload's sequence number). */
  priority: number;
  /** An explicit span [UTC ms] inside which lower-priority samples are dropped; default: none (only
   *  samples at the same instant are replaced). */
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

/** Bad quality first (whatever the value), then no number (text if raw is given, else blank). */
function statusOf(s: Sample): number {
  const q = s.quality === undefined ? QualityClass.Good : classifyQuality(s.quality);
  if (q === QualityClass.Bad) return CellStatus.BadQuality;
  if (s.value === null || !Number.isFinite(s.value)) return s.raw && s.raw.trim().length > 0 ? CellStatus.Text : CellStatus.Blank;
  return q === QualityClass.Good ? CellStatus.Ok : CellStatus.Uncertain;
}

/**
 * Aggregates samples from one or several sources into tag hours (sorted by tag, then hour).
 * Pass a plain sample array for a single source. Each source's samples are taken in the order
 * given (the order they were read), so stored samples re-aggregate to the hours of the first pass.
 */
export function aggregateSamples(input: readonly Sample[] | readonly SampleSource[], options: AggregateSamplesOptions): TagHour[] {
  const sources: SampleSource[] =
    input.length > 0 && 'samples' in (input[0] as object) ? [...(input as readonly SampleSource[])] : [{ priority: 0, samples: input as readonly Sample[] }];
  sources.sort((a, b) => b.priority - a.priority);
  const byTag = keptSamples(sources).byTag;
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
    const lists = byTag.get(tag)!;
    const k = agg.tagIndex(tag);
    // merge the sources by time, keeping each source's own order: a sample stored earlier than the
    // one before it stays out of order and is dropped and counted, as in the streaming pass
    const cursors = lists.map((list) => ({ list, next: 0 }));
    for (;;) {
      // the earliest next sample; on a tie the source met first (highest priority)
      let best: { list: Sample[]; next: number } | undefined;
      let s: Sample | undefined;
      for (const c of cursors) {
        const head = c.list[c.next];
        if (head !== undefined && (s === undefined || head.timeMs < s.timeMs)) {
          best = c;
          s = head;
        }
      }
      if (best === undefined || s === undefined) break;
      best.next++;
      const st = statusOf(s);
      agg.addSample(k, s.timeMs, st === CellStatus.Ok || st === CellStatus.Uncertain ? (s.value as number) : NaN, st);
    }
  }
  agg.flush();
  return out;
}

/** A sample with a number the statistics can use (not rejected, not of bad quality). */
function usable(s: Sample): boolean {
  return s.value !== null && Number.isFinite(s.value) && (s.quality === undefined || classifyQuality(s.quality) !== QualityClass.Bad);
}

/**
 * Per tag and source (highest priority first): the samples kept, in the order given. At one instant
 * of one tag, the source that wins is the highest-priority one with a usable value there (a newer
 * file's rejected cell does not erase an older reading), else the highest-priority one; the other
 * sources' samples at that instant are dropped. A sample inside a higher-priority source's explicit
 * span is dropped too.
 */
export function keptSamples(sources: readonly SampleSource[]): { byTag: Map<string, Sample[][]>; priorities: Map<string, number[]> } {
  const ordered = [...sources].sort((a, b) => b.priority - a.priority);
  const perSource = ordered.map((src) => {
    const perTag = new Map<string, Sample[]>();
    for (const s of src.samples) {
      let list = perTag.get(s.tag);
      if (!list) perTag.set(s.tag, (list = []));
      list.push(s);
    }
    return perTag;
  });
  const usableTimes = perSource.map((perTag) => {
    const m = new Map<string, Set<number>>();
    for (const [tag, list] of perTag) m.set(tag, new Set(list.filter(usable).map((x) => x.timeMs)));
    return m;
  });
  // winner per tag and instant: index into `ordered`
  const winner = new Map<string, Map<number, number>>();
  for (let i = 0; i < ordered.length; i++) {
    for (const [tag, list] of perSource[i]!) {
      let w = winner.get(tag);
      if (!w) winner.set(tag, (w = new Map()));
      for (const s of list) {
        const cur = w.get(s.timeMs);
        if (cur === undefined) w.set(s.timeMs, i);
        else if (cur !== i && usable(s) && !usableTimes[cur]!.get(tag)!.has(s.timeMs)) w.set(s.timeMs, i);
      }
    }
  }
  const byTag = new Map<string, Sample[][]>();
  const priorities = new Map<string, number[]>();
  const spansByTag = new Map<string, [number, number][]>();
  for (let i = 0; i < ordered.length; i++) {
    const src = ordered[i]!;
    for (const [tag, list] of perSource[i]!) {
      const spans = spansByTag.get(tag) ?? [];
      const w = winner.get(tag)!;
      const kept = list.filter((s) => w.get(s.timeMs) === i && !spans.some(([a, b]) => s.timeMs >= a && s.timeMs <= b));
      if (src.spanStartMs !== undefined && src.spanEndMs !== undefined) spans.push([src.spanStartMs, src.spanEndMs]);
      spansByTag.set(tag, spans);
      byTag.set(tag, [...(byTag.get(tag) ?? []), kept]);
      priorities.set(tag, [...(priorities.get(tag) ?? []), src.priority]);
    }
  }
  return { byTag, priorities };
}

/**
 * A sink that turns what the reader reads into Sample objects (for a server that stores raw samples
 * per upload). Blank cells give no sample; rejected cells give value null with their text as raw
 * when `cellText` is given (pass the reader's cellText), else '?'; uncertain and bad values carry
 * quality 'uncertain' / 'bad'. One object per sample: use it for storage, not in the hot path.
 */
export function createSampleEmitter(onSample: (sample: Sample) => void, options: { cellText?: (k: number) => string } = {}): SampleSink {
  const tags: string[] = [];
  const emit = (k: number, timeMs: number, value: number, status: number) => {
    if (status === CellStatus.Blank) return;
    const tag = tags[k];
    if (tag === undefined) throw new IngestError('READER_FAULT', `A sample of tag ${k} came before the tag was announced.`);
    if (status === CellStatus.Text || status === CellStatus.BadQuality) {
      const raw = options.cellText ? options.cellText(k).trim() : '?';
      if (status === CellStatus.Text) onSample({ tag, timeMs, value: null, raw });
      else onSample({ tag, timeMs, value: Number.isFinite(value) ? value : null, raw, quality: 'bad' });
      return;
    }
    onSample(status === CellStatus.Uncertain ? { tag, timeMs, value, quality: 'uncertain' } : { tag, timeMs, value });
  };
  return {
    addTag(k, tag) {
      tags[k] = tag;
    },
    addRow(timeMs, values, status) {
      // a value without a status gives no sample, as a blank cell
      values.forEach((v, k) => emit(k, timeMs, v, status[k] ?? CellStatus.Blank));
    },
    addSample: emit,
  };
}

/** Feeds every call to several sinks (for example the aggregator and a sample store). */
export function teeSinks(...sinks: SampleSink[]): SampleSink {
  return {
    addTag(k, tag) {
      for (const s of sinks) s.addTag(k, tag);
    },
    addRow(timeMs, values, status) {
      for (const s of sinks) s.addRow(timeMs, values, status);
    },
    addSample(k, timeMs, value, status) {
      for (const s of sinks) s.addSample(k, timeMs, value, status);
    },
  };
}

/** Key of one tag hour in mergeHours' answers. */
export const tagHourKey = (tag: string, hourStartMs: number) => `${tag}\u0000${hourStartMs}`;

/**
 * The hours of several sources merged sample by sample (see keptSamples), with, per hour, the
 * priorities of the sources that still have a sample inside it [hourStartMs, hourStartMs + 1 h):
 * the history of what each file contributed. `wanted` limits the answer to some tag hours.
 */
export function mergeHours(
  sources: readonly SampleSource[],
  options: AggregateSamplesOptions & { wanted?: ReadonlySet<string> },
): { hours: TagHour[]; contributors: Map<string, number[]> } {
  const all = aggregateSamples(sources as SampleSource[], options);
  const hours = options.wanted ? all.filter((h) => options.wanted!.has(tagHourKey(h.tag, h.hourStartMs))) : all;
  const { byTag, priorities } = keptSamples(sources);
  const contributors = new Map<string, number[]>();
  for (const h of hours) {
    const lists = byTag.get(h.tag) ?? [];
    const prio = priorities.get(h.tag) ?? [];
    const end = h.hourStartMs + HOUR_MS;
    contributors.set(
      tagHourKey(h.tag, h.hourStartMs),
      prio.filter((_, i) => lists[i]!.some((s) => s.timeMs >= h.hourStartMs && s.timeMs < end)),
    );
  }
  return { hours, contributors };
}
