import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { beforeAll, expect, it } from 'vitest';
import { ROLES, type Role } from '../../src/lib/roles';
import { NAV } from '../../src/lib/navigation';
import { auth } from '../../src/server/auth';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../src/server/demo-accounts';
import { guard } from '../../src/server/guard';
import { API_POLICY, admitFor, apiPolicyFor, decide, pagePolicyFor } from '../../src/server/policy';
import { describeIntegration } from '../support/integration';

const API_DIR = 'src/pages/api';
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? walk(p) : /\.(ts|js)$/.test(f) ? [p] : [];
  });
}

/** Every endpoint file, as its Astro route pattern and the methods it exports. */
function endpoints() {
  return walk(API_DIR).map((file) => {
    const route =
      '/' +
      relative('src/pages', file)
        .replace(/\.(ts|js)$/, '')
        .replace(/\/index$/, '');
    const src = readFileSync(file, 'utf8');
    const exported = [...src.matchAll(/export const (GET|POST|PUT|PATCH|DELETE|ALL)\b/g)].map((m) => m[1]!);
    const methods = exported.includes('ALL') ? [...METHODS] : exported;
    return { file, route, methods };
  });
}

/** A concrete path for a pattern: each [param] becomes a sample value. */
function samplePath(route: string): string {
  return route.replace(/\[\.\.\.[^\]]+\]/g, 'x/y').replace(/\[[^\]]+\]/g, '00000000-0000-4000-8000-000000000000');
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
    const url = new URL(path, process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331');
    const headers = new Headers();
    if (role) headers.set('cookie', cookies[role]!);
    const locals = {} as App.Locals;
    const res = await guard(
      { request: new Request(url, { method, headers }), url, locals, redirect: (p, s) => new Response(null, { status: s ?? 302, headers: { location: p } }) },
      async () => new Response('reached', { status: 299 }),
    );
    return res.status;
  }

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

  it('answers 500 NO_POLICY for an API path nobody declared', async () => {
    expect(await callAs('admin', 'GET', '/api/not-declared-anywhere')).toBe(500);
  });

  it('sends anonymous page visits to the sign-in page and refuses admin pages to other roles', async () => {
    expect(await callAs(null, 'GET', '/')).toBe(302);
    expect(await callAs('planner', 'GET', '/admin/users')).toBe(403);
    expect(await callAs('admin', 'GET', '/admin/users')).toBe(299);
    expect(await callAs(null, 'GET', '/sign-in')).toBe(299);
  });
});
