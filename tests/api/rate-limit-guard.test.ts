/** The guard counts /api/v1 calls per token: with API_RATE_LIMIT_PER_MINUTE lowered to 2, the third call answers 429 with Retry-After. */
import { sql } from 'drizzle-orm';
import { afterAll, expect, it, vi } from 'vitest';
import { db } from '~/server/db/client';
import { guard } from '~/server/guard';
import { issueApiToken } from '~/server/tokens';
import { describeIntegration } from '../support/integration';

vi.stubEnv('API_RATE_LIMIT_PER_MINUTE', '2');

describeIntegration('rate limits through the guard', () => {
  let siteId = '';
  afterAll(async () => {
    if (siteId) {
      await db().execute(sql`delete from api_tokens where site_id = ${siteId}`);
      await db().execute(sql`delete from sites where id = ${siteId}`);
    }
    vi.unstubAllEnvs();
  });

  it('lets two calls of a token through and answers the third 429 RATE_LIMITED with Retry-After; another token is counted apart', async () => {
    siteId = (await db().execute<{ id: string }>(sql`insert into sites (name, time_zone) values (${'Rate ' + crypto.randomUUID()}, 'UTC') returning id`)).rows[0]!.id;
    const a = (await issueApiToken({ siteId, name: 'a', role: 'operator', createdBy: null })).secret;
    const b = (await issueApiToken({ siteId, name: 'b', role: 'operator', createdBy: null })).secret;
    const call = (secret: string) => {
      const url = new URL(`/api/v1/sites/${siteId}/state`, process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331');
      const request = new Request(url, { headers: { authorization: `Bearer ${secret}` } });
      return guard({ request, url, locals: {} as App.Locals, redirect: () => new Response(null, { status: 302 }) }, async () => new Response('reached', { status: 299 }));
    };
    expect((await call(a)).status).toBe(299);
    expect((await call(a)).status).toBe(299);
    const third = await call(a);
    expect(third.status).toBe(429);
    expect(Number(third.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
    expect((await third.json()).error.code).toBe('RATE_LIMITED');
    expect((await call(b)).status).toBe(299);
  });
});
