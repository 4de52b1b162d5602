import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { writeTagHours } from '~/server/services/tag-hours';
import type { PlantModel } from '~/lib/plant';
import { createSite, siteStatus } from '~/server/services/plant';
import { createSiteFromModel, exportModel, firstLinkDifferenceMs, importModel } from '~/server/services/plant-model';
import { AppError } from '~/server/errors';
import { openEndMs } from '~/server/services/plant-tx';
import { issueApiToken } from '~/server/tokens';
import { GET as getModel, PUT as putModel } from '~/pages/api/v1/sites/[siteId]/model';
import { describeIntegration } from '../support/integration';
import { documentedExample } from './example';
import { recomputeJobs, siteSnapshot, tagId, tagSeq, uniqueName } from './support';

const clone = <T>(x: T): T => structuredClone(x);

function example(name: string): PlantModel {
  const m = documentedExample();
  m.site.name = name;
  return m;
}

describeIntegration('plant model import and export', () => {
  let siteId: string;
  let name: string;

  beforeAll(async () => {
    name = uniqueName('Brackenfold test');
    siteId = (await createSiteFromModel(example(name))).siteId;
  });

  it('creates a site from the documented example: atmosphere from the elevation, defaults filled, every unit complete', async () => {
    const out = await exportModel(siteId);
    expect(out.site.name).toBe(name);
    // U.S. Standard Atmosphere 1976 at 85 m (formula of src/lib/plant/atmosphere.ts), to 0.1 Pa.
    expect(out.site.p_atm_Pa).toBeCloseTo(100308.1, 1);
    expect(out.units.map((u) => u.name)).toEqual(['Boiler 2', 'Feed pump A', 'PRV 42/9', 'TG1']);
    const tg1 = out.units.find((u) => u.name === 'TG1')!;
    expect(tg1.parameters).toMatchObject({ generatorEfficiency: 0.965, wetExhaustMethod: 'energy-balance', spreadLimit: 0.05 });
    expect(tg1.links.find((l) => l.tag === 'TG1_IN_T')!.uncertainty).toEqual({ mode: 'absolute', value: 1 }); // common practice default
    const steamFlow = out.units[0]!.links.filter((l) => l.port === 'main steam' && l.quantity === 'massFlow');
    expect(steamFlow.map((l) => [l.tag, l.validFrom ?? null, l.validTo ?? null])).toEqual([
      ['B2_MS_F_OLD', null, '2024-03-04T06:00:00.000Z'],
      ['B2_MS_F', '2024-03-04T06:00:00.000Z', null],
    ]);
    const status = await siteStatus(siteId);
    for (const [unit, s] of status) expect({ unit, ...s }).toEqual({ unit, complete: true, missing: [], conflicts: [] });
  });

  it('round trip: export, import, export again gives the same file, and changes no row', async () => {
    const first = await exportModel(siteId);
    const before = await siteSnapshot(siteId);
    await importModel(siteId, JSON.parse(JSON.stringify(first)));
    const second = await exportModel(siteId);
    expect(second).toEqual(first);
    expect(JSON.stringify(second)).toBe(JSON.stringify(first));
    const after = await siteSnapshot(siteId);
    expect(after.links.map((l) => l.id)).toEqual(before.links.map((l) => l.id));
    expect(after.units.map((u) => u.id)).toEqual(before.units.map((u) => u.id));
    expect(after.jobs).toEqual(before.jobs);
  });

  it('round trip into a new site: its export equals the first but for the name', async () => {
    const first = await exportModel(siteId);
    const copy = clone(first);
    copy.site.name = uniqueName('Brackenfold copy');
    const { siteId: other } = await createSiteFromModel(copy);
    expect(await exportModel(other)).toEqual(copy);
  });

  const at = (m: PlantModel, tag: string) => m.units[0]!.links.findIndex((l) => l.tag === tag);
  const bad: { name: string; edit: (m: PlantModel & Record<string, unknown>) => void; path: string | ((m: PlantModel) => string) }[] = [
    { name: 'a wrong format', edit: (m) => void (m.format = 'spreadsheet' as never), path: '$.format' },
    { name: 'an unknown field in a port', edit: (m) => void ((m.units[1]!.ports[0] as Record<string, unknown>).colour = 'blue'), path: '$.units[1].ports[0].colour' },
    { name: 'a pressure in degC', edit: (m) => void (m.units[2]!.links[0]!.unit = 'degC'), path: '$.units[2].links[0].unit' },
    { name: 'a link to a missing port', edit: (m) => void (m.units[3]!.links[1]!.port = 'nozzle'), path: '$.units[3].links[1].port' },
    {
      name: 'overlapping versions',
      edit: (m) => void (m.units[0]!.links[at(m, 'B2_MS_F_OLD')]!.validTo = '2024-06-01T00:00:00.000Z'),
      path: (m) => `$.units[0].links[${at(m, 'B2_MS_F')}].validFrom`,
    },
    { name: 'an unknown kind', edit: (m) => void (m.units[1]!.kind = 'boat' as never), path: '$.units[1].kind' },
    { name: 'a bad time zone', edit: (m) => void (m.site.timeZone = 'Mars/Olympus'), path: '$.site.timeZone' },
  ];
  it.each(bad)('refuses $name with its JSON path and leaves the database as it was', async ({ edit, path }) => {
    const file = clone(await exportModel(siteId)) as PlantModel & Record<string, unknown>;
    file.units[3]!.parameters.generatorEfficiency = 0.9; // a valid change that must not land either
    edit(file);
    const before = await siteSnapshot(siteId);
    const err = await importModel(siteId, file).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe('VALIDATION_FAILED');
    expect(err.issues.map((i: { path: string }) => i.path)).toContain(typeof path === 'string' ? path : path(file));
    expect(await siteSnapshot(siteId)).toEqual(before);
  });

  it('refuses a name another site has (a check against the database) with its path, changing nothing', async () => {
    const taken = uniqueName('Taken name');
    await createSite({ name: taken, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    const file = await exportModel(siteId);
    file.site.name = taken;
    file.units[1]!.parameters.minLoad_W = 1;
    const before = await siteSnapshot(siteId);
    const err = await importModel(siteId, file).catch((e) => e);
    expect(err.issues).toEqual([{ path: '$.site.name', message: `Another site is named '${taken}'.` }]);
    expect(await siteSnapshot(siteId)).toEqual(before);
  });

  it('an import that changes one link queues a recompute of that unit only, from the change on', async () => {
    // Give the site tag hours, so there is something to recompute.
    await writeTagHours([{ tagId: await tagSeq(siteId, 'TG1_MW'), hourStart: new Date('2024-01-01T00:00:00Z'), samples: 60, coveredFraction: 1, mean: null, min: null, max: null, std: null }]);
    const file = await exportModel(siteId);
    const tg1 = file.units.find((u) => u.name === 'TG1')!;
    const power = tg1.links.find((l) => l.quantity === 'power')!;
    power.validTo = '2024-06-01T00:00:00.000Z';
    tg1.links.push({ quantity: 'power', tag: 'TG1_MW_NEW', unit: 'kW', uncertainty: { mode: 'relative', value: 0.5 }, validFrom: '2024-06-01T00:00:00.000Z' });
    const n0 = (await recomputeJobs(siteId)).length;
    const out = await importModel(siteId, file);
    const jobs = (await recomputeJobs(siteId)).slice(n0);
    const unitId = (await siteSnapshot(siteId)).units.find((u) => u.name === 'TG1')!.id;
    expect(jobs).toEqual([{ siteId, fromMs: Date.parse('2024-06-01T00:00:00Z'), toMs: openEndMs(), unitIds: [unitId] }]);
    expect(out.recompute).toEqual(jobs);
    const again = await exportModel(siteId);
    expect(again.units.find((u) => u.name === 'TG1')!.links.filter((l) => l.quantity === 'power').map((l) => l.tag)).toEqual(['TG1_MW', 'TG1_MW_NEW']);
  });

  it('self-consistency: the first difference between two link histories', () => {
    const a = { quantity: 'power' as const, tag: 'A', unit: 'kW' };
    expect(firstLinkDifferenceMs([a], [a])).toBeNull();
    expect(firstLinkDifferenceMs([a], [{ ...a, validTo: '2024-02-01T00:00:00Z' }, { ...a, tag: 'B', validFrom: '2024-02-01T00:00:00Z' }])).toBe(Date.parse('2024-02-01T00:00:00Z'));
    expect(firstLinkDifferenceMs([], [{ ...a, validFrom: '2024-03-01T00:00:00Z' }])).toBe(Date.parse('2024-03-01T00:00:00Z'));
    expect(firstLinkDifferenceMs([{ ...a, unit: 'MW' }], [a])).toBe(0);
  });

  it('the model endpoint: GET exports, PUT answers 400 with paths, and a token of another site is refused', async () => {
    const ctx = (method: string, body?: unknown, apiToken: App.Locals['apiToken'] = null) =>
      ({
        params: { siteId },
        request: new Request(`http://test/api/v1/sites/${siteId}/model`, { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
        locals: { user: null, session: null, apiToken },
      }) as never;
    const got = await getModel(ctx('GET'));
    expect(got.status).toBe(200);
    const file = (await got.json()) as PlantModel;
    expect(file.format).toBe('lossline-plant-model');
    file.units[2]!.links[0]!.unit = 'degC';
    const res = await putModel(ctx('PUT', file));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.code).toBe('VALIDATION_FAILED');
    expect(body.error.issues.map((i: { path: string }) => i.path)).toEqual(['$.units[2].links[0].unit']);
    const other = await createSite({ name: uniqueName('Other site'), timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    const token = await issueApiToken({ siteId: other.id, name: 'ci', role: 'admin', createdBy: null });
    const foreign = await putModel(ctx('PUT', await exportModel(siteId), { id: token.id, siteId: other.id, role: 'admin' }));
    expect(foreign.status).toBe(403);
    const own = await putModel(ctx('PUT', await exportModel(siteId), { id: token.id, siteId, role: 'admin' }));
    expect(own.status).toBe(200);
  });
});
