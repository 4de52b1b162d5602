/**
 * A worker process that works only the engine's queues (compute-unit-hours, compute-unit-month,
 * compute-settle): start as many as there are cores, on as many machines as the database serves
 * (docs/scale.md). `node --import tsx src/worker/engine-worker.ts`; SIGTERM stops it gracefully.
 */
import { closeDb } from '../server/db/client';
import { queue, stopQueue } from '../server/queue';
import { registerEngineHandlers } from './handlers';

const boss = await queue();
await registerEngineHandlers(boss);
console.log(`[engine-worker ${process.pid}] ready`);

let stopping = false;
async function shutdown() {
  if (stopping) return;
  stopping = true;
  await stopQueue();
  await closeDb();
  process.exit(0);
}
process.on('SIGTERM', () => void shutdown());
process.on('SIGINT', () => void shutdown());
