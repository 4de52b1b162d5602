/**
 * Tag hours in PostgreSQL's binary COPY format (the "Binary Format" of the COPY reference page).
 *
 * Why binary rather than text: the text form made the worker print seven float4 and one timestamp
 * per row as text (shortest round-trip digits, then a string to bytes) and made PostgreSQL parse them
 * back; in binary the worker writes the bits straight into one buffer per batch and the server copies
 * them. Measured in bench:ingest (README, "Ingest speed").
 *
 * The values keep the text path's meaning: a value that is not finite is stored as NULL; a finite
 * value outside float4's range (or so small that it would round to zero) is refused with SQLSTATE
 * 22003, as PostgreSQL refuses the text "1e+39" for a real, so the upload fails with the same
 * catalogued message (asFileError in ingest-failure.ts).
 */
import type { TagHour } from '~/lib/ingest';
import { readerFlags } from './ingest-merge';

/** The columns, in the order written. */
export const TAG_HOUR_COPY_COLUMNS =
  'hour_start, tag_id, samples, mean, min, max, std, first, last, covered_s, non_numeric, out_of_range, flags';
const FIELDS = 13;
/** Bytes of one row at most: field count, 13 lengths, 8 + 2 x 4 + 6 x 4 + 4 x 2 bytes of data. */
const ROW_BYTES = 2 + FIELDS * 4 + 8 + 8 + 24 + 8;
const SIGNATURE = Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1');
/** PostgreSQL's epoch, 2000-01-01 UTC [ms]. */
const PG_EPOCH_MS = Date.UTC(2000, 0, 1);
const TWO_32 = 4_294_967_296;
const FLOAT4_MAX = 3.4028234663852886e38;

/** Counts are smallint in tag hours (32767 and more is "very many"). */
export const count16 = (n: number) => Math.min(32767, n);

class OutOfRange extends Error {
  readonly code = '22003';
}

/** The float4 bits of a value, or null for NULL (not finite); refuses what float4 cannot hold. */
function float4(v: number | null): number | null {
  if (v === null || !Number.isFinite(v)) return null;
  const f = Math.fround(v);
  if (Math.abs(v) > FLOAT4_MAX || (v !== 0 && f === 0)) throw new OutOfRange(`"${v}" is out of range for type real`);
  return f;
}

/** The header of a binary COPY stream: signature, flags, header extension length. */
export const COPY_HEADER = Buffer.concat([SIGNATURE, Buffer.alloc(8)]);
/** The trailer of a binary COPY stream (a field count of -1). */
export const COPY_TRAILER = Buffer.from([0xff, 0xff]);

/** The rows of one batch in binary COPY format, sorted by the primary key's order (no header or trailer). */
export function encodeTagHourRows(rows: TagHour[], tagSeq: (h: TagHour) => number): Buffer {
  // Sorted by (tag, hour): each tag's index entries go in as one run (an order of row numbers, so
  // no object is made per row).
  const n = rows.length;
  const ids = new Int32Array(n);
  const starts = new Float64Array(n);
  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    ids[i] = tagSeq(rows[i]!);
    starts[i] = rows[i]!.hourStartMs;
    order[i] = i;
  }
  order.sort((a, b) => ids[a]! - ids[b]! || starts[a]! - starts[b]!);
  const buf = Buffer.allocUnsafe(n * ROW_BYTES);
  let o = 0;
  const int4 = (v: number | null) => {
    if (v === null) return (o = buf.writeInt32BE(-1, o));
    o = buf.writeInt32BE(4, o);
    return (o = buf.writeInt32BE(v, o));
  };
  const real = (v: number | null) => {
    const f = float4(v);
    if (f === null) return (o = buf.writeInt32BE(-1, o));
    o = buf.writeInt32BE(4, o);
    return (o = buf.writeFloatBE(f, o));
  };
  const int2 = (v: number) => {
    o = buf.writeInt32BE(2, o);
    return (o = buf.writeInt16BE(v, o));
  };
  for (let k = 0; k < n; k++) {
    const i = order[k]!;
    const h = rows[i]!;
    const id = ids[i]!;
    o = buf.writeInt16BE(FIELDS, o);
    const us = (starts[i]! - PG_EPOCH_MS) * 1000; // exact below 2^53 (until the year 287000)
    const hi = Math.floor(us / TWO_32);
    o = buf.writeInt32BE(8, o);
    o = buf.writeInt32BE(hi, o);
    o = buf.writeUInt32BE(us - hi * TWO_32, o);
    int4(id);
    int4(h.sampleCount);
    real(h.mean);
    real(h.min);
    real(h.max);
    real(h.stdDev);
    real(h.first);
    real(h.last);
    int2(Math.round(h.coveredSeconds));
    int2(count16(h.nonNumericCount + h.badQualityCount));
    int2(count16(h.outOfRangeCount));
    int2(readerFlags(h));
  }
  return buf.subarray(0, o);
}
