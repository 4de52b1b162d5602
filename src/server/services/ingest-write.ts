/**
 * The writes of one upload's transaction: its new tag hours by binary COPY (ingest-copy.ts), which
 * upload brought which tag's hours, the hours that clash with stored ones (left for ingest-merge.ts),
 * and the rejected cells kept for the upload's report.
 */
import { once } from 'node:events';
import type { Writable } from 'node:stream';
import { from as copyFrom } from 'pg-copy-streams';
import type pg from 'pg';
import type { RejectedCell, TagHour } from '~/lib/ingest';
import { ensureMonthPartitions, monthPartitionsKnown } from '../db/partitions';
import { COPY_HEADER, COPY_TRAILER, TAG_HOUR_COPY_COLUMNS, encodeTagHourRows } from './ingest-copy';
import type { ClashKey } from './ingest-merge';
import { storable } from './ingest-text';

/**
 * Writes a batch of an upload's tag hours. Hours not stored yet go in by COPY; a tag hour already
 * holding another file's figures (two shift exports sharing an hour, or the same readings again) is
 * left for ingest-merge.ts, which recomputes it from the samples of both files after the stream:
 * returned as a clash.
 *
 * Where the writes go (docs/scale.md): the month partitions the batch needs are made first; new
 * hours go in by COPY sorted by their key; which upload brought which tag's hours is one row per
 * upload and tag (tag_hour_uploads, gathered in `spans` and written once by noteUploadTags), not an
 * array in every tag hour.
 */
export async function writeHours(
  client: pg.PoolClient,
  rows: TagHour[],
  tagId: Map<string, string>,
  latestExistingMs: number | null,
  spans: UploadTagSpans,
  copy: TagHourCopy,
): Promise<ClashKey[]> {
  let minMs = Infinity;
  let maxMs = -Infinity;
  for (const h of rows) {
    if (h.hourStartMs < minMs) minMs = h.hourStartMs;
    if (h.hourStartMs > maxMs) maxMs = h.hourStartMs;
  }
  // A month partition made while the COPY is open would not be seen by it: the COPY ends first.
  if (!monthPartitionsKnown('tag_hours', minMs, maxMs)) await copy.end();
  await ensureMonthPartitions(client, 'tag_hours', minMs, maxMs);
  widenSpans(spans, rows, tagId);
  // The usual case, new hours only, goes into the open COPY. Hours after the site's latest stored
  // hour (read once, under the site's ingest lock) cannot clash; otherwise one query looks for clashes.
  if (latestExistingMs === null || minMs > latestExistingMs) {
    await copy.write(rows, tagId);
    return [];
  }
  await copy.end();
  const ids = rows.map((h) => tagId.get(h.tag));
  const starts = rows.map((h) => isoOf(h.hourStartMs));
  const clash = await client.query(
    `select tag_id::text as tag_id, hour_start from tag_hours where tag_id = any($1::int[]) and hour_start between $2 and $3
       and (tag_id, hour_start) in (select * from unnest($1::int[], $4::timestamptz[]))`,
    [ids, isoOf(minMs), isoOf(maxMs), starts],
  );
  const taken = new Set((clash.rows as { tag_id: string; hour_start: Date }[]).map((r) => `${r.tag_id}@${r.hour_start.getTime()}`));
  const fresh = taken.size === 0 ? rows : rows.filter((h) => !taken.has(`${tagId.get(h.tag)}@${h.hourStartMs}`));
  if (fresh.length > 0) await copy.write(fresh, tagId);
  return rows.filter((h) => taken.has(`${tagId.get(h.tag)}@${h.hourStartMs}`)).map((h) => ({ tag: h.tag, tagId: tagId.get(h.tag)!, hourStartMs: h.hourStartMs }));
}

/** The first and last hour of each tag an upload brought, by tags.seq (gathered over its batches). */
export type UploadTagSpans = Map<string, [number, number]>;

function widenSpans(spans: UploadTagSpans, rows: TagHour[], tagId: Map<string, string>) {
  for (const h of rows) {
    const id = tagId.get(h.tag)!;
    const s = spans.get(id);
    if (!s) spans.set(id, [h.hourStartMs, h.hourStartMs]);
    else {
      if (h.hourStartMs < s[0]) s[0] = h.hourStartMs;
      if (h.hourStartMs > s[1]) s[1] = h.hourStartMs;
    }
  }
}

/**
 * Which uploads brought which tag's hours: one row per upload and tag, written once when the file is
 * read (one statement instead of one per batch; the merge step after it reads other uploads' rows only).
 */
