/**
 * One bad stored hour never stops a site's recomputes: an hour in year 9999 (stored before uploads
 * checked their times) is left out and reported; an hour the engine cannot compute is stored as
 * suspect with the reason while the other hours are computed.
 */
import { and, asc, eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { plantUnits, tags, unitHours } from '~/server/db/schema';
import { writeTagHours } from '~/server/services/tag-hours';
import { handleComputeUnitHours } from '~/server/services/engine';
import { createSiteFromModel } from '~/server/services/plant-model';
import { describeIntegration } from '../support/integration';
import { uniqueName } from '../plant/support';
import { P_ATM_Pa, steadyHour, valveCase } from '../engine/cases';

const H = 3_600_000;
const H0 = Date.UTC(2025, 5, 3, 8);
let siteId: string;
let unitId: string;

async function writeHour(tag: string, hourMs: number, th: ReturnType<typeof steadyHour>) {
  const [t] = await db().select({ seq: tags.seq }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, tag)));
  const tagId = t?.seq ?? (await db().insert(tags).values({ siteId, name: tag }).returning({ seq: tags.seq }))[0]!.seq;
  await writeTagHours([{ tagId, hourStart: new Date(hourMs), ...th }]);
}

describeIntegration('compute-unit-hours with a bad stored hour', () => {
  const c = valveCase();
  beforeAll(async () => {
    const model = {
      format: 'lossline-plant-model',
      version: 1,
      site: { name: uniqueName('Bad hour works'), timeZone: 'UTC', p_atm_Pa: P_ATM_Pa, deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR', prices: [] },
      units: [{ name: c.id, kind: c.kind, parameters: c.parameters, ports: c.ports, links: c.links.map((l) => ({ port: l.port, quantity: l.quantity, tag: l.tag, unit: l.unit })) }],
    };
    siteId = (await createSiteFromModel(model)).siteId;
    unitId = (await db().select().from(plantUnits).where(eq(plantUnits.siteId, siteId)))[0]!.id;
    for (const l of c.links) for (let h = 0; h < 3; h++) await writeHour(l.tag, H0 + h * H, steadyHour(l.reading));
    for (const l of c.links) await writeHour(l.tag, Date.UTC(9999, 11, 31, 23), steadyHour(l.reading));
  });

  it('an hour in year 9999 is left out and reported; the real hours are computed, again and again', async () => {
    for (let run = 0; run < 2; run++) {
      const out = await handleComputeUnitHours({ siteId, fromMs: 0, toMs: Date.UTC(10000, 0, 1) });
      expect(out.outsideSaneSpan).toBeDefined();
      const rows = await db().select().from(unitHours).where(eq(unitHours.unitId, unitId)).orderBy(asc(unitHours.hourStart));
      expect(rows.map((r) => r.hourStart.getTime())).toEqual([H0, H0 + H, H0 + 2 * H]);
      expect(rows.every((r) => r.state === 'steady')).toBe(true);
    }
  });

  it('an hour with impossible readings is marked suspect with its reason; the hours around it are computed', async () => {
    for (const l of c.links) await writeHour(l.tag, H0 + 3 * H, steadyHour(l.reading));
    // Tag hours hold float4 (about 3.4e38 at most); an absurd reading as large as they can hold.
    await writeHour('PRV_IN_P', H0 + 3 * H, { ...steadyHour(1), mean: 3e38, min: 3e38, max: 3e38, std: 0 });
    for (const l of c.links) await writeHour(l.tag, H0 + 4 * H, steadyHour(l.reading));
    const out = await handleComputeUnitHours({ siteId, fromMs: H0, toMs: H0 + 5 * H });
    expect(out.computed).toBeGreaterThanOrEqual(2);
    const rows = await db().select().from(unitHours).where(eq(unitHours.unitId, unitId)).orderBy(asc(unitHours.hourStart));
    const byHour = new Map(rows.map((r) => [r.hourStart.getTime(), r]));
    expect(byHour.get(H0 + 3 * H)?.state).toBe('suspect');
    expect(byHour.get(H0 + 3 * H)?.reasons.length).toBeGreaterThan(0);
    expect(byHour.get(H0 + 4 * H)?.state).toBe('steady');
  });
});
