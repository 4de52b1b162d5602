/**
 * GET /api/v1/units/{unitId}/hours (JSON and CSV) and /hours/{hour}, called through the endpoint
 * modules with a signed-in person's or a site token's locals (the guard itself is walked by
 * tests/foundation/policy.test.ts).
 */
import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { GET as listHours } from '~/pages/api/v1/units/[unitId]/hours/index';
import { GET as oneHour } from '~/pages/api/v1/units/[unitId]/hours/[hour]';
import { db } from '~/server/db/client';
import { plantUnits, tags } from '~/server/db/schema';
import { writeTagHours } from '~/server/services/tag-hours';
import { handleComputeUnitHours } from '~/server/services/engine';
import { createSiteFromModel } from '~/server/services/plant-model';
import { expectClose } from '../support/expect-close';
import { describeIntegration } from '../support/integration';
import { uniqueName } from '../plant/support';
import { P_ATM_Pa, steadyHour, valveCase } from './cases';

const H = 3_600_000;
const H0 = Date.UTC(2024, 4, 2, 6);

type Locals = App.Locals;
const person: Locals = { user: { id: 'x', name: 'Olive Operator', email: 'o@example.test', role: 'operator' }, session: null, apiToken: null } as Locals;

function call(handler: typeof listHours, path: string, params: Record<string, string>, locals: Locals, headers: Record<string, string> = {}) {
  const url = new URL(path, 'http://127.0.0.1');
  return handler({ params, url, locals, request: new Request(url, { headers }) } as never) as Promise<Response>;
}

