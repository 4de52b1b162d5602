import { beforeAll, expect, it } from 'vitest';
import { createPort, createSite, createUnit, siteStatus, unlinkedTags } from '~/server/services/plant';
import { endLink, linkHistory, linksForRange, linksValidAt, setLink } from '~/server/services/plant-links';
import { eq } from 'drizzle-orm';
import { AppError } from '~/server/errors';
import { db } from '~/server/db/client';
import { sites } from '~/server/db/schema';
import { openEndMs } from '~/server/services/plant-tx';
import { describeIntegration } from '../support/integration';
import { addTags, recomputeJobs, uniqueName } from './support';

const T = (iso: string) => new Date(iso);

describeIntegration('versioned tag links', () => {
  let siteId: string;
  let valveId: string;
  let pumpId: string;
  let inletId: string;
  let outletId: string;
  let tagIds: Map<string, string>;

  beforeAll(async () => {
    siteId = (await createSite({ name: uniqueName('Links test site'), timeZone: 'Europe/Berlin', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] })).id;
    valveId = (await createUnit(siteId, { name: 'PRV 1', kind: 'let-down-valve' })).id;
    pumpId = (await createUnit(siteId, { name: 'Pump 1', kind: 'pump', withPorts: true })).id;
    inletId = (await createPort(siteId, valveId, { name: 'in', slot: 'inlet', fluid: { kind: 'water' } })).id;
    outletId = (await createPort(siteId, valveId, { name: 'out', slot: 'outlet', fluid: { kind: 'water' } })).id;
    tagIds = await addTags(siteId, [
      { name: 'PRV_P_IN', unitHint: 'bar(g)' },
      { name: 'PRV_P_IN_NEW', unitHint: 'bar(g)' },
      { name: 'PRV_P_IN_SPARE', unitHint: 'bar(g)' },
      { name: 'PRV_T_IN', unitHint: '°C' },
      { name: 'PRV_F_IN', unitHint: 't/h' },
      { name: 'PRV_P_OUT', unitHint: 'barg' },
      { name: 'AMBIENT', unitHint: '°C' },
    ]);
  });

  it('a first link holds from the start and queues a recompute of every hour up to now, for its unit only', async () => {
    const out = await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'pressure', tagId: tagIds.get('PRV_P_IN')!, unit: 'barg' }, null);
    expect(out.link.validFrom.getTime()).toBe(0);
    expect(out.link.validTo).toBeNull();
    expect(out.link.uncertaintyMode).toBe('relative');
    expect(out.link.uncertainty).toBe(0.5); // common practice default for pressure
    const jobs = await recomputeJobs(siteId);
    expect(jobs).toEqual([{ siteId, fromMs: 0, toMs: openEndMs(), unitIds: [valveId] }]);
  });

  it('a change closes the version holding at its instant and queues exactly [validFrom, open end) for the unit', async () => {
    const t1 = T('2024-05-01T00:00:00Z');
    const n0 = (await recomputeJobs(siteId)).length;
    await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'pressure', tagId: tagIds.get('PRV_P_IN_NEW')!, unit: 'barg', validFrom: t1 }, null);
    const history = (await linkHistory(siteId, valveId)).filter((l) => l.quantity === 'pressure' && l.portId === inletId);
    expect(history.map((l) => [l.tagName, l.validFrom.toISOString(), l.validTo?.toISOString() ?? null])).toEqual([
      ['PRV_P_IN_NEW', '2024-05-01T00:00:00.000Z', null],
      ['PRV_P_IN', '1970-01-01T00:00:00.000Z', '2024-05-01T00:00:00.000Z'],
    ]);
    const jobs = (await recomputeJobs(siteId)).slice(n0);
    expect(jobs).toHaveLength(1);
    expect(jobs[0]!.fromMs).toBe(t1.getTime());
    expect(jobs[0]!.toMs).toBe(openEndMs());
    expect(jobs[0]!.unitIds).toEqual([valveId]);
  });

  it('a change dated between two versions runs until the next version and queues exactly that range', async () => {
    const t0 = T('2024-03-01T06:00:00Z');
    const t1 = T('2024-05-01T00:00:00Z');
    const n0 = (await recomputeJobs(siteId)).length;
    const out = await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'pressure', tagId: tagIds.get('PRV_P_IN_SPARE')!, unit: 'barg', validFrom: t0 }, null);
    expect(out.link.validTo?.toISOString()).toBe(t1.toISOString());
    expect((await recomputeJobs(siteId)).slice(n0)).toEqual([{ siteId, fromMs: t0.getTime(), toMs: t1.getTime(), unitIds: [valveId] }]);
  });

  it('linksValidAt answers, per instant, the version that held then', async () => {
    const tagAt = async (iso: string) =>
      (await linksValidAt(siteId, T(iso))).filter((l) => l.unitId === valveId && l.quantity === 'pressure' && l.portId === inletId).map((l) => l.tagName);
    expect(await tagAt('2024-01-15T00:00:00Z')).toEqual(['PRV_P_IN']);
    expect(await tagAt('2024-03-01T05:59:59Z')).toEqual(['PRV_P_IN']);
    expect(await tagAt('2024-03-01T06:00:00Z')).toEqual(['PRV_P_IN_SPARE']);
    expect(await tagAt('2024-04-30T23:00:00Z')).toEqual(['PRV_P_IN_SPARE']);
    expect(await tagAt('2024-05-01T00:00:00Z')).toEqual(['PRV_P_IN_NEW']);
    expect(await tagAt('2030-01-01T00:00:00Z')).toEqual(['PRV_P_IN_NEW']);
    const [one] = await linksValidAt(siteId, T('2024-04-01T00:00:00Z'));
    expect(one).toMatchObject({ unitName: 'PRV 1', unitKind: 'let-down-valve', portName: 'in', portSlot: 'inlet', engUnit: 'barg' });
  });

  it('linksForRange gives every version overlapping a range, and none outside it', async () => {
    const tags = async (from: string, to: string) =>
      (await linksForRange(siteId, T(from), T(to))).filter((l) => l.unitId === valveId).map((l) => l.tagName).sort();
    expect(await tags('2024-02-01T00:00:00Z', '2024-06-01T00:00:00Z')).toEqual(['PRV_P_IN', 'PRV_P_IN_NEW', 'PRV_P_IN_SPARE']);
    expect(await tags('2024-03-10T00:00:00Z', '2024-04-10T00:00:00Z')).toEqual(['PRV_P_IN_SPARE']);
    expect(await tags('2024-05-01T00:00:00Z', '2024-05-02T00:00:00Z')).toEqual(['PRV_P_IN_NEW']);
  });

  it('a wrong unit of measure is refused with its JSON path; nothing is written and nothing queued', async () => {
    const n0 = (await recomputeJobs(siteId)).length;
    const h0 = (await linkHistory(siteId, valveId)).length;
    const err = await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'temperature', tagId: tagIds.get('PRV_T_IN')!, unit: 'barg' }, null).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe('VALIDATION_FAILED');
    expect(err.issues.map((i: { path: string }) => i.path)).toEqual(['$.unit']);
    const err2 = await setLink(siteId, { unitId: valveId, portId: outletId, quantity: 'o2Fraction', tagId: tagIds.get('PRV_T_IN')!, unit: '%', basis: 'dry' }, null).catch((e) => e);
    expect(err2.issues.map((i: { path: string }) => i.path)).toEqual(['$.quantity']);
    expect((await linkHistory(siteId, valveId)).length).toBe(h0);
    expect((await recomputeJobs(siteId)).length).toBe(n0);
  });

  it('the unit becomes complete once its required links are in, and unlinked tags drop out of the list', async () => {
    const before = (await siteStatus(siteId)).get('PRV 1')!;
    expect(before.complete).toBe(false);
    expect((await unlinkedTags(siteId)).map((t) => t.name)).toContain('PRV_T_IN');
    await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'temperature', tagId: tagIds.get('PRV_T_IN')!, unit: 'degC' }, null);
    await setLink(siteId, { unitId: valveId, portId: inletId, quantity: 'massFlow', tagId: tagIds.get('PRV_F_IN')!, unit: 't/h' }, null);
    await setLink(siteId, { unitId: valveId, portId: outletId, quantity: 'pressure', tagId: tagIds.get('PRV_P_OUT')!, unit: 'barg' }, null);
    const after = (await siteStatus(siteId)).get('PRV 1')!;
    expect(after).toEqual({ complete: true, missing: [], conflicts: [] });
    const unlinked = (await unlinkedTags(siteId)).map((t) => t.name);
    expect(unlinked).toEqual(['AMBIENT', 'PRV_P_IN', 'PRV_P_IN_SPARE']);
    expect((await unlinkedTags(siteId, 'amb')).map((t) => t.name)).toEqual(['AMBIENT']);
    expect((await siteStatus(siteId)).get('Pump 1')!.complete).toBe(false);
  });

  it("the site's dead-state temperature tag is in use, so it is not listed as unlinked", async () => {
    expect((await unlinkedTags(siteId)).map((t) => t.name)).toContain('AMBIENT');
    await db().update(sites).set({ t0TagId: tagIds.get('AMBIENT')!, t0TagUnit: 'degC' }).where(eq(sites.id, siteId));
    expect((await unlinkedTags(siteId)).map((t) => t.name)).toEqual(['PRV_P_IN', 'PRV_P_IN_SPARE']);
    expect(await unlinkedTags(siteId, 'amb')).toEqual([]);
  });

  it('a temperature tag linked as a pressure shows as a conflict of the unit', async () => {
    await setLink(siteId, { unitId: pumpId, quantity: 'power', tagId: tagIds.get('PRV_T_IN')!, unit: 'kW' }, null);
    const status = (await siteStatus(siteId)).get('Pump 1')!;
    expect(status.conflicts.map((c) => c.code).sort()).toEqual(['TAG_HINT_OTHER_QUANTITY', 'TAG_ON_TWO_QUANTITIES']);
  });

  it('ending a link closes the version at that instant and queues [instant, open end) for its unit', async () => {
    const [current] = (await linksValidAt(siteId, new Date())).filter((l) => l.unitId === valveId && l.quantity === 'pressure' && l.portId === outletId);
    const t2 = T('2025-01-01T00:00:00Z');
    const n0 = (await recomputeJobs(siteId)).length;
    await endLink(siteId, current!.id, t2);
    expect((await recomputeJobs(siteId)).slice(n0)).toEqual([{ siteId, fromMs: t2.getTime(), toMs: openEndMs(), unitIds: [valveId] }]);
    expect((await linksValidAt(siteId, T('2024-12-31T23:00:00Z'))).some((l) => l.id === current!.id)).toBe(true);
    expect((await linksValidAt(siteId, t2)).some((l) => l.id === current!.id)).toBe(false);
    expect((await siteStatus(siteId)).get('PRV 1')!.missing.map((m) => `${m.port}:${m.quantities![0]}`)).toEqual(['out:pressure']);
  });
});
