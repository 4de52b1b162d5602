/**
 * Speed of the ingest core on a wide export: 200 tags, one row per minute, 30 days
 * (43 200 rows, 8.64 million values). The CSV is generated in memory first (not timed), as UTF-8
 * byte chunks of 64 KiB, then decoded, sniffed, parsed and aggregated into local clock hours.
 *
 *   node --expose-gc --import tsx bench/ingest-core.ts [--quoted]
 *
 * --quoted writes every cell in double quotes (as some historians export), which takes papaparse's
 * quote-aware path instead of its fast path for text without quotes.
 *
 * Prints ingest_values_per_s (whole path from bytes) and aggregate_values_per_s (aggregation alone,
 * fed the same values as Float64Array rows). With --expose-gc it also prints the live heap the
 * ingest holds after a quarter, half and all of the file (flat memory: these should not grow).
 */
import { createFileIngest, createHourAggregator, CellStatus } from '~/lib/ingest/index';

const TAGS = 200;
const ROWS = 30 * 24 * 60;
const CHUNK_BYTES = 65536;
const TIME_ZONE = 'Europe/Berlin';
const QUOTED = process.argv.includes('--quoted');
const q = (cell: string): string => (QUOTED ? `"${cell}"` : cell);

function pad(n: number): string {
  return n < 10 ? '0' + n : String(n);
}

function generate(): Uint8Array[] {
  const encoder = new TextEncoder();
  const chunks: Uint8Array[] = [];
  let text = 'Time';
  for (let j = 0; j < TAGS; j++) text += `;B1.XT-${100 + j}`;
  text += '\n';
  text += ';' + Array.from({ length: TAGS }, (_, j) => (j % 3 === 0 ? 'degC' : j % 3 === 1 ? 'bar(g)' : 't/h')).join(';') + '\n';
  const startWall = Date.UTC(2024, 0, 1);
  for (let i = 0; i < ROWS; i++) {
    const d = new Date(startWall + i * 60_000);
    let line = q(`${pad(d.getUTCDate())}.${pad(d.getUTCMonth() + 1)}.${d.getUTCFullYear()} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:00`);
    for (let j = 0; j < TAGS; j++) {
      const v = 100 + j + 10 * Math.sin(i / 50 + j);
      line += ';' + q(v.toFixed(3).replace('.', ','));
    }
    text += line + '\n';
    if (text.length >= CHUNK_BYTES) {
      const bytes = encoder.encode(text);
      for (let o = 0; o < bytes.length; o += CHUNK_BYTES) chunks.push(bytes.subarray(o, Math.min(bytes.length, o + CHUNK_BYTES)));
      text = '';
    }
  }
  if (text) chunks.push(encoder.encode(text));
  return chunks;
}

function runIngest(chunks: Uint8Array[]): { seconds: number; hours: number; values: number } {
  let hours = 0;
  const t0 = performance.now();
  const ingest = createFileIngest({
    timeZone: TIME_ZONE,
    onHour: () => hours++,
    // the first 64 KiB hold only 1 January, so the operator answers the date-order question
    answer: (p) => ({ ...p, time: { ...p.time, dateOrder: p.time.dateOrder === 'ambiguous' ? 'dmy' : p.time.dateOrder } }),
  });
  for (const c of chunks) ingest.push(c);
  const result = ingest.end();
  const seconds = (performance.now() - t0) / 1000;
  return { seconds, hours, values: result.report.valueCount };
}

function runAggregateOnly(): { seconds: number; values: number } {
  const rows: Float64Array[] = [];
  for (let i = 0; i < ROWS; i++) {
    const r = new Float64Array(TAGS);
    for (let j = 0; j < TAGS; j++) r[j] = 100 + j + 10 * Math.sin(i / 50 + j);
    rows.push(r);
  }
  const status = new Uint8Array(TAGS).fill(CellStatus.Ok);
  const start = Date.UTC(2023, 11, 31, 23);
  const t0 = performance.now();
  const agg = createHourAggregator({ timeZone: TIME_ZONE, onHour: () => {} });
  for (let j = 0; j < TAGS; j++) agg.addTag(j, `B1.XT-${100 + j}`);
  rows.forEach((row, i) => agg.addRow(start + i * 60_000, row, status));
  agg.flush();
  return { seconds: (performance.now() - t0) / 1000, values: ROWS * TAGS };
}

/** Live heap held by a running ingest at 25 %, 50 % and 100 % of the file [MB]; needs --expose-gc. */
function liveHeap(chunks: Uint8Array[]): number[] | null {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (!gc) return null;
  gc();
  const base = process.memoryUsage().heapUsed;
  const marks = [Math.floor(chunks.length / 4), Math.floor(chunks.length / 2), chunks.length - 1];
  const out: number[] = [];
  const ingest = createFileIngest({
    timeZone: TIME_ZONE,
    onHour: () => {},
    answer: (p) => ({ ...p, time: { ...p.time, dateOrder: p.time.dateOrder === 'ambiguous' ? 'dmy' : p.time.dateOrder } }),
  });
  chunks.forEach((c, i) => {
    ingest.push(c);
    if (marks.includes(i)) {
      gc();
      out.push((process.memoryUsage().heapUsed - base) / 1e6);
    }
  });
  ingest.end();
  return out;
}

const chunks = generate();
const megabytes = chunks.reduce((s, c) => s + c.length, 0) / 1e6;
runIngest(chunks); // warm-up
const runs = [runIngest(chunks), runIngest(chunks), runIngest(chunks)];
const best = runs.reduce((a, b) => (a.seconds < b.seconds ? a : b));
const agg = [runAggregateOnly(), runAggregateOnly()].reduce((a, b) => (a.seconds < b.seconds ? a : b));
if (QUOTED) console.log('cells_quoted yes');
console.log(`file_megabytes ${megabytes.toFixed(1)}`);
console.log(`values ${best.values}`);
console.log(`tag_hours ${best.hours}`);
console.log(`ingest_seconds ${best.seconds.toFixed(3)}`);
console.log(`ingest_values_per_s ${Math.round(best.values / best.seconds)}`);
console.log(`ingest_megabytes_per_s ${(megabytes / best.seconds).toFixed(1)}`);
console.log(`aggregate_values_per_s ${Math.round(agg.values / agg.seconds)}`);
const heap = liveHeap(chunks);
if (heap) console.log(`live_heap_mb_at_25_50_100_percent ${heap.map((x) => x.toFixed(2)).join(' ')}`);
