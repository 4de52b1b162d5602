/**
 * The contract of /api/v1: every operation of the OpenAPI document (src/server/openapi.ts) is called
 * through the guard and its endpoint, as the server runs them, with a site API token: a valid call
 * and error calls (no token, an id nobody has, a bad or missing query). Every answer's status, media
 * type and body must be described by the document (tests/api/contract-check.ts, Ajv 2020-12). It
 * fails when a route under src/pages/api/v1 is missing from the document or one of its operations is
 * never answered with success. A new route gets its sample values in PATH_SAMPLES, QUERY_SAMPLES or
 * BODY_SAMPLES when its names are new.
 */
import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { plantUnits, tags } from '~/server/db/schema';
import { guard } from '~/server/guard';
import { openApiPath, routeOfFile, type OpenApiDocument, type RouteModule } from '~/server/openapi';
import { v1Document, v1RouteModules } from '~/server/openapi-routes';
import { handleComputeUnitHours } from '~/server/services/engine';
import { createSiteFromModel } from '~/server/services/plant-model';
import { writeTagHours } from '~/server/services/tag-hours';
import { issueApiToken } from '~/server/tokens';
import { P_ATM_Pa, steadyHour, valveCase } from '../engine/cases';
import { uniqueName } from '../plant/support';
import { describeIntegration } from '../support/integration';
import { endpoints } from '../support/routes';
import { judge, operations, type Operation } from './contract-check';

const H = 3_600_000;
const H0 = Date.UTC(2024, 4, 2, 6);
const NOBODY = '00000000-0000-4000-8000-00000000beef';

let doc: OpenApiDocument;
let check: ReturnType<typeof judge>;
let modules: Map<string, RouteModule>;
let secret: string;
const PATH_SAMPLES: Record<string, string> = { hour: new Date(H0).toISOString() };
const QUERY_SAMPLES: Record<string, string> = { from: '2024-05-02T00:00:00Z', to: '2024-05-03T00:00:00Z', name: 'contract.csv' };
/** Parameters an enum value needs beside it (a custom period needs its days). */
const ENUM_COMPANIONS: Record<string, Record<string, string>> = { 'range=custom': { from: '2024-05-01', to: '2024-05-02' } };
const CSV = `Time,PRV-1.PT-IN\n${[0, 1, 2].map((m) => `2024-05-01 0${m}:00:00,41.5`).join('\n')}\n`;
/** Request bodies by "METHOD path": a function of the state, as the body and its media type. */
const BODY_SAMPLES: Record<string, () => Promise<{ body: BodyInit; type: string }>> = {
  'POST /api/v1/sites/{siteId}/files': async () => ({ body: CSV, type: 'text/csv' }),
  'PUT /api/v1/sites/{siteId}/model': async () => ({ body: await (await send('GET', `/api/v1/sites/${PATH_SAMPLES.siteId}/model`)).text(), type: 'application/json' }),
};

/** One request through the guard and the route's endpoint. */
async function send(method: string, path: string, init: { token?: string | null; body?: BodyInit; type?: string; accept?: string } = {}) {
  const url = new URL(path, 'http://127.0.0.1');
  const template = [...modules.keys()].find((t) => new RegExp(`^${t.replace(/\{[^}]+\}/g, '[^/]+').replace(/\./g, '\\.')}$`).test(url.pathname));
  if (!template) throw new Error(`no route module answers ${path}`);
  const names = [...template.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]!);
  const values = url.pathname.match(new RegExp(`^${template.replace(/\{[^}]+\}/g, '([^/]+)').replace(/\./g, '\\.')}$`))!.slice(1);
  const params = Object.fromEntries(names.map((n, i) => [n, decodeURIComponent(values[i]!)]));
  const token = init.token === undefined ? secret : init.token;
  const headers: Record<string, string> = { origin: process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1' };
  if (token) headers.authorization = `Bearer ${token}`;
  if (init.type) headers['content-type'] = init.type;
  if (init.accept) headers.accept = init.accept;
  const request = new Request(url, { method, body: init.body, headers, duplex: 'half' } as RequestInit);
  const ctx = { request, url, params, locals: {} as App.Locals, redirect: (p: string, s = 302) => new Response(null, { status: s, headers: { location: p } }) };
  const handler = modules.get(template)![method] as (c: never) => Promise<Response>;
  return guard(ctx, async () => handler(ctx as never));
}

