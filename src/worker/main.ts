/**
 * The worker process: pg-boss job handlers that call src/lib and src/server. Started by
 * docker-free-start.sh as `node --import tsx src/worker/main.ts`; SIGTERM stops it gracefully
 * (the job in hand finishes or is left for retry).
 */
import './heap'; // first: sets how far the heap grows before the rest loads (heap.ts)
import { QUEUES, SendMailPayload } from '../jobs';
import { closeDb } from '../server/db/client';
import { sendMail } from '../server/mail';
import { queue, stopQueue } from '../server/queue';
import { resumeInterruptedUploads, sweepSeconds } from '../server/services/ingest';
import { stopReaderThreads, warmReaderThread } from '../server/services/ingest-thread-pool';
import { registerHandlers } from './handlers';
import { wakeOnIngestNotify } from './ingest-wake';

const boss = await queue();

await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 1 }, async ([job]) => {
  await sendMail(SendMailPayload.parse(job!.data));
});
const { ingestWorker } = await registerHandlers(boss);
const stopWakeUps = wakeOnIngestNotify(boss, ingestWorker);
const resumed = await resumeInterruptedUploads();
if (resumed) console.log(`[worker] queued ${resumed} upload(s) again that a stopped worker left half-read`);
// The parse of a read runs on a thread of its own (ingest-thread-pool.ts): one is started now, so the
// first upload does not wait for it to load.
if (!(await warmReaderThread())) console.log('[worker] no reader thread: uploads are parsed on the main thread (INGEST_READ_THREADS)');
console.log('[worker] ready');

// A worker that dies while reading leaves its upload 'processing': every live worker looks for such
// uploads regularly and takes them over (see resumeInterruptedUploads).
const sweep = setInterval(() => {
  resumeInterruptedUploads()
    .then((n) => n && console.log(`[worker] took over ${n} upload(s) a stopped worker left half-read`))
    .catch((err) => console.error(`[worker] looking for half-read uploads failed: ${(err as Error).message}`));
}, sweepSeconds() * 1000);
sweep.unref();

let stopping = false;
async function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  clearInterval(sweep);
  console.log(`[worker] ${signal}: stopping`);
  await stopWakeUps();
  await stopQueue();
  await stopReaderThreads();
  await closeDb();
  process.exit(0);
}
process.on('SIGTERM', () => void shutdown('SIGTERM'));
process.on('SIGINT', () => void shutdown('SIGINT'));
