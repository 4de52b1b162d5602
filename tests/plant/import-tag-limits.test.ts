/**
 * Tags' own limits (the model file's tags[]) through the database: a site made from a file stores
 * them on its tags (tags.flatline_limit_seconds, spread_limit, min_coverage), the model GET gives
 * them back, the model PUT changes them, answers the tags it changed, recomputes the units a changed
 * spread limit or coverage touches, and a file without the section puts every tag back to its defaults.
 */
import { beforeAll, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { db } from '~/server/db/client';
import { tags } from '~/server/db/schema';
import type { PlantModel } from '~/lib/plant';
import { ModelPutAnswer } from '~/lib/api/model';
import { writeTagHours } from '~/server/services/tag-hours';
import { linksForRange } from '~/server/services/plant-links';
import { createSiteFromModel, exportModel } from '~/server/services/plant-model';
import { GET as getModel, PUT as putModel } from '~/pages/api/v1/sites/[siteId]/model';
import { describeIntegration } from '../support/integration';
import { documentedExample } from './example';
import { recomputeJobs, siteSnapshot, tagSeq, uniqueName } from './support';

async function limitsOf(siteId: string, names: string[]) {
  const rows = await db()
    .select({ name: tags.name, id: tags.id, frozen_s: tags.flatlineLimitSeconds, spread: tags.spreadLimit, coverage: tags.minCoverage })
    .from(tags)
    .where(and(eq(tags.siteId, siteId), inArray(tags.name, names)));
  return Object.fromEntries(rows.map((r) => [r.name, r]));
}

describeIntegration('tags[] of the model file in the database', () => {
  let siteId: string;

  const ctx = (method: string, body?: unknown) =>
    ({
      params: { siteId },
      request: new Request(`http://test/api/v1/sites/${siteId}/model`, { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
      locals: { user: null, session: null, apiToken: { id: crypto.randomUUID(), siteId, role: 'admin' } },
    }) as never;
  const get = async () => (await (await getModel(ctx('GET'))).json()) as PlantModel;
  const put = async (file: unknown) => {
    const res = await putModel(ctx('PUT', file));
    return { status: res.status, body: await res.json() };
  };

  beforeAll(async () => {
    const file = documentedExample();
    file.site.name = uniqueName('Brackenfold limits');
    siteId = (await createSiteFromModel(file)).siteId;
    // tag hours, so that a change that touches the computed hours queues their recompute
    await writeTagHours([{ tagId: await tagSeq(siteId, 'B2_MS_P'), hourStart: new Date('2024-02-01T00:00:00Z'), samples: 60, coveredFraction: 1, mean: 40, min: 40, max: 40, std: 0 }]);
  });

  it('a site made from the documented example stores each listed limit on its tag, the defaults on the others', async () => {
    const t = await limitsOf(siteId, ['PRV_F', 'B2_STACK_O2', 'TG1_MW', 'B2_MS_P']);
    expect([t.PRV_F!.frozen_s, t.PRV_F!.spread, t.PRV_F!.coverage]).toEqual([172800, null, null]);
    expect([t.B2_STACK_O2!.frozen_s, t.B2_STACK_O2!.spread, t.B2_STACK_O2!.coverage]).toEqual([14400, 0.01, null]);
    expect([t.TG1_MW!.frozen_s, t.TG1_MW!.spread, t.TG1_MW!.coverage]).toEqual([14400, null, 0.9]);
    expect([t.B2_MS_P!.frozen_s, t.B2_MS_P!.spread, t.B2_MS_P!.coverage]).toEqual([14400, null, null]);
  });

  it('GET gives the file’s tags[] back; PUT of what GET gave changes nothing', async () => {
    const file = await get();
    expect(file.tags).toEqual(documentedExample().tags);
    const { site: _s, ...before } = await siteSnapshot(siteId); // the site row's updatedAt moves with every PUT
    const out = await put(file);
    expect(out.status).toBe(200);
    expect(ModelPutAnswer.parse(out.body).changed.tags).toEqual([]);
    const { site: _t, ...after } = await siteSnapshot(siteId);
    expect(after).toEqual(before);
    expect(await get()).toEqual(file);
  });

  it('PUT changes a frozen-value limit into tags.flatline_limit_seconds and answers the tag; a left-out entry goes back to 4 h', async () => {
    const file = await get();
    file.tags = [
      { name: 'B2_STACK_O2', spreadLimit: 0.01 },
      { name: 'TG1_MW', frozenLimit_s: 7200, minCoverage: 0.9 },
    ];
    const out = await put(file);
    expect(out.status).toBe(200);
    const t = await limitsOf(siteId, ['PRV_F', 'TG1_MW']);
    expect(t.PRV_F!.frozen_s).toBe(14400);
    expect(t.TG1_MW!.frozen_s).toBe(7200);
    expect(ModelPutAnswer.parse(out.body).changed.tags.sort()).toEqual([t.PRV_F!.id, t.TG1_MW!.id].sort());
    expect((await get()).tags).toEqual(file.tags);
    // a frozen-value limit is applied when files are read: no hour is computed again for it (TG1_MW's
    // minCoverage 0.9 is unchanged)
    expect(ModelPutAnswer.parse(out.body).recompute).toEqual([]);
  });

  it('a changed spread limit recomputes every hour with data of each unit that links the tag, and only those units', async () => {
    const file = await get();
    file.tags = [...(file.tags ?? []), { name: 'B2_MS_P', spreadLimit: 0.02 }];
    const n0 = (await recomputeJobs(siteId)).length;
    const out = ModelPutAnswer.parse((await put(file)).body);
    const jobs = (await recomputeJobs(siteId)).slice(n0);
    // B2_MS_P is linked by Boiler 2 (main steam) and by PRV 42/9 (HP side)
    const ids = [out.unitIds['Boiler 2']!.id, out.unitIds['PRV 42/9']!.id];
    expect(jobs.map((j) => j.unitIds![0]).sort()).toEqual(ids.sort());
    expect(jobs.every((j) => j.unitIds!.length === 1 && j.fromMs === Date.parse('2024-02-01T00:00:00Z'))).toBe(true);
    expect(out.recompute.map((j) => j.unitIds![0]).sort()).toEqual(ids.sort());
    expect((await limitsOf(siteId, ['B2_MS_P'])).B2_MS_P!.spread).toBe(0.02);
    // the engine reads the tag's limit with the links it computes by
    const links = (await linksForRange(siteId, new Date('2024-02-01T00:00:00Z'), new Date('2024-02-01T01:00:00Z'))).filter((l) => l.tagName === 'B2_MS_P');
    expect(links.map((l) => [l.unitName, l.tagSpreadLimit, l.tagMinCoverage]).sort()).toEqual([['Boiler 2', 0.02, null], ['PRV 42/9', 0.02, null]]);
  });

  it('a file without tags[] (written before the section) puts every tag back to its defaults and exports without the key', async () => {
    const file = await get();
    delete file.tags;
    const out = await put(file);
    expect(out.status).toBe(200);
    const t = await limitsOf(siteId, ['B2_STACK_O2', 'TG1_MW', 'B2_MS_P']);
    for (const row of Object.values(t)) expect([row.frozen_s, row.spread, row.coverage]).toEqual([14400, null, null]);
    expect('tags' in (await get())).toBe(false);
  });

  it('refuses a tag the file does not link with its path and a message naming it, changing nothing', async () => {
    const file = await get();
    file.tags = [{ name: 'TG1_MW', frozenLimit_s: 600 }, { name: 'NO_SUCH_TAG', frozenLimit_s: 600 }];
    const before = await siteSnapshot(siteId);
    const out = await put(file);
    expect(out.status).toBe(400);
    expect(out.body.error.code).toBe('VALIDATION_FAILED');
    expect(out.body.error.issues).toEqual([{ path: '$.tags[1].name', message: expect.stringContaining("'NO_SUCH_TAG'") }]);
    expect(await siteSnapshot(siteId)).toEqual(before);
  });
});
