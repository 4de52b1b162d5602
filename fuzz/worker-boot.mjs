// Loads the TypeScript worker in a worker thread (Node 20 does not pass --import to the thread's entry).
import { register } from 'tsx/esm/api';

register();
await import('./worker.ts');
