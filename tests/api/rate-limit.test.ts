/** Rate limits of /api/v1 (src/server/rate-limit.ts): per token and per person, 429 in the one error shape with Retry-After. */
import { expect, it } from 'vitest';
import { checkApiRate, rateKey } from '~/server/rate-limit';

it('lets a caller through up to the limit, then answers 429 RATE_LIMITED with Retry-After in seconds', async () => {
  const key = `token:${crypto.randomUUID()}`;
  for (let i = 0; i < 3; i++) expect(await checkApiRate(key, 3)).toBeNull();
  const res = (await checkApiRate(key, 3))!;
  expect(res.status).toBe(429);
  const retry = Number(res.headers.get('retry-after'));
  expect(retry).toBeGreaterThanOrEqual(1);
  expect(retry).toBeLessThanOrEqual(60);
  const body = await res.json();
  expect(Object.keys(body.error).sort()).toEqual(['code', 'message']);
  expect(body.error.code).toBe('RATE_LIMITED');
  expect(body.error.message).toMatch(/at most 3 a minute/);
});

it('counts each token and person on its own, and 0 means no limit', async () => {
  const a = `token:${crypto.randomUUID()}`;
  const b = `user:${crypto.randomUUID()}`;
  expect(await checkApiRate(a, 1)).toBeNull();
  expect(await checkApiRate(b, 1)).toBeNull();
  expect((await checkApiRate(a, 1))?.status).toBe(429);
  for (let i = 0; i < 50; i++) expect(await checkApiRate(a, 0)).toBeNull();
  expect(rateKey({ apiToken: { id: 't1', siteId: 's', role: 'operator' }, user: null } as unknown as App.Locals)).toBe('token:t1');
  expect(rateKey({ apiToken: null, user: { id: 'u1' } } as unknown as App.Locals)).toBe('user:u1');
  expect(rateKey({ apiToken: null, user: null } as unknown as App.Locals)).toBeNull();
});