type Param = { name: string; in: string; required?: boolean; schema?: { enum?: string[]; format?: string } };
const paramsOf = (o: Operation, where: string) => ((o.op.parameters ?? []) as Param[]).filter((p) => p.in === where);

/** The operation's path with its sample ids, and its query with samples for every required parameter. */
function validRequest(o: Operation, query: Record<string, string> = {}): string {
  const path = o.path.replace(/\{([^}]+)\}/g, (_, n: string) => {
    expect(PATH_SAMPLES[n], `${o.method} ${o.path}: give a sample for path parameter ${n} in PATH_SAMPLES`).toBeDefined();
    return encodeURIComponent(PATH_SAMPLES[n]!);
  });
  const q = new URLSearchParams();
  for (const p of paramsOf(o, 'query')) {
    const value = query[p.name] ?? (p.required ? QUERY_SAMPLES[p.name] : undefined);
    if (p.required) expect(value, `${o.method} ${o.path}: give a sample for query parameter ${p.name} in QUERY_SAMPLES`).toBeDefined();
    if (value !== undefined) q.set(p.name, value);
  }
  for (const [k, v] of Object.entries(query)) q.set(k, v);
  return q.size ? `${path}?${q}` : path;
}

async function bodyOf(o: Operation) {
  if (!o.op.requestBody) return {};
  const sample = BODY_SAMPLES[`${o.method} ${o.path}`];
  expect(sample, `${o.method} ${o.path}: give a request body in BODY_SAMPLES`).toBeDefined();
  return sample!();
}

const order = (o: Operation) => (o.method === 'GET' ? 0 : 1); // reads first, then writes
let sorted: Operation[];

