/**
 * What the hour aggregator (aggregate.ts) is given and what it emits: per-tag options, the
 * aggregator's options and interface, and one tag hour.
 */
import type { SampleSink } from './reader-types';
import { HOUR_S } from '../time';

/** The frozen-value (flatline) limit of a tag with none of its own [s]: 4 h. Common practice (docs/domain.md section 6). */
export const DEFAULT_FLATLINE_LIMIT_s = 4 * HOUR_S;

export interface TagOptions {
  kind: 'analog' | 'status';
  /** Longest run of an unchanged value before the hour is flagged [s]; Infinity disables. */
  flatlineLimitSeconds: number;
  /** Values below are rejected as out of range (engineering unit of the tag). */
  validMin?: number;
  /** Values above are rejected as out of range (engineering unit of the tag). */
  validMax?: number;
  /** Longest gap bridged between samples [s]; default from the aggregator options. */
  maxGapSeconds?: number;
}

export interface HourAggregatorOptions {
  /** The site's IANA time zone: hours are its local clock hours. */
  timeZone: string;
  /** Per-tag settings; default analog, flatline limit 4 h, no range. */
  tagOptions?: (tag: string) => Partial<TagOptions>;
  /** Longest gap bridged between samples [s]; default 900. */
  maxGapSeconds?: number;
  /** Receives each finished tag hour. */
  onHour: (hour: TagHour) => void;
  /**
   * Instead of onHour: each finished hour written into `fields` in the packed layout of
   * hour-pack.ts (SLOT), the tag slot left to the receiver. No object is made per hour (the
   * reader's thread packs hours this way); `fields` is reused for the next hour.
   */
  onHourFields?: (tag: string, fields: Float64Array) => void;
}

export interface TagHour {
  tag: string;
  /** UTC ms where the local clock hour starts. */
  hourStartMs: number;
  /** UTC ms where it ends. */
  hourEndMs: number;
  /** The site's UTC offset during the hour [minutes] (tells the two repeated autumn hours apart). */
  utcOffsetMinutes: number;
  mean: number | null;
  meanMethod: 'time-weighted' | 'samples' | 'none';
  stdDev: number | null;
  min: number | null;
  max: number | null;
  first: number | null;
  firstMs: number | null;
  last: number | null;
  lastMs: number | null;
  /** Usable samples inside the hour. */
  sampleCount: number;
  coveredSeconds: number;
  /** coveredSeconds / hour length [-]. */
  coveredFraction: number;
  nonNumericCount: number;
  badQualityCount: number;
  outOfRangeCount: number;
  uncertainCount: number;
  duplicateCount: number;
  outOfOrderCount: number;
  maxUnchangedSeconds: number;
  flatline: boolean;
}

export interface HourAggregator extends SampleSink {
  /** Index of a tag, announcing it when new (for callers that feed samples by name). */
  tagIndex(tag: string): number;
  /** Closes every open hour and emits it. The aggregator can be fed on afterwards. */
  flush(): void;
}
