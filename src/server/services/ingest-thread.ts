/**
 * The parse of an upload's read, in a worker thread of its own (started by ingest-thread-pool.ts):
 * bytes in, packed tag hours and rejected cells out. The thread holds no connection: the reading
 * thread writes what it is given inside the upload's transaction (ingest-stream.ts), so the parse
 * and the database writes, the download and the hash run side by side on two cores instead of
 * taking turns on one. One read at a time per thread; the messages are those of ReaderThreadIn and
 * ReaderThreadOut.
 */
import { parentPort } from 'node:worker_threads';
import { createFileIngest, type FileIngest, type LayoutProfile, type RejectedCell } from '~/lib/ingest';
import { createHourPacker, type PackedHours } from '~/lib/ingest/hour-pack';
import { IngestError } from '~/lib/ingest/errors';
import { readOptionsOf, type SiteReadFacts } from './ingest-options';

/** Tag hours per message (the writer's batch). */
export const THREAD_HOUR_BATCH = 5000;
/** Rejected cells per message. */
const REJECT_BATCH = 1000;

export type ReaderThreadIn =
  | { type: 'start'; job: number; facts: SiteReadFacts; profile: LayoutProfile }
  | { type: 'chunk'; job: number; bytes: Uint8Array }
  | { type: 'end'; job: number }
  | { type: 'drop'; job: number };

/** An error as it crosses the thread's edge (an IngestError keeps its code, line and details). */
export interface ThreadError {
  name: string;
  message: string;
  code?: string;
  line?: number | null;
  details?: Record<string, unknown>;
}

export type ReaderThreadOut =
  | { type: 'hours'; job: number; batch: PackedHours }
  | { type: 'rejects'; job: number; cells: RejectedCell[] }
  /** A chunk parsed; its memory handed back for the next chunk. */
  | { type: 'read'; job: number; chunks: number; spare?: ArrayBuffer }
  | { type: 'done'; job: number; report: ReturnType<FileIngest['end']>['report']; encoding: string }
  | { type: 'failed'; job: number; error: ThreadError }
  | { type: 'ready' };

function errorOf(err: unknown): ThreadError {
  if (err instanceof IngestError) return { name: err.name, message: err.message, code: err.code, line: err.line, details: err.details };
  const e = err as Error;
  return { name: e?.name ?? 'Error', message: e?.message ?? String(err) };
}

const port = parentPort;
if (port) {
  let job = -1;
  let ingest: FileIngest | null = null;
  let packer: ReturnType<typeof createHourPacker> | null = null;
  let rejects: RejectedCell[] = [];
  let chunks = 0;
  const post = (m: ReaderThreadOut, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer);
  const flushRejects = () => {
    if (rejects.length === 0) return;
    post({ type: 'rejects', job, cells: rejects });
    rejects = [];
  };
  const fail = (err: unknown) => {
    post({ type: 'failed', job, error: errorOf(err) });
    ingest = null;
  };
  port.on('message', (m: ReaderThreadIn) => {
    if (m.type === 'start') {
      job = m.job;
      chunks = 0;
      rejects = [];
      const current = job;
      packer = createHourPacker(THREAD_HOUR_BATCH, (batch) => post({ type: 'hours', job: current, batch }, [batch.data.buffer as ArrayBuffer]));
      try {
        ingest = createFileIngest({
          ...readOptionsOf(m.facts),
          profile: m.profile,
          onHour: packer.push,
          onHourFields: packer.pushFields,
          onRejectedCell: (cell) => {
            rejects.push(cell);
            if (rejects.length >= REJECT_BATCH) flushRejects();
          },
        });
      } catch (err) {
        fail(err);
      }
      return;
    }
    if (m.job !== job || !ingest) return; // a dropped or failed read's late messages
    if (m.type === 'drop') {
      ingest = null;
      return;
    }
    try {
      if (m.type === 'chunk') {
        ingest.push(m.bytes);
        chunks++;
        // The chunk's memory goes back for the next chunk, unless the reader still holds it.
        const spare = ingest.holdsInput ? undefined : (m.bytes.buffer as ArrayBuffer);
        post({ type: 'read', job, chunks, spare }, spare ? [spare] : []);
        return;
      }
      const { report, encoding } = ingest.end();
      packer!.flush();
      flushRejects();
      post({ type: 'done', job, report, encoding: encoding.encoding });
      ingest = null;
    } catch (err) {
      fail(err);
    }
  });
  post({ type: 'ready' });
}
