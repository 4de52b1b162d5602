import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import type { Endpoint } from '~/server/endpoint';
import { ERROR_CODES } from '~/server/errors';
import { humanErrorMap, humanIssues } from '~/lib/zod-words';
import { endpoints } from '../support/routes';

/**
 * Every endpoint answers bad path parameters, a bad query and a bad body in the one error shape,
 * with words a person can act on. The handlers are called directly (the guard is walked in
 * policy.test.ts): everything here is refused before any database work.
 */

/** Traces of a regular expression in a text (written here, apart from the implementation's own check). */
const REGEX_TRACE = /\/\^|\$\/|\\d|\\s|\\w|\(\?:|\[0-9|\[a-z|\[\^|\{\d+,\d*\}/i;

const ID = '00000000-0000-4000-8000-000000000000';
const GOOD_PARAMS: Record<string, string> = { hour: '2026-01-01T00:00:00Z', month: '2026-01', userId: 'someone' };
const BAD_VALUES = ['not valid ✗', 'x'.repeat(5000), '2025-13-45T99:99', '-1'];

type Body = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };

async function expectErrorShape(res: Response, where: string): Promise<Body> {
  expect(res.status, where).toBeGreaterThanOrEqual(400);
  expect(res.status, where).toBeLessThan(500);
  const body = (await res.json()) as Body;
  expect(Object.keys(body), where).toEqual(['error']);
  expect(ERROR_CODES, where).toContain(body.error.code);
  expect(typeof body.error.message, where).toBe('string');
  expect(body.error.message.length, where).toBeGreaterThan(5);
  const texts = [body.error.message, ...(body.error.issues ?? []).map((i) => i.message)];
  for (const t of texts) expect(t, `${where}: ${t}`).not.toMatch(REGEX_TRACE);
  for (const i of body.error.issues ?? []) {
    expect(Object.keys(i).sort(), where).toEqual(['message', 'path']);
    expect(typeof i.path, where).toBe('string');
  }
  return body;
}

function ctx(method: string, params: Record<string, string>, query: Record<string, string>, body?: string) {
  const url = new URL('http://lossline.test/api/x');
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
  const request = new Request(url, { method, ...(body !== undefined && method !== 'GET' ? { body, headers: { 'content-type': 'application/json' } } : {}) });
  const locals = { user: { id: 'walker', name: 'Walker', email: 'walker@example.test', role: 'admin' }, session: null, apiToken: null, sites: 'all' };
  return { url, params, request, locals } as never;
}

function paramNames(route: string): string[] {
  return [...route.matchAll(/\[([^\].]+)\]/g)].map((m) => m[1]!);
}

/** For each key of an object schema, a value it refuses (keys that take any text are left out). */
function badQuery(schema: z.ZodType): Record<string, string> {
  const shape = (schema as unknown as { shape?: Record<string, z.ZodType> }).shape ?? {};
  const out: Record<string, string> = {};
  for (const [key, field] of Object.entries(shape)) {
    const bad = BAD_VALUES.find((v) => !field.safeParse(v).success);
    if (bad !== undefined) out[key] = bad;
  }
  return out;
}

async function handlers() {
  const list: { route: string; method: string; run: Endpoint }[] = [];
  for (const e of endpoints()) {
    if (e.route.startsWith('/api/auth/')) continue; // better-auth's own routes
    const mod = (await import(/* @vite-ignore */ resolve(e.file))) as Record<string, Endpoint>;
    for (const m of e.methods) list.push({ route: e.route, method: m, run: mod[m]! });
  }
  return list;
}

describe('human words for zod findings', () => {
  const check = (schema: z.ZodType, value: unknown, where: 'query' | 'body') => {
    const r = schema.safeParse(value, { error: humanErrorMap });
    expect(r.success).toBe(false);
    return humanIssues(r.error!, where);
  };

  it('a bad instant names the field and shows an example, never the pattern', () => {
    const issues = check(z.object({ from: z.iso.datetime({ offset: true }) }), { from: 'yesterday' }, 'query');
    expect(issues).toEqual([{ path: 'from', message: 'from: must be a date and time like 2025-05-12T06:00Z' }]);
  });

  it('a pattern without a message of its own is not shown', () => {
    const issues = check(z.object({ code: z.string().regex(/^[A-Z]{3}-\d+$/) }), { code: 'x' }, 'body');
    expect(issues).toEqual([{ path: '$.code', message: 'code: is not in the expected form' }]);
  });

  it('missing fields, choices, sizes, ids and unknown fields in words', () => {
    const schema = z.strictObject({
      site: z.object({ name: z.string().min(1), kind: z.enum(['boiler', 'pump']), id: z.uuid(), units: z.array(z.number().positive()).max(2) }),
    });
    const issues = check(schema, { site: { name: '', kind: 'kettle', units: [1, 2, 3] }, extra: 1 }, 'body');
    expect(issues).toEqual([
      { path: '$.site.name', message: 'site.name: must not be empty' },
      { path: '$.site.kind', message: 'site.kind: must be one of boiler, pump' },
      { path: '$.site.id', message: 'site.id: is required' },
      { path: '$.site.units', message: 'site.units: must list at most 2 entries' },
      { path: '$.extra', message: "Unknown field 'extra'." },
    ]);
  });

  it("a schema's own sentence is kept as written", () => {
    const issues = check(z.object({ name: z.string().min(1, 'Give the site a name.') }), { name: '' }, 'body');
    expect(issues).toEqual([{ path: '$.name', message: 'Give the site a name.' }]);
  });
});

describe('every endpoint, walked with bad input', async () => {
  const all = await handlers();

  it('self-consistency: every endpoint goes through the wrapper (src/server/endpoint.ts)', () => {
    expect(all.length).toBeGreaterThan(50);
    expect(all.filter((h) => typeof h.run !== 'function' || !h.run.spec).map((h) => `${h.method} ${h.route}`)).toEqual([]);
  });

  it('a malformed id or other path parameter answers in the error shape', async () => {
    let walked = 0;
    for (const h of all) {
      const names = paramNames(h.route);
      for (const bad of names) {
        const params = Object.fromEntries(names.map((n) => [n, n === bad ? "1' or 1=1 %zz %00" + 'x'.repeat(300) : (GOOD_PARAMS[n] ?? ID)]));
        const body = await expectErrorShape(await h.run(ctx(h.method, params, {}, '{}')), `${h.method} ${h.route} bad ${bad}`);
        expect(['NOT_FOUND', 'VALIDATION_FAILED']).toContain(body.error.code);
        walked++;
      }
    }
    expect(walked).toBeGreaterThan(60);
  });

  it('a bad query answers 400 naming each bad parameter', async () => {
    let walked = 0;
    for (const h of all) {
      if (!h.run.spec.query) continue;
      const query = badQuery(h.run.spec.query);
      if (!Object.keys(query).length) continue;
      const params = Object.fromEntries(paramNames(h.route).map((n) => [n, GOOD_PARAMS[n] ?? ID]));
      const res = await h.run(ctx(h.method, params, query, '{}'));
      const where = `${h.method} ${h.route}?${new URLSearchParams(query)}`;
      const body = await expectErrorShape(res, where);
      expect(res.status, where).toBe(400);
      expect(body.error.code, where).toBe('VALIDATION_FAILED');
      expect((body.error.issues ?? []).map((i) => i.path).sort(), where).toEqual(Object.keys(query).sort());
      walked++;
    }
    expect(walked).toBeGreaterThan(8);
  });

  it('a body that is not JSON, or JSON of the wrong kind, answers 400', async () => {
    let walked = 0;
    for (const h of all) {
      const schema = h.run.spec.body;
      if (!schema) continue;
      const params = Object.fromEntries(paramNames(h.route).map((n) => [n, GOOD_PARAMS[n] ?? ID]));
      const query: Record<string, string> = h.run.spec.query ? { siteId: ID } : {};
      const notJson = await expectErrorShape(await h.run(ctx(h.method, params, query, 'name=x&role=admin')), `${h.method} ${h.route} not JSON`);
      expect(notJson.error.message).toBe('The request body is not JSON.');
      if (!schema.safeParse([]).success) {
        const res = await h.run(ctx(h.method, params, query, '[1, "two"]'));
        const body = await expectErrorShape(res, `${h.method} ${h.route} a list`);
        expect(res.status).toBe(400);
        expect(body.error.issues?.length).toBeGreaterThan(0);
      }
      walked++;
    }
    expect(walked).toBeGreaterThan(15);
  });
});
