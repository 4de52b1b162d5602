/**
 * The compute-unit-hours job end to end on a real database: a site from a model file (the plant
 * services), tag hours written directly for invented tags, the worker's handler, the stored rows.
 * Expected figures come from outside the engine (./cases.ts names each source).
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { plantUnits, tags, unitHours } from '~/server/db/schema';
import { writeTagHours } from '~/server/services/tag-hours';
import { computeUnitHours, handleComputeUnitHours } from '~/server/services/engine';
import { unitHourDetail } from '~/server/services/engine-results';
import { createSiteFromModel } from '~/server/services/plant-model';
import { setLink } from '~/server/services/plant-links';
import { expectClose } from '../support/expect-close';
import { describeIntegration } from '../support/integration';
import { recomputeJobs, uniqueName } from '../plant/support';
import { ALL_CASES, steadyHour } from './cases';
import { GAS_PRICE, POWER_PRICE, modelOf, unitNameOf } from './model-file';

const H = 3_600_000;
const H0 = Date.UTC(2024, 1, 12, 8);
const HOURS = 3;
const RTOL = 1e-3;

async function tagIdOf(siteId: string, name: string) {
  const [t] = await db().select({ seq: tags.seq }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, name)));
  if (t) return t.seq;
  const [n] = await db().insert(tags).values({ siteId, name }).returning({ seq: tags.seq });
  return n!.seq;
}

async function writeHour(siteId: string, tag: string, hourMs: number, th: ReturnType<typeof steadyHour>) {
  const tagId = await tagIdOf(siteId, tag);
  await writeTagHours([{ tagId, hourStart: new Date(hourMs), ...th }]);
}

async function rowsOf(unitId: string) {
  return db().select().from(unitHours).where(eq(unitHours.unitId, unitId)).orderBy(asc(unitHours.hourStart));
}

describeIntegration('compute-unit-hours on a real database', () => {
  const cases = ALL_CASES();
  let siteId: string;
  const unitId = new Map<string, string>();

  beforeAll(async () => {
    siteId = (await createSiteFromModel(modelOf(uniqueName('Engine test mill'), cases))).siteId;
    for (const u of await db().select().from(plantUnits).where(eq(plantUnits.siteId, siteId))) unitId.set(u.name, u.id);
    for (const c of cases) for (const l of c.links) for (let h = 0; h < HOURS; h++) await writeHour(siteId, l.tag, H0 + h * H, steadyHour(l.reading));
    const out = await handleComputeUnitHours({ siteId, fromMs: H0 - H, toMs: H0 + 10 * H });
    expect(out.computed).toBe(cases.length * HOURS);
    expect(out.written).toBe(cases.length * HOURS);
  });

  describe.each(cases)('$kind', (c) => {
    it(`stores each hour with destruction and efficiency within 0.1 % of ${c.source}`, async () => {
      const rows = await rowsOf(unitId.get(unitNameOf(c))!);
      expect(rows.map((r) => r.hourStart.getTime())).toEqual([H0, H0 + H, H0 + 2 * H]);
      for (const r of rows) {
        expect(r.state).toBe('steady');
        expectClose(r.destruction_W!, c.expected.destruction_W, { rtol: RTOL, label: `${c.id} destruction_W` });
        if (c.expected.efficiency === null) expect(r.efficiency).toBeNull();
        else expectClose(r.efficiency!, c.expected.efficiency, { rtol: RTOL, label: `${c.id} efficiency` });
        expect(r.destruction_U_W).toBeGreaterThan(0);
        expect(r.modelVersion).toMatch(/^[0-9a-f]{32}$/);
        expect(r.destructionCost_per_h).toBeGreaterThan(0);
      }
    });
  });

  it('self-consistency: every hour opened up is rebuilt on demand exactly as the engine produced it when it stored the hour', async () => {
    // Compute the site again from scratch, keeping what the engine produced for every hour.
    const ids = [...unitId.values()];
    await db().delete(unitHours).where(inArray(unitHours.unitId, ids));
    const produced = new Map<string, unknown>();
    const out = await computeUnitHours({ siteId, fromMs: H0 - H, toMs: H0 + 10 * H }, { sendDrift: false, onResult: (u, t, r) => produced.set(`${u}|${t}`, r) });
    expect(out.written).toBe(cases.length * HOURS);
    const stored = await db().select().from(unitHours).where(inArray(unitHours.unitId, ids));
    expect(stored.length).toBe(cases.length * HOURS);
    const ms: number[] = [];
    for (const row of stored) {
      const res = produced.get(`${row.unitId}|${row.hourStart.getTime()}`) as { detail: unknown; inputsHash: string };
      expect(res.inputsHash).toBe(row.inputsHash);
      const opened = await unitHourDetail(row.unitId, row.hourStart);
      expect(opened.rebuilt.matches).toBe(true);
      expect(opened.rebuilt.inputsHash).toBe(row.inputsHash);
      // The API answers JSON: compare as JSON.
      expect(JSON.parse(JSON.stringify(opened.detail))).toEqual(JSON.parse(JSON.stringify(res.detail)));
      ms.push(opened.rebuilt.ms);
    }
    console.log(`hour detail rebuilt on demand: ${stored.length} hours, median ${ms.sort((a, b) => a - b)[ms.length >> 1]} ms, max ${ms[ms.length - 1]} ms`);
    // A changed tag hour after the compute: the rebuilt hour says it is not the stored one.
    const turbine = unitId.get('turbine')!;
    const c = cases.find((x) => x.id === 'turbine')!;
    const l = c.links[0]!;
    await writeHour(siteId, l.tag, H0, { ...steadyHour(l.reading), mean: l.reading * 1.01 });
    const stale = await unitHourDetail(turbine, new Date(H0));
    expect(stale.rebuilt.matches).toBe(false);
    await writeHour(siteId, l.tag, H0, steadyHour(l.reading));
    expect((await unitHourDetail(turbine, new Date(H0))).rebuilt.matches).toBe(true);
  });

  it('prices the pump at the electricity price: 90 EUR/MWh x D (hand-worked: 16.918 kW -> 1.5226 EUR/h)', async () => {
    const [r] = await rowsOf(unitId.get('pump')!);
    expectClose(r!.destructionCost_per_h!, (POWER_PRICE * cases.find((c) => c.id === 'pump')!.expected.destruction_W) / 1e6, { rtol: RTOL });
  });

  it('self-consistency: the turbine pays for steam at the boiler\'s fuel exergy cost over its exergy efficiency of that hour', async () => {
    const [b] = await rowsOf(unitId.get('boiler')!);
    const [t] = await rowsOf(unitId.get('turbine')!);
    const cBoiler = b!.destructionCost_per_h! / (b!.destruction_W! * 3600); // [EUR/J]
    const cSteam = t!.destructionCost_per_h! / (t!.destruction_W! * 3600);
    expectClose(cSteam, cBoiler / b!.efficiency!, { rtol: 1e-9 });
    // The boiler's fuel: 30 EUR/MWh of LHV on an exergy basis (exergy/LHV of this gas about 1.04, docs/domain.md s.4).
    expect(cBoiler * 3.6e9).toBeGreaterThan(GAS_PRICE / 1.06);
    expect(cBoiler * 3.6e9).toBeLessThan(GAS_PRICE / 1.02);
  });

  it('queues check-drift for the units and hours it wrote', async () => {
    const res = await db().execute<{ data: { siteId: string; fromMs: number; toMs: number; unitIds: string[] } }>(
      sql`select data from pgboss.job where name = 'check-drift' and data->>'siteId' = ${siteId} order by created_on`,
    );
    expect(res.rows.length).toBeGreaterThanOrEqual(1);
    const d = res.rows[0]!.data;
    expect([d.fromMs, d.toMs]).toEqual([H0, H0 + HOURS * H]);
    expect([...d.unitIds].sort()).toEqual([...unitId.values()].sort());
  });

  it('the same inputs give the same rows: a second run writes nothing and keeps computedAt', async () => {
    const before = await db().select().from(unitHours).where(sql`${unitHours.unitId} in (select id from plant_units where site_id = ${siteId})`).orderBy(unitHours.unitId, unitHours.hourStart);
    const out = await handleComputeUnitHours({ siteId, fromMs: H0, toMs: H0 + HOURS * H });
    expect(out).toEqual(expect.objectContaining({ computed: cases.length * HOURS, written: 0, unchanged: cases.length * HOURS, touched: null }));
    const after = await db().select().from(unitHours).where(sql`${unitHours.unitId} in (select id from plant_units where site_id = ${siteId})`).orderBy(unitHours.unitId, unitHours.hourStart);
    expect(after).toEqual(before);
  });

  it('a link change recomputes exactly the hours it touches, for its unit', async () => {
    const valve = unitId.get('let down valve')!;
    const before = new Map((await db().select().from(unitHours)).filter((r) => [...unitId.values()].includes(r.unitId)).map((r) => [`${r.unitId}|${r.hourStart.getTime()}`, r]));
    // The valve's outlet pressure transmitter is replaced from the second hour on; the new one reads 4 barg (invented).
    for (let h = 1; h < HOURS; h++) await writeHour(siteId, 'PRV_OUT_P_NEW', H0 + h * H, steadyHour(4));
    const [outlet] = await db().execute<{ id: string }>(sql`select id from plant_ports where unit_id = ${valve} and name = 'outlet'`).then((r) => r.rows);
    const n0 = (await recomputeJobs(siteId)).length;
    await setLink(siteId, { unitId: valve, portId: outlet!.id, quantity: 'pressure', tag: 'PRV_OUT_P_NEW', unit: 'barg', validFrom: new Date(H0 + H) }, null);
    const jobs = (await recomputeJobs(siteId)).slice(n0);
    expect(jobs).toHaveLength(1);
    await new Promise((r) => setTimeout(r, 5));
    const out = await handleComputeUnitHours(jobs[0]!);
    expect(out.written).toBe(HOURS - 1);
    const after = (await db().select().from(unitHours)).filter((r) => [...unitId.values()].includes(r.unitId));
    const changed = after.filter((r) => {
      const b = before.get(`${r.unitId}|${r.hourStart.getTime()}`)!;
      return b.computedAt.getTime() !== r.computedAt.getTime() || b.inputsHash !== r.inputsHash;
    });
    expect(changed.map((r) => [r.unitId, r.hourStart.getTime()]).sort()).toEqual([
      [valve, H0 + H],
      [valve, H0 + 2 * H],
    ]);
    for (const r of changed) {
      expect(r.modelVersion).not.toBe(before.get(`${r.unitId}|${r.hourStart.getTime()}`)!.modelVersion);
      // 4 barg = 5.01325 bar(a) instead of 5 bar(a): a small change of the outlet state, but a change.
      expect(r.destruction_W).not.toBe(before.get(`${r.unitId}|${r.hourStart.getTime()}`)!.destruction_W);
    }
  });

  it('a frozen transmitter makes that hour suspect and says which tag', async () => {
    const pump = unitId.get('pump')!;
    const c = cases.find((x) => x.id === 'pump')!;
    const h = H0 + 3 * H;
    for (const l of c.links) await writeHour(siteId, l.tag, h, { ...steadyHour(l.reading), ...(l.tag === 'FWP_DIS_P' ? { flatline: true } : {}) });
    await handleComputeUnitHours({ siteId, fromMs: h, toMs: h + H, unitIds: [pump] });
    const row = (await rowsOf(pump)).find((r) => r.hourStart.getTime() === h)!;
    expect(row.state).toBe('suspect');
    expect(row.reasons[0]).toEqual(expect.objectContaining({ code: 'TAG_FROZEN', tag: 'FWP_DIS_P' }));
  });

  it('an hour whose data vanished from a tag is recomputed as suspect, not left as it was', async () => {
    const pump = unitId.get('pump')!;
    const h = H0 + 3 * H;
    await db().execute(sql`delete from tag_hours where hour_start = ${new Date(h).toISOString()}::timestamptz and tag_id = (select seq from tags where site_id = ${siteId} and name = 'FWP_KW')`);
    await handleComputeUnitHours({ siteId, fromMs: h, toMs: h + H, unitIds: [pump] });
    const row = (await rowsOf(pump)).find((r) => r.hourStart.getTime() === h)!;
    expect(row.reasons.map((r) => r.code)).toContain('TAG_MISSING');
    expect(row.destruction_W).toBeNull();
  });

  it('works a range month by month, one transaction each, clamped to the hours that have data', async () => {
    const pump = unitId.get('pump')!;
    const c = cases.find((x) => x.id === 'pump')!;
    const a = Date.UTC(2024, 2, 31, 23);
    const b = Date.UTC(2024, 3, 1, 0);
    for (const l of c.links) for (const h of [a, b]) await writeHour(siteId, l.tag, h, steadyHour(l.reading));
    const out = await handleComputeUnitHours({ siteId, fromMs: Date.UTC(2024, 2, 1), toMs: Date.UTC(2024, 5, 1), unitIds: [pump] });
    expect(out.chunks).toBe(2); // March (from its first hour of data) and April (to its last)
    expect(out.written).toBe(2);
    expect(out.touched).toEqual({ fromMs: a, toMs: b + H, unitIds: [pump] });
    const rows = (await rowsOf(pump)).filter((r) => r.hourStart.getTime() >= a);
    expect(rows.map((r) => [r.hourStart.getTime(), r.state])).toEqual([
      [a, 'steady'],
      [b, 'steady'],
    ]);
  });
});
