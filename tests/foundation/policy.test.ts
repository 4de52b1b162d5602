import { afterAll, beforeAll, expect, it, vi } from 'vitest';
import { ROLES, type Role } from '~/lib/roles';
import { NAV } from '~/lib/navigation';
import { auth } from '~/server/auth';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '~/server/demo-accounts';
import { guard } from '~/server/guard';
import { API_POLICY, admitFor, apiPolicyFor, decide, pagePolicyFor } from '~/server/policy';
import { describeIntegration } from '../support/integration';
import { entry } from '../support/present';
import { endpoints, samplePath } from '../support/routes';

/**
 * What the rest of the request answers in these tests: 299 when the guard lets it through, and for a
 * refused page the status the in-frame refusal page (src/pages/403.astro) sets when the guard
 * rewrites to it.
 */
async function pageOrRefusal(rewrite?: string): Promise<Response> {
  if (rewrite === '/403') return new Response('refused in the frame', { status: 403 });
  if (rewrite) throw new Error(`unexpected rewrite to ${rewrite}`);
  return new Response('reached', { status: 299 });
}

it('self-consistency: every endpoint file declares a policy for each method it exports', () => {
  const list = endpoints();
  expect(list.length).toBeGreaterThan(3);
  const missing: string[] = [];
  for (const e of list) {
    const hit = apiPolicyFor(samplePath(e.route));
    if (!hit || hit.pattern !== e.route) {
      missing.push(`${e.file}: no entry '${e.route}' in src/server/policy.ts`);
      continue;
    }
    for (const m of e.methods) if (!admitFor(hit.policy, m)) missing.push(`${e.file}: ${m} has no admitted roles`);
  }
  expect(missing).toEqual([]);
});

it('self-consistency: the policy table lists no route that has no file', () => {
  const routes = new Set(endpoints().map((e) => e.route));
  expect(Object.keys(API_POLICY).filter((r) => !routes.has(r))).toEqual([]);
});

it('self-consistency: navigation shows each role only pages its policy admits', () => {
  for (const item of NAV) {
    for (const role of ROLES) {
      const admitted = decide(pagePolicyFor(item.href), role) === 'allow';
      expect({ href: item.href, role, shown: item.roles.includes(role) }).toEqual({ href: item.href, role, shown: admitted });
    }
  }
});

