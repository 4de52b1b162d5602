/** Worker thread of the fuzz run: checks one file per message, so a hang can be cut off. */
import { parentPort } from 'node:worker_threads';
import { checkFile } from './check-file';

parentPort!.on('message', (msg: { id: number; bytes: Uint8Array }) => {
  const t0 = performance.now();
  const out = checkFile(msg.bytes);
  parentPort!.postMessage({ id: msg.id, ms: performance.now() - t0, ...out });
});
parentPort!.postMessage({ ready: true });
