import { expect, it } from 'vitest';
import { health } from '~/server/health';
import { describeIntegration } from '../support/integration';

describeIntegration('health', () => {
  it('reports database, object store, mail and queue, each answering', async () => {
    const out = await health();
    expect(Object.keys(out.checks).sort()).toEqual(['database', 'mail', 'objectStore', 'queue']);
    for (const [name, c] of Object.entries(out.checks)) expect({ name, ok: c.ok }).toEqual({ name, ok: true });
    expect(out.ok).toBe(true);
  });
});
