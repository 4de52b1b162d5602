import { afterAll } from 'vitest';

// Close the pool and the queue a test file opened, so the fork exits promptly.
afterAll(async () => {
  const { stopQueue } = await import('~/server/queue');
  const { closeDb } = await import('~/server/db/client');
  await stopQueue().catch(() => undefined);
  await closeDb().catch(() => undefined);
});
