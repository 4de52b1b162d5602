/**
 * Every read of /api/v1 about a site, called with a site token's locals against the test database,
 * each answer parsed with the schema its route declares (src/lib/api); the model PUT's ids and
 * renames; paging of uploads by cursor. The guard itself is walked by tests/foundation/policy.test.ts.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { z } from 'zod';
import { GET as siteGet } from '~/pages/api/v1/sites/[siteId]/index';
import { GET as unitsGet } from '~/pages/api/v1/sites/[siteId]/units';
import { GET as noticesGet } from '~/pages/api/v1/sites/[siteId]/notices';
import { GET as baselinesGet } from '~/pages/api/v1/sites/[siteId]/baselines';
import { GET as uploadsGet } from '~/pages/api/v1/sites/[siteId]/uploads';
import { GET as ledgerGet } from '~/pages/api/v1/sites/[siteId]/ledger';
import { GET as stateGet } from '~/pages/api/v1/sites/[siteId]/state';
import { GET as modelGet, PUT as modelPut } from '~/pages/api/v1/sites/[siteId]/model';
import { GET as uploadGet } from '~/pages/api/v1/uploads/[uploadId]';
import { GET as hoursGet } from '~/pages/api/v1/units/[unitId]/hours/index';
import { GET as tagHoursGet } from '~/pages/api/v1/sites/[siteId]/tag-hours';
import { SiteAnswer, UnitsPage } from '~/lib/api/sites';
import { NoticesPage } from '~/lib/api/notices';
import { BaselinesPage } from '~/lib/api/baselines';
import { UploadItem, UploadsPage } from '~/lib/api/uploads';
import { LedgerAnswerSchema } from '~/lib/api/ledger';
import { SiteStateAnswer } from '~/lib/api/state';
import { ModelFileAnswer, ModelPutAnswer } from '~/lib/api/model';
import { TagHoursAnswer, UnitHoursAnswer } from '~/lib/api/hours';
import type { Endpoint } from '~/server/endpoint';
import { db } from '~/server/db/client';
import { createSiteFromModel } from '~/server/services/plant-model';
import { describeIntegration } from '../support/integration';
import { uniqueName } from '../plant/support';
import { valveCase } from '../engine/cases';

type Locals = App.Locals;
const tokenOf = (siteId: string): Locals => ({ user: null, session: null, apiToken: { id: crypto.randomUUID(), siteId, role: 'operator' }, sites: [] }) as unknown as Locals;

async function call(handler: Endpoint, path: string, params: Record<string, string>, locals: Locals, init: RequestInit = {}) {
  const url = new URL(path, 'http://127.0.0.1');
  return (await handler({ params, url, locals, request: new Request(url, init) } as never)) as Response;
}

async function parsed<S extends z.ZodType>(schema: S, res: Response): Promise<z.output<S>> {
  const body = await res.json();
  if (res.status >= 300) throw new Error(`${res.status}: ${JSON.stringify(body)}`);
  return schema.parse(body);
}

describeIntegration('the reads of /api/v1 with a site token', () => {
  const c = valveCase();
  let siteId = '';
  let otherSiteId = '';
  let unitId = '';
  let model: Record<string, unknown>;
  const uploadIds: string[] = [];

  beforeAll(async () => {
    model = {
      format: 'lossline-plant-model',
      version: 1,
      site: { name: uniqueName('API v1 site'), timeZone: 'Europe/Berlin', deadState: { T0_K: 288.15, p0_Pa: 101325 }, currency: 'EUR', prices: [] },
      units: [{ name: 'PRV 1', kind: c.kind, parameters: c.parameters, ports: c.ports, links: c.links.map((l) => ({ port: l.port, quantity: l.quantity, tag: l.tag, unit: l.unit })) }],
    };
    const created = await createSiteFromModel(model);
    siteId = created.siteId;
    unitId = created.unitIds['PRV 1']!.id;
    expect(created.created.units).toEqual([unitId]);
    otherSiteId = (await createSiteFromModel({ ...model, site: { ...(model.site as object), name: uniqueName('API v1 other') } })).siteId;
    for (let i = 0; i < 5; i++) {
      const r = await db().execute<{ id: string }>(
        sql`insert into uploads (site_id, file_name, object_key, source, status) values (${siteId}, ${`f${i}.csv`}, ${`k/${siteId}/${i}`}, 'api', 'done') returning id`,
      );
      uploadIds.push(r.rows[0]!.id);
    }
    await db().execute(
      sql`insert into drift_notices (site_id, unit_id, direction, onset_hour, signal_hour, last_signal_hour, hours, extra_w, expected_w, shift_sigma, currency, k, h) values (${siteId}, ${unitId}, 'up', now(), now(), now(), 5, 1000, 5000, 3, 'EUR', 0.5, 5)`,
    );
  });

  afterAll(async () => {
    for (const id of [siteId, otherSiteId].filter(Boolean)) {
      await db().execute(sql`delete from drift_notices where site_id = ${id}`);
      await db().execute(sql`delete from uploads where site_id = ${id}`);
      await db().execute(sql`delete from sites where id = ${id}`);
    }
  });

  it('answers the site with its settings in the model file’s names (deadState), as the schema says', async () => {
    const site = await parsed(SiteAnswer, await call(siteGet, `/api/v1/sites/${siteId}`, { siteId }, tokenOf(siteId)));
    expect(site.id).toBe(siteId);
    expect(site.settings.deadState).toEqual({ T0_K: 288.15, p0_Pa: 101325 });
    const file = await parsed(ModelFileAnswer, await call(modelGet, `/api/v1/sites/${siteId}/model`, { siteId }, tokenOf(siteId)));
    expect(site.settings).toEqual(file.site);
  });

  it('refuses a token of another site with 403 in the error shape', async () => {
    const res = await call(siteGet, `/api/v1/sites/${siteId}`, { siteId }, tokenOf(otherSiteId));
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe('FORBIDDEN');
  });

  it('answers the units with the ids of unit, ports and link versions', async () => {
    const page = await parsed(UnitsPage, await call(unitsGet, `/api/v1/sites/${siteId}/units`, { siteId }, tokenOf(siteId)));
    expect(page.nextCursor).toBeNull();
    expect(page.items.map((u) => [u.name, u.id, u.kind])).toEqual([['PRV 1', unitId, c.kind]]);
    expect(page.items[0]!.ports.map((p) => p.name)).toEqual(c.ports.map((p) => p.name));
    expect(page.items[0]!.links).toHaveLength(c.links.length);
    expect(new Set(page.items[0]!.links.map((l) => l.id)).size).toBe(c.links.length);
  });

  it('answers notices, baselines, ledger and state as their schemas say', async () => {
    const notices = await parsed(NoticesPage, await call(noticesGet, `/api/v1/sites/${siteId}/notices?status=not-closed`, { siteId }, tokenOf(siteId)));
    expect(notices.items.map((n) => n.unitId)).toEqual([unitId]);
    const baselines = await parsed(BaselinesPage, await call(baselinesGet, `/api/v1/sites/${siteId}/baselines`, { siteId }, tokenOf(siteId)));
    expect(baselines.items).toEqual([{ unitId, unitName: 'PRV 1', unitKind: c.kind, active: null }]);
    const ledger = await parsed(LedgerAnswerSchema, await call(ledgerGet, `/api/v1/sites/${siteId}/ledger?range=custom&from=2024-05-01&to=2024-05-03`, { siteId }, tokenOf(siteId)));
    expect(ledger.rows.map((r) => r.unitId)).toEqual([unitId]);
    const state = await parsed(SiteStateAnswer, await call(stateGet, `/api/v1/sites/${siteId}/state`, { siteId }, tokenOf(siteId)));
    expect(state.siteId).toBe(siteId);
    expect(typeof state.settled).toBe('boolean');
    const hours = await parsed(UnitHoursAnswer, await call(hoursGet, `/api/v1/units/${unitId}/hours?from=2024-05-01T00:00:00Z&to=2024-05-02T00:00:00Z`, { unitId }, tokenOf(siteId)));
    expect(hours.unit.id).toBe(unitId);
    const tag = c.links[0]!.tag;
    const tagHours = await parsed(TagHoursAnswer, await call(tagHoursGet, `/api/v1/sites/${siteId}/tag-hours?tag=${encodeURIComponent(tag)}&from=2024-05-01T00:00:00Z&to=2024-05-02T00:00:00Z`, { siteId }, tokenOf(siteId)));
    expect(tagHours.tag.name).toBe(tag);
  });

  it('pages the uploads newest first by cursor, each once; a bad cursor answers 400 naming it', async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const q: string = cursor ? `&cursor=${cursor}` : '';
      const page: z.output<typeof UploadsPage> = await parsed(UploadsPage, await call(uploadsGet, `/api/v1/sites/${siteId}/uploads?limit=2${q}`, { siteId }, tokenOf(siteId)));
      expect(page.items.length).toBeLessThanOrEqual(2);
      seen.push(...page.items.map((u) => u.uploadId));
      cursor = page.nextCursor;
    } while (cursor);
    expect([...seen].sort()).toEqual([...uploadIds].sort());
    expect(seen[0]).toBe(uploadIds[4]);
    const one = await parsed(UploadItem, await call(uploadGet, `/api/v1/uploads/${uploadIds[0]}`, { uploadId: uploadIds[0]! }, tokenOf(siteId)));
    expect(one.fileName).toBe('f0.csv');
    const bad = await call(uploadsGet, `/api/v1/sites/${siteId}/uploads?cursor=abc`, { siteId }, tokenOf(siteId));
    expect(bad.status).toBe(400);
    const err = (await bad.json()).error;
    expect(err.code).toBe('VALIDATION_FAILED');
    expect(err.issues[0].path).toBe('cursor');
  });

  it('the model PUT answers what it created and changed by id, and says when it renamed the site', async () => {
    const admin = { ...tokenOf(siteId), apiToken: { id: crypto.randomUUID(), siteId, role: 'admin' } } as unknown as Locals;
    const newName = uniqueName('API v1 renamed');
    const file = structuredClone(model) as { site: { name: string }; units: { name: string; description?: string }[] };
    file.site.name = newName;
    file.units[0]!.description = 'Let-down to the 9 bar header';
    const put = (body: unknown) => call(modelPut, `/api/v1/sites/${siteId}/model`, { siteId }, admin, { method: 'PUT', body: JSON.stringify(body), headers: { 'content-type': 'application/json' } });
    const out = await parsed(ModelPutAnswer, await put(file));
    expect(out.renamed).toEqual([expect.objectContaining({ what: 'site', id: siteId, from: (model.site as { name: string }).name, to: newName })]);
    expect(out.changed.units).toEqual([unitId]);
    expect(out.created).toEqual({ units: [], ports: [], links: [], tags: [] });
    expect(out.unitIds['PRV 1']!.id).toBe(unitId);
    expect(out.units).toBe(1);
    const again = await parsed(ModelPutAnswer, await put(file));
    expect(again.renamed).toEqual([]);
    expect(again.changed).toEqual({ units: [], ports: [], tags: [] });
    const [{ name }] = (await db().execute<{ name: string }>(sql`select name from sites where id = ${siteId}`)).rows as [{ name: string }];
    expect(name).toBe(newName);
  });
});
