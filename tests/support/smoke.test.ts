import { it } from 'vitest';
import { expectClose } from './expect-close';
it('self-consistency: expectClose accepts equal and rejects distant values', () => {
  expectClose(1, 1 + 1e-12);
  let threw = false;
  try { expectClose(1, 2); } catch { threw = true; }
  if (!threw) throw new Error('expectClose accepted 1 vs 2');
});