describeIntegration('the guard, with real sessions', () => {
  const cookies: Partial<Record<Role, string>> = {};

  beforeAll(async () => {
    for (const a of DEMO_ACCOUNTS) {
      const res = await auth().api.signInEmail({ body: { email: a.email, password: DEMO_PASSWORD }, asResponse: true });
      expect(res.status).toBe(200);
      cookies[a.role] = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    }
  });

  async function callAs(role: Role | null, method: string, path: string): Promise<number> {
    return (await rawCall(role, method, path)).status;
  }
  async function rawCall(role: Role | null, method: string, path: string, extra: Record<string, string> = {}, reached = pageOrRefusal): Promise<Response> {
    const url = new URL(path, process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331');
    const headers = new Headers(extra);
    if (role) headers.set('cookie', cookies[role]!);
    const locals = {} as App.Locals;
    return guard(
      { request: new Request(url, { method, headers }), url, locals, redirect: (p, s) => new Response(null, { status: s ?? 302, headers: { location: p } }) },
      reached,
    );
  }

  it('takes changes only from its own origin (PUBLIC_BASE_URL), not from http://localhost or elsewhere', async () => {
    const own = new URL(process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331').origin;
    const path = '/api/tokens/00000000-0000-4000-8000-000000000000';
    expect((await rawCall('admin', 'DELETE', path, { origin: own })).status).toBe(299);
    expect((await rawCall('admin', 'DELETE', path, { 'sec-fetch-site': 'same-origin' })).status).toBe(299);
    for (const origin of ['http://localhost', 'https://evil.example', 'null']) {
      const res = await rawCall('admin', 'DELETE', path, { origin });
      expect(res.status).toBe(403);
      expect((await res.json()).error.code).toBe('FORBIDDEN');
    }
    expect((await rawCall('admin', 'POST', '/api/sites', { 'sec-fetch-site': 'cross-site', 'content-type': 'text/plain' })).status).toBe(403);
    expect((await rawCall('admin', 'GET', '/api/sites', { origin: 'https://evil.example' })).status).toBe(299);
  });

  it('puts the security headers on answers: a script policy without inline script, no framing, nosniff, referrer policy', async () => {
    const page = await rawCall('admin', 'GET', '/admin/users', {}, async () =>
      new Response('<html><head><script type="module">console.log(1)</script></head><body><p onclick="x()">hi</p></body></html>', { headers: { 'content-type': 'text/html' } }),
    );
    const csp = page.headers.get('content-security-policy')!;
    expect(csp).toMatch(/frame-ancestors 'none'/);
    const script = csp.split(';').find((d) => d.trim().startsWith('script-src'))!;
    expect(script).not.toMatch(/unsafe-inline|unsafe-eval/);
    expect(script).toMatch(/'sha256-[A-Za-z0-9+/=]+'/); // exactly the page's own inline script
    expect(page.headers.get('x-content-type-options')).toBe('nosniff');
    expect(page.headers.get('referrer-policy')).toBe('same-origin');
    const api = await rawCall(null, 'GET', '/api/me');
    expect(api.headers.get('x-content-type-options')).toBe('nosniff');
    expect(api.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
  });

  it('answers an endpoint that throws with the error shape (400 for input the database refuses), never an empty 500', async () => {
    const nul = Object.assign(new Error('invalid byte sequence for encoding "UTF8": 0x00'), { code: '22021' });
    const res = await rawCall('admin', 'POST', '/api/sites', {}, async () => {
      throw nul;
    });
    expect(res.status).toBe(400);
    expect((await res.json()).error.code).toBe('VALIDATION_FAILED');
    const logged: string[] = [];
    const spy = vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => void logged.push(args.join(' ')));
    try {
      const boom = await rawCall('admin', 'GET', '/api/sites', {}, async () => {
        throw new Error('duplicate key (email)=(someone@example.test) token_hash=' + 'ab'.repeat(32) + ' secret llt_abcDEF123');
      });
      expect(boom.status).toBe(500);
      expect((await boom.json()).error.code).toBe('INTERNAL');
    } finally {
      spy.mockRestore();
    }
    expect(logged.length).toBeGreaterThan(0);
    expect(logged.join('\n')).not.toMatch(/someone@example\.test|abababab|llt_abc/);
  });

  it('walks every endpoint with every role and anonymous: 401, 403 or through, as declared', async () => {
    const wrong: string[] = [];
    for (const e of endpoints()) {
      if (e.route.startsWith('/api/auth/')) continue; // better-auth's own routes: public by design
      const path = samplePath(e.route);
      const policy = apiPolicyFor(path)!.policy;
      for (const m of e.methods) {
        for (const role of [null, ...ROLES] as (Role | null)[]) {
          const verdict = decide(admitFor(policy, m), role);
          const expected = verdict === 'allow' ? 299 : verdict;
          const got = await callAs(role, m, path);
          if (got !== expected) wrong.push(`${m} ${path} as ${role ?? 'anonymous'}: expected ${expected}, got ${got}`);
        }
      }
    }
    expect(wrong).toEqual([]);
  });

  it('refuses an operator on the admin people endpoint with 403 and anonymous with 401', async () => {
    expect(await callAs('operator', 'GET', '/api/admin/users')).toBe(403);
    expect(await callAs('planner', 'POST', '/api/admin/users')).toBe(403);
    expect(await callAs(null, 'GET', '/api/admin/users')).toBe(401);
    expect(await callAs('admin', 'GET', '/api/admin/users')).toBe(299);
  });

  it('answers 404 in the error shape for an API path nobody declared and for a malformed id', async () => {
    expect(await callAs('admin', 'GET', '/api/not-declared-anywhere')).toBe(404);
    for (const path of ['/api/not-declared-anywhere', '/api/sites/not-a-uuid/units', '/api/units/%00abc/trend', "/api/sites/1'%20or%201=1/ledger"]) {
      const res = await rawCall('admin', 'GET', path);
      expect(res.status).toBe(404);
      const body = await res.json();
      expect(Object.keys(body.error).sort()).toEqual(['code', 'message']);
      expect(body.error.code).toBe('NOT_FOUND');
    }
  });

  it('sends anonymous page visits to the sign-in page and refuses admin pages to other roles', async () => {
    expect(await callAs(null, 'GET', '/')).toBe(302);
    expect(await callAs('planner', 'GET', '/admin/users')).toBe(403);
    expect(await callAs('admin', 'GET', '/admin/users')).toBe(299);
    expect(await callAs(null, 'GET', '/sign-in')).toBe(299);
  });
});

describeIntegration('access by site: every site-bound endpoint with every role, and tokens, against a second site', () => {
  type Ids = Record<string, string>;
  const ids: { A: Ids; B: Ids } = { A: {}, B: {} };
  const cookies: Record<string, string> = {};
  let tokenA = '';
  const RESTRICTED = ['energy-lead', 'operator', 'planner'] as const;
  const people: string[] = [];

  // The test data goes again: the same database serves the end-to-end run after this suite.
  afterAll(async () => {
    const { db } = await import('~/server/db/client');
    const { sql } = await import('drizzle-orm');
    const siteIds = [ids.A.siteId, ids.B.siteId].filter(Boolean) as string[];
    for (const siteId of siteIds) {
      await db().execute(sql`delete from drift_notices where site_id = ${siteId}`);
      await db().execute(sql`delete from baselines where unit_id in (select id from plant_units where site_id = ${siteId})`);
      await db().execute(sql`delete from tag_links where site_id = ${siteId}`);
      await db().execute(sql`delete from uploads where site_id = ${siteId}`);
      await db().execute(sql`delete from tags where site_id = ${siteId}`);
      await db().execute(sql`delete from plant_ports where unit_id in (select id from plant_units where site_id = ${siteId})`);
      await db().execute(sql`delete from plant_units where site_id = ${siteId}`);
      await db().execute(sql`delete from api_tokens where site_id = ${siteId}`);
      await db().execute(sql`delete from sites where id = ${siteId}`);
    }
    for (const id of people) await db().execute(sql`delete from "user" where id = ${id}`);
  });

  async function makeSite(label: string): Promise<Ids> {
    const { db } = await import('~/server/db/client');
    const { sql } = await import('drizzle-orm');
    const one = async (q: ReturnType<typeof sql>) => (await db().execute<{ id: string }>(q)).rows[0]!.id;
    const stamp = `${label} ${Date.now()}`;
    const siteId = await one(sql`insert into sites (name, time_zone) values (${'Access ' + stamp}, 'UTC') returning id`);
    const unitId = await one(sql`insert into plant_units (site_id, name, kind) values (${siteId}, 'P1', 'pump') returning id`);
    const portId = await one(sql`insert into plant_ports (unit_id, name, slot, role) values (${unitId}, 'in', 'in', 'inlet') returning id`);
    const tagId = await one(sql`insert into tags (site_id, name) values (${siteId}, 'FT-1') returning id`);
    const linkId = await one(
      sql`insert into tag_links (site_id, unit_id, tag_id, quantity, eng_unit, uncertainty_mode, uncertainty, valid_from) values (${siteId}, ${unitId}, ${tagId}, 'mass-flow', 'kg/s', 'relative', 0.01, now()) returning id`,
    );
    const uploadId = await one(sql`insert into uploads (site_id, file_name, object_key, source) values (${siteId}, 'a.csv', ${'k/' + stamp}, 'browser') returning id`);
    const baselineId = await one(
      sql`insert into baselines (unit_id, version, period_from, period_to, terms, hours, destruction_model) values (${unitId}, 1, now() - interval '30 days', now(), '[]'::jsonb, 100, '{}'::jsonb) returning id`,
    );
    const noticeId = await one(
      sql`insert into drift_notices (site_id, unit_id, direction, onset_hour, signal_hour, last_signal_hour, hours, extra_w, expected_w, shift_sigma, currency, k, h) values (${siteId}, ${unitId}, 'up', now(), now(), now(), 5, 1000, 5000, 3, 'EUR', 0.5, 5) returning id`,
    );
    const { issueApiToken } = await import('~/server/tokens');
    const token = await issueApiToken({ siteId, name: 'walk', role: 'admin', createdBy: null });
    return { siteId, unitId, portId, linkId, uploadId, baselineId, noticeId, tokenId: token.id, secret: token.secret };
  }

  beforeAll(async () => {
    ids.A = await makeSite('A');
    ids.B = await makeSite('B');
    tokenA = ids.A.secret!;
    const { db } = await import('~/server/db/client');
    const { account, personSites, user } = await import('~/server/db/schema');
    const { hashPassword } = await import('better-auth/crypto');
    for (const role of RESTRICTED) {
      const id = crypto.randomUUID();
      const email = `site-a-${role}-${id.slice(0, 6)}@example.test`;
      await db().insert(user).values({ id, email, name: `Site A ${role}`, role, emailVerified: true, allSites: false });
      people.push(id);
      await db().insert(account).values({ id: crypto.randomUUID(), accountId: id, providerId: 'credential', userId: id, password: await hashPassword('site-a-walk-phrase') });
      await db().insert(personSites).values({ userId: id, siteId: ids.A.siteId! });
      const res = await auth().api.signInEmail({ body: { email, password: 'site-a-walk-phrase' }, asResponse: true });
      cookies[role] = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    }
    const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;
    const res = await auth().api.signInEmail({ body: { email: admin.email, password: DEMO_PASSWORD }, asResponse: true });
    cookies.admin = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  });

  function pathFor(route: string, site: Ids): string | null {
    let missing = false;
    const out = route.replace(/\[([^\].]+)\]/g, (_, name: string) => {
      if (site[name]) return site[name]!;
      if (name === 'hour') return '2026-01-01T00:00:00Z';
      if (name === 'month') return '2026-01';
      missing = true;
      return 'x';
    });
    return missing ? null : out;
  }

  async function call(who: { cookie?: string; bearer?: string }, method: string, path: string) {
    const url = new URL(path, process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331');
    const headers = new Headers();
    if (who.cookie) headers.set('cookie', who.cookie);
    if (who.bearer) headers.set('authorization', `Bearer ${who.bearer}`);
    const locals = {} as App.Locals;
    const res = await guard(
      { request: new Request(url, { method, headers }), url, locals, redirect: (p, s) => new Response(null, { status: s ?? 302, headers: { location: p } }) },
      pageOrRefusal,
    );
    return { status: res.status, locals };
  }

  it('a person limited to site A gets through on A and 403 on B; admins everywhere; a token of A never reaches B', async () => {
    const wrong: string[] = [];
    let walked = 0;
    for (const e of endpoints()) {
      if (!/\[(siteId|unitId|uploadId|baselineId|noticeId|tokenId|portId|linkId)\]/.test(e.route)) continue;
      const policy = API_POLICY[e.route]!;
      const onA = pathFor(e.route, ids.A);
      const onB = pathFor(e.route, ids.B);
      if (!onA || !onB) continue;
      for (const m of e.methods) {
        for (const role of [...RESTRICTED, 'admin'] as const) {
          const verdict = decide(admitFor(policy, m), role);
          const roleExpected = verdict === 'allow' ? 299 : verdict;
          const a = await call({ cookie: cookies[role] }, m, onA);
          const b = await call({ cookie: cookies[role] }, m, onB);
          const expectB = role === 'admin' ? roleExpected : verdict === 'allow' ? 403 : roleExpected;
          if (a.status !== roleExpected) wrong.push(`${m} ${e.route} on A as ${role}: expected ${roleExpected}, got ${a.status}`);
          if (b.status !== expectB) wrong.push(`${m} ${e.route} on B as ${role}: expected ${expectB}, got ${b.status}`);
          walked++;
        }
        if (policy.apiToken) {
          const verdict = decide(admitFor(policy, m), 'admin');
          const a = await call({ bearer: tokenA }, m, onA);
          const b = await call({ bearer: tokenA }, m, onB);
          if (verdict === 'allow' && a.status !== 299) wrong.push(`${m} ${e.route} on A with A's token: expected 299, got ${a.status}`);
          if (verdict === 'allow' && b.status !== 403) wrong.push(`${m} ${e.route} on B with A's token: expected 403, got ${b.status}`);
        }
      }
    }
    expect(walked).toBeGreaterThan(50);
    expect(wrong).toEqual([]);
  });

  it('pages of site B are closed to a person limited to site A', async () => {
    for (const path of [`/plant/${ids.B.siteId}`, `/units/${ids.B.unitId}`, `/trends/${ids.B.unitId}`, `/baselines/${ids.B.baselineId}`, `/notices/${ids.B.noticeId}`]) {
      expect((await call({ cookie: cookies.operator }, 'GET', path)).status).toBe(403);
      expect((await call({ cookie: cookies.admin }, 'GET', path)).status).toBe(299);
    }
    expect((await call({ cookie: cookies.operator }, 'GET', `/units/${ids.A.unitId}`)).status).toBe(299);
  });

  it('lists that span sites show a limited person only their sites', async () => {
    const { GET } = await import('~/pages/api/sites/index');
    const { locals } = await call({ cookie: cookies.planner }, 'GET', '/api/sites');
    const res = await (GET as unknown as (ctx: { locals: App.Locals }) => Promise<Response>)({ locals });
    const names = ((await res.json()).sites as { id: string }[]).map((s) => s.id);
    expect(names).toContain(ids.A.siteId);
    expect(names).not.toContain(ids.B.siteId);
    const adminView = (await call({ cookie: cookies.admin }, 'GET', '/api/sites')).locals;
    const all = ((await (await (GET as unknown as (ctx: { locals: App.Locals }) => Promise<Response>)({ locals: adminView })).json()).sites as { id: string }[]).map((s) => s.id);
    expect(all).toEqual(expect.arrayContaining([ids.A.siteId, ids.B.siteId]));
  });

  it('notice settings named by ?siteId= are closed to a person limited to another site', async () => {
    const { GET } = await import('~/pages/api/notices/settings');
    const ask = async (cookie: string, siteId: string) => {
      const path = `/api/notices/settings?siteId=${siteId}`;
      const { locals } = await call({ cookie }, 'GET', path);
      const url = new URL(path, 'http://lossline.test');
      return (GET as unknown as (ctx: object) => Promise<Response>)({ locals, url, request: new Request(url), params: {} });
    };
    const refused = await ask(cookies.planner!, entry(ids.B, 'siteId', 'site B'));
    expect(refused.status).toBe(403);
    expect((await refused.json()).error.code).toBe('FORBIDDEN');
    expect((await ask(cookies.planner!, entry(ids.A, 'siteId', 'site A'))).status).toBe(200);
    expect((await ask(cookies.admin!, entry(ids.B, 'siteId', 'site B'))).status).toBe(200);
  });
});