describeIntegration('the /api/v1 contract', () => {
  beforeAll(async () => {
    doc = (await v1Document()).document;
    check = judge(doc);
    const found = await v1RouteModules();
    modules = new Map(Object.entries(found).map(([file, mod]) => [openApiPath(routeOfFile(file)), mod]));
    sorted = operations(doc).sort((a, b) => order(a) - order(b));

    const c = valveCase();
    const siteId = (
      await createSiteFromModel({
        format: 'lossline-plant-model',
        version: 1,
        site: { name: uniqueName('Contract site'), timeZone: 'Europe/Berlin', p_atm_Pa: P_ATM_Pa, deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR', prices: [] },
        units: [{ name: 'PRV 1', kind: c.kind, parameters: c.parameters, ports: c.ports, links: c.links.map((l) => ({ port: l.port, quantity: l.quantity, tag: l.tag, unit: l.unit })) }],
      })
    ).siteId;
    const [unit] = await db().select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.siteId, siteId));
    const tagRows = await db().select().from(tags).where(eq(tags.siteId, siteId));
    for (const l of c.links) {
      const tagId = tagRows.find((t) => t.name === l.tag)!.seq;
      for (let h = 0; h < 2; h++) await writeTagHours([{ tagId, hourStart: new Date(H0 + h * H), ...steadyHour(l.reading) }]);
    }
    await handleComputeUnitHours({ siteId, fromMs: H0, toMs: H0 + 2 * H });
    secret = (await issueApiToken({ siteId, name: 'contract', role: 'admin', createdBy: null })).secret;
    Object.assign(PATH_SAMPLES, { siteId, unitId: unit!.id });
    QUERY_SAMPLES.tag = c.links[0]!.tag;
    const up = await send('POST', `/api/v1/sites/${siteId}/files?name=seed.csv`, { body: CSV, type: 'text/csv' });
    expect(up.status).toBe(202);
    PATH_SAMPLES.uploadId = ((await up.json()) as { uploadId: string }).uploadId;
  });

  it('describes every route under src/pages/api/v1, every method it exports', () => {
    const inFiles = endpoints()
      .filter((e) => e.route.startsWith('/api/v1/'))
      .flatMap((e) => e.methods.map((m) => `${m} ${openApiPath(e.route)}`));
    const inDoc = operations(doc).map((o) => `${o.method} ${o.path}`);
    expect(inFiles.length).toBeGreaterThan(0);
    expect(inDoc.sort()).toEqual(inFiles.sort());
    for (const o of operations(doc)) {
      expect(o.op.summary, `${o.method} ${o.path}: fill spec.doc`).not.toMatch(/^(GET|POST|PUT|PATCH|DELETE) /);
      expect(Object.keys(o.op.responses).some((s) => s.startsWith('2')), `${o.method} ${o.path}: fill spec.answers`).toBe(true);
    }
  });

  it('answers every operation with a site token as the document describes', async () => {
    for (const o of sorted) {
      const body = await bodyOf(o);
      const statuses = [await check(o, await send(o.method, validRequest(o), body), `${o.method} ${o.path}`)];
      // Each value of an enum in the query (e.g. format=json|csv) is one more valid call.
      for (const p of paramsOf(o, 'query'))
        for (const v of p.schema?.enum ?? []) {
          const extra = ENUM_COMPANIONS[`${p.name}=${v}`] ?? {};
          statuses.push(await check(o, await send(o.method, validRequest(o, { [p.name]: v, ...extra }), await bodyOf(o)), `${o.method} ${o.path}?${p.name}=${v}`));
        }
      for (const s of statuses) expect(s, `${o.method} ${o.path}`).toBeLessThan(300);
    }
  });

  it('answers the errors of every operation as the document describes', async () => {
    for (const o of sorted) {
      const where = `${o.method} ${o.path}`;
      const secured = (o.op.security ?? []).length > 0;
      if (secured) expect(await check(o, await send(o.method, validRequest(o), { ...(await bodyOf(o)), token: null }), `${where} without a token`)).toBe(401);
      if (secured) expect(await check(o, await send(o.method, validRequest(o), { ...(await bodyOf(o)), token: 'llt_not-a-token' }), `${where} with a bad token`)).toBe(401);
      for (const p of paramsOf(o, 'path').filter((x) => (x.schema as { format?: string })?.format === 'uuid')) {
        // An id nobody has: 404, or 403 where the id names a site (a token acts on its own site only).
        const bad = validRequest(o).replace(PATH_SAMPLES[p.name]!, NOBODY);
        expect([403, 404], `${where} with ${p.name} nobody has`).toContain(await check(o, await send(o.method, bad, await bodyOf(o)), `${where} with ${p.name} nobody has`));
        const malformed = validRequest(o).replace(PATH_SAMPLES[p.name]!, 'not-an-id');
        expect([403, 404]).toContain(await check(o, await send(o.method, malformed, await bodyOf(o)), `${where} with a malformed ${p.name}`));
      }
      const query = paramsOf(o, 'query');
      if (query.some((p) => p.required)) {
        const bare = validRequest(o).split('?')[0]!;
        expect(await check(o, await send(o.method, bare, await bodyOf(o)), `${where} without its query`)).toBe(400);
      }
      for (const p of query.filter((x) => x.schema?.format === 'date-time' || x.schema?.enum)) {
        expect(await check(o, await send(o.method, validRequest(o, { [p.name]: 'yesterday-ish' }), await bodyOf(o)), `${where} with a bad ${p.name}`)).toBe(400);
      }
    }
  });

  it('answers a JSON body that is not what the operation takes with 400 in the document\'s shape', async () => {
    for (const o of sorted.filter((x) => x.op.requestBody?.content?.['application/json'])) {
      const res = await send(o.method, validRequest(o), { body: JSON.stringify({ format: 'something else' }), type: 'application/json' });
      expect(await check(o, res, `${o.method} ${o.path} with a wrong body`)).toBe(400);
    }
  });
});