describeIntegration('unit hours API', () => {
  const c = valveCase();
  let siteId: string;
  let unitId: string;

  beforeAll(async () => {
    siteId = (
      await createSiteFromModel({
        format: 'lossline-plant-model',
        version: 1,
        site: { name: uniqueName('Engine API site'), timeZone: 'Europe/Berlin', p_atm_Pa: P_ATM_Pa, deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR', prices: [] },
        units: [{ name: 'PRV 1', kind: c.kind, parameters: c.parameters, ports: c.ports, links: c.links.map((l) => ({ port: l.port, quantity: l.quantity, tag: l.tag, unit: l.unit })) }],
      })
    ).siteId;
    [{ id: unitId }] = (await db().select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.siteId, siteId))) as [{ id: string }];
    const tagRows = await db().select().from(tags).where(eq(tags.siteId, siteId));
    for (const l of c.links) {
      const tagId = tagRows.find((t) => t.name === l.tag)!.seq;
      for (let h = 0; h < 2; h++) await writeTagHours([{ tagId, hourStart: new Date(H0 + h * H), ...steadyHour(l.reading) }]);
    }
    await handleComputeUnitHours({ siteId, fromMs: H0, toMs: H0 + 2 * H });
  });

  it('answers the hours as JSON with units in the field names', async () => {
    const res = await call(listHours, `/api/v1/units/${unitId}/hours?from=2024-05-02T00:00:00Z&to=2024-05-03T00:00:00Z`, { unitId }, person);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.unit).toEqual(expect.objectContaining({ id: unitId, name: 'PRV 1', kind: 'let-down-valve', timeZone: 'Europe/Berlin' }));
    expect(body.hours).toHaveLength(2);
    const h = body.hours[0];
    expect(h.hourStart).toBe(new Date(H0).toISOString());
    expect(Object.keys(h)).toEqual(expect.arrayContaining(['fuel_W', 'product_W', 'loss_W', 'destruction_W', 'efficiency', 'efficiency_U', 'destruction_U_W', 'closure_pct', 'state', 'reasons', 'modelVersion', 'inputsHash']));
    expect(h.detail).toBeUndefined();
    expectClose(h.destruction_W, c.expected.destruction_W, { rtol: 1e-3, label: c.source });
  });

  it('answers CSV for format=csv and for Accept: text/csv, the JSON field names as its header', async () => {
    const a = await call(listHours, `/api/v1/units/${unitId}/hours?from=2024-05-02T00:00:00Z&to=2024-05-03T00:00:00Z&format=csv`, { unitId }, person);
    const b = await call(listHours, `/api/v1/units/${unitId}/hours?from=2024-05-02T00:00:00Z&to=2024-05-03T00:00:00Z`, { unitId }, person, { accept: 'text/csv' });
    expect(a.headers.get('content-type')).toMatch(/^text\/csv/);
    const text = await a.text();
    expect(await b.text()).toBe(text);
    const lines = text.trimEnd().split('\r\n');
    expect(lines[0]).toBe(
      'hourStart,state,reasons,load,loadUnit,T0_K,p0_Pa,fuel_W,product_W,loss_W,destruction_W,efficiency,efficiency_U,destruction_U_W,closure_pct,entropyGeneration_W_per_K,destructionCost_per_h,currency,modelVersion,inputsHash,computedAt',
    );
    expect(lines).toHaveLength(3);
    const cells = lines[1]!.split(',');
    expectClose(Number(cells[10]), c.expected.destruction_W, { rtol: 1e-3 });
    // A number stays a number, negative or not.
    expect(Number.isFinite(Number(cells[14]))).toBe(true);
  });

  it('opens one hour with its audit trail, by ISO instant or ms', async () => {
    const iso = new Date(H0 + H).toISOString();
    const res = await call(oneHour, `/api/v1/units/${unitId}/hours/${iso}`, { unitId, hour: iso }, person);
    expect(res.status).toBe(200);
    const { hour } = await res.json();
    expect(hour.detail.ports.map((p: { name: string }) => p.name)).toEqual(['inlet', 'outlet']);
    expect(hour.detail.tagHours.map((t: { tag: string }) => t.tag)).toEqual(c.links.map((l) => l.tag).sort());
    const byMs = await call(oneHour, `/api/v1/units/${unitId}/hours/${H0 + H}`, { unitId, hour: String(H0 + H) }, person);
    expect((await byMs.json()).hour.inputsHash).toBe(hour.inputsHash);
    const none = await call(oneHour, `/api/v1/units/${unitId}/hours/2020-01-01T00:00:00Z`, { unitId, hour: '2020-01-01T00:00:00Z' }, person);
    expect(none.status).toBe(404);
  });

  it('admits a token of the unit\'s own site and refuses a token of another site', async () => {
    const path = `/api/v1/units/${unitId}/hours?from=2024-05-02T00:00:00Z&to=2024-05-03T00:00:00Z`;
    const own = await call(listHours, path, { unitId }, { user: null, session: null, apiToken: { id: 't', siteId, role: 'operator' } } as Locals);
    expect(own.status).toBe(200);
    const other = await call(listHours, path, { unitId }, { user: null, session: null, apiToken: { id: 't', siteId: '00000000-0000-4000-8000-000000000000', role: 'operator' } } as Locals);
    expect(other.status).toBe(403);
  });

  it('refuses a bad range and an unknown unit', async () => {
    expect((await call(listHours, `/api/v1/units/${unitId}/hours?from=2024-05-03T00:00:00Z&to=2024-05-02T00:00:00Z`, { unitId }, person)).status).toBe(400);
    expect((await call(listHours, `/api/v1/units/${unitId}/hours?from=yesterday&to=2024-05-02T00:00:00Z`, { unitId }, person)).status).toBe(400);
    expect((await call(listHours, `/api/v1/units/${unitId}/hours?from=2020-01-01T00:00:00Z&to=2024-05-02T00:00:00Z`, { unitId }, person)).status).toBe(400);
    const u = '00000000-0000-4000-8000-000000000000';
    expect((await call(listHours, `/api/v1/units/${u}/hours?from=2024-05-02T00:00:00Z&to=2024-05-03T00:00:00Z`, { unitId: u }, person)).status).toBe(404);
  });
});
