/**
 * Tag hours packed into one Float64Array, to pass a batch between threads without cloning an
 * object per hour (the read's parse runs in a thread of its own: src/server/services/ingest-thread.ts).
 * Each hour takes HOUR_FIELDS doubles; null is NaN (no field of a tag hour is NaN otherwise: the
 * figures come from finite samples), the mean's method and the flatline flag are small codes, and the
 * tag is an index into a list of names that grows with the batches (`names`: the new names of this
 * batch only). Unpacking gives back equal objects (tests/ingest/hour-pack.test.ts).
 */
import type { TagHour } from './aggregate-types';

const METHODS: readonly TagHour['meanMethod'][] = ['time-weighted', 'samples', 'none'];

/** The numeric fields of a tag hour, in their packed order after the tag, the mean's method and the flatline flag. */
export const NUMBER_FIELDS = [
  'hourStartMs',
  'hourEndMs',
  'utcOffsetMinutes',
  'mean',
  'stdDev',
  'min',
  'max',
  'first',
  'firstMs',
  'last',
  'lastMs',
  'sampleCount',
  'coveredSeconds',
  'coveredFraction',
  'nonNumericCount',
  'badQualityCount',
  'outOfRangeCount',
  'uncertainCount',
  'duplicateCount',
  'outOfOrderCount',
  'maxUnchangedSeconds',
] as const satisfies readonly (keyof TagHour)[];

/** Doubles per packed hour: tag index, mean method, flatline, then NUMBER_FIELDS. */
export const HOUR_FIELDS = 3 + NUMBER_FIELDS.length;

/** Where each field sits in a packed hour (the aggregator writes them so: aggregate.ts). */
export const SLOT = {
  tag: 0,
  meanMethod: 1,
  flatline: 2,
  ...(Object.fromEntries(NUMBER_FIELDS.map((k, i) => [k, 3 + i])) as Record<(typeof NUMBER_FIELDS)[number], number>),
} as const;

/** The code of a mean's method in a packed hour. */
export const methodCode = (m: TagHour['meanMethod']) => METHODS.indexOf(m);

/** A batch of packed hours: `names` are the tag names first seen in this batch, in index order. */
export interface PackedHours {
  names: string[];
  count: number;
  data: Float64Array;
}

/** Packs hours one at a time into batches of `size`; `full` receives each full batch. */
export function createHourPacker(size: number, full: (batch: PackedHours) => void) {
  const index = new Map<string, number>();
  let names: string[] = [];
  let data = new Float64Array(size * HOUR_FIELDS);
  let count = 0;
  const flush = () => {
    if (count === 0 && names.length === 0) return;
    full({ names, count, data: count === size ? data : data.slice(0, count * HOUR_FIELDS) });
    names = [];
    data = new Float64Array(size * HOUR_FIELDS);
    count = 0;
  };
  const indexOf = (tag: string) => {
    let k = index.get(tag);
    if (k === undefined) {
      k = index.size;
      index.set(tag, k);
      names.push(tag);
    }
    return k;
  };
  /** An hour the aggregator wrote into `fields` (SLOT's layout; its tag slot is filled here). */
  const pushFields = (tag: string, fields: Float64Array) => {
    const o = count * HOUR_FIELDS;
    data.set(fields, o);
    data[o] = indexOf(tag);
    if (++count === size) flush();
  };
  const push = (h: TagHour) => {
    const k = indexOf(h.tag);
    const o = count * HOUR_FIELDS;
    data[o + SLOT.tag] = k;
    data[o + SLOT.meanMethod] = methodCode(h.meanMethod);
    data[o + SLOT.flatline] = h.flatline ? 1 : 0;
    for (const f of NUMBER_FIELDS) data[o + SLOT[f]] = h[f] ?? NaN;
    if (++count === size) flush();
  };
  return { push, pushFields, flush };
}

/**
 * One packed tag hour seen as a TagHour: its fields are read from the batch's array when asked, so
 * a batch of 5,000 hours costs 5,000 small objects instead of 5,000 objects of 24 fields (most of
 * them boxed numbers).
 */
class PackedHour implements TagHour {
  constructor(
    private readonly d: Float64Array,
    private readonly o: number,
    readonly tag: string,
  ) {}
  private n(i: number): number {
    return this.d[this.o + i]!;
  }
  private orNull(i: number): number | null {
    const v = this.d[this.o + i]!;
    return v === v ? v : null;
  }
  get meanMethod(): TagHour['meanMethod'] {
    return METHODS[this.n(SLOT.meanMethod)]!;
  }
  get flatline(): boolean {
    return this.n(SLOT.flatline) === 1;
  }
  get hourStartMs() {
    return this.n(SLOT.hourStartMs);
  }
  get hourEndMs() {
    return this.n(SLOT.hourEndMs);
  }
  get utcOffsetMinutes() {
    return this.n(SLOT.utcOffsetMinutes);
  }
  get mean() {
    return this.orNull(SLOT.mean);
  }
  get stdDev() {
    return this.orNull(SLOT.stdDev);
  }
  get min() {
    return this.orNull(SLOT.min);
  }
  get max() {
    return this.orNull(SLOT.max);
  }
  get first() {
    return this.orNull(SLOT.first);
  }
  get firstMs() {
    return this.orNull(SLOT.firstMs);
  }
  get last() {
    return this.orNull(SLOT.last);
  }
  get lastMs() {
    return this.orNull(SLOT.lastMs);
  }
  get sampleCount() {
    return this.n(SLOT.sampleCount);
  }
  get coveredSeconds() {
    return this.n(SLOT.coveredSeconds);
  }
  get coveredFraction() {
    return this.n(SLOT.coveredFraction);
  }
  get nonNumericCount() {
    return this.n(SLOT.nonNumericCount);
  }
  get badQualityCount() {
    return this.n(SLOT.badQualityCount);
  }
  get outOfRangeCount() {
    return this.n(SLOT.outOfRangeCount);
  }
  get uncertainCount() {
    return this.n(SLOT.uncertainCount);
  }
  get duplicateCount() {
    return this.n(SLOT.duplicateCount);
  }
  get outOfOrderCount() {
    return this.n(SLOT.outOfOrderCount);
  }
  get maxUnchangedSeconds() {
    return this.n(SLOT.maxUnchangedSeconds);
  }
}

/**
 * Unpacks batches in the order they were packed (the names of a batch extend the list of the ones
 * before). The hours handed out read the batch's array: they are views, valid as long as it is kept.
 */
export function createHourUnpacker() {
  const names: string[] = [];
  return (batch: PackedHours, onHour: (h: TagHour) => void) => {
    names.push(...batch.names);
    const d = batch.data;
    for (let i = 0, o = 0; i < batch.count; i++, o += HOUR_FIELDS) onHour(new PackedHour(d, o, names[d[o + SLOT.tag]!]!));
  };
}