export async function noteUploadTags(client: pg.PoolClient, uploadId: string, spans: UploadTagSpans) {
  if (spans.size === 0) return;
  const ids = [...spans.keys()];
  await client.query(
    `insert into tag_hour_uploads (upload_id, tag_id, first_hour, last_hour)
     select $1, * from unnest($2::int[], $3::timestamptz[], $4::timestamptz[])
     on conflict (upload_id, tag_id) do update set first_hour = least(tag_hour_uploads.first_hour, excluded.first_hour),
       last_hour = greatest(tag_hour_uploads.last_hour, excluded.last_hour)`,
    [uploadId, ids, ids.map((i) => isoOf(spans.get(i)![0])), ids.map((i) => isoOf(spans.get(i)![1]))],
  );
}

/** ISO text of an instant, cached: the tags of a wide file share their hour starts. */
const isoCache = new Map<number, string>();
function isoOf(ms: number): string {
  let s = isoCache.get(ms);
  if (s === undefined) {
    if (isoCache.size > 50_000) isoCache.clear();
    s = new Date(ms).toISOString();
    isoCache.set(ms, s);
  }
  return s;
}


export async function insertRejects(client: pg.PoolClient, uploadId: string, startSeq: number, rows: RejectedCell[]) {
  await client.query(
    `insert into upload_rejects (upload_id, seq, line, tag, time, raw, reason)
     select $1, * from unnest($2::int[], $3::bigint[], $4::text[], $5::text[], $6::text[], $7::text[])`,
    [
      uploadId,
      rows.map((_, i) => startSeq + i),
      rows.map((r) => r.line),
      rows.map((r) => r.tag),
      rows.map((r) => (Number.isFinite(r.timeMs) ? new Date(r.timeMs).toISOString() : null)),
      rows.map((r) => storable(r.text.slice(0, 500))),
      rows.map((r) => (r.reason === 'bad-quality' && r.code !== undefined ? `${REJECT_REASON_TEXT[r.reason]} ${storable(r.code.slice(0, 100))}` : REJECT_REASON_TEXT[r.reason])),
    ],
  );
}


/** The reason of a rejected cell as stored and shown in the rejected-cells report. */
const REJECT_REASON_TEXT: Record<RejectedCell['reason'], string> = {
  text: 'not a number',
  'bad-quality': 'bad quality',
  impossible: 'physically impossible value',
  'outside-window': 'time outside the accepted window',
};

/**
 * New hours go in by COPY (PostgreSQL's bulk path, several times faster than an INSERT), in binary
 * (ingest-copy.ts), each batch sorted by the primary key's order (tag, hour). One COPY stays open on
 * the transaction's connection across batches: a batch's rows are written into it and the next batch
 * does not wait for the server's answer to the last one (a 70 MB file took 29 round trips, one per
 * batch of 5,000 tag hours). Anything else on the connection (a query) ends it first (end()); the
 * next write opens a new one. A refusal of the server (a value it cannot store) surfaces at the next
 * write or at end().
 */
export class TagHourCopy {
  private sink: Writable | null = null;
  private finished: Promise<void> | null = null;
  private failure: unknown = null;

  constructor(private readonly client: pg.PoolClient) {}

  /** Writes a batch of new hours into the open COPY (opening one if none is). */
  async write(rows: TagHour[], tagId: Map<string, string>): Promise<void> {
    const data = encodeTagHourRows(rows, (h) => Number(tagId.get(h.tag)));
    if (this.failure) throw this.failure;
    const sink = this.sink ?? this.open();
    if (!sink.write(data)) await Promise.race([once(sink, 'drain'), this.finished]);
    if (this.failure) throw this.failure;
  }

  /** Ends the open COPY, if any, and waits for the server to have taken every row. */
  async end(): Promise<void> {
    const sink = this.sink;
    if (sink) {
      this.sink = null;
      sink.end(COPY_TRAILER);
      await this.finished;
    }
    if (this.failure) throw this.failure;
  }

  /**
   * Stops the open COPY after a failure elsewhere (the server is told, the COPY fails and the
   * connection is free for the rollback; a COPY left open would hold every later query back).
   */
  async abort(reason: Error): Promise<void> {
    const sink = this.sink;
    if (!sink) return;
    this.sink = null;
    this.failure ??= reason;
    sink.destroy(reason);
    await this.finished;
  }

  private open(): Writable {
    const sink = this.client.query(copyFrom(`copy tag_hours (${TAG_HOUR_COPY_COLUMNS}) from stdin (format binary)`));
    this.finished = new Promise<void>((resolve) => {
      sink.once('finish', resolve);
      sink.once('error', (err) => {
        this.failure ??= err;
        resolve();
      });
    });
    sink.write(COPY_HEADER);
    this.sink = sink;
    return sink;
  }
}
