import { randomUUID } from 'node:crypto';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { unitHours } from '~/server/db/schema';
import { FIT_VIEW_POINTS, baselineFitView, fitDraft, getBaseline } from '~/server/services/baselines';
import { createSite, createUnit } from '~/server/services/plant';
import { thinEvenly } from '~/lib/views/thin';
import { describeIntegration } from '../support/integration';

/**
 * The baseline page's JSON stays small however long the reference period: a fit on four months of
 * hourly data (2,880 steady hours, invented) answers under 150 KB, because the scatter gets at most
 * FIT_VIEW_POINTS hours, evenly chosen. Bytes, not time: speed lives in benchmarks.
 */
const t0 = Date.UTC(2025, 0, 1, 0);
const HOUR = 3_600_000;
const N = 2880;
let unitId: string;

describeIntegration('baseline page size', () => {
  beforeAll(async () => {
    const site = await createSite({ name: `Bytes site ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    unitId = (await createUnit(site.id, { name: 'Feed pump bytes', kind: 'pump' })).id;
    const rows: (typeof unitHours.$inferInsert)[] = [];
    for (let i = 0; i < N; i++) {
      const load = 5 + 4 * Math.sin(i / 7) + (i % 13) / 13;
      const T0_K = 285 + 8 * Math.sin((2 * Math.PI * i) / 24);
      rows.push({
        unitId,
        hourStart: new Date(t0 + i * HOUR),
        state: 'steady',
        load,
        loadUnit: 'MW',
        T0_K,
        destruction_W: 1e5 + 5e3 * load + 300 * Math.sin(i * 1.3),
        efficiency: 0.8 - 0.002 * load + 0.001 * Math.sin(i * 0.7),
        modelVersion: 'test',
        inputsHash: `b${i}`,
      });
    }
    for (let i = 0; i < rows.length; i += 1000) await db().insert(unitHours).values(rows.slice(i, i + 1000));
  });

  it('self-consistency: the answer of GET /api/baselines/:id for 2,880 reference hours is under 150 KB', async () => {
    const draft = await fitDraft(unitId, { periodFrom: new Date(t0), periodTo: new Date(t0 + N * HOUR), terms: ['load', 'T_amb'] }, null);
    expect(draft.hours).toBe(N);
    const fit = await baselineFitView(draft.id);
    expect(fit.points).toHaveLength(FIT_VIEW_POINTS);
    expect(fit.totalPoints).toBe(N);
    const bytes = Buffer.byteLength(JSON.stringify({ baseline: await getBaseline(draft.id), fit }));
    console.log(`baseline answer: ${bytes} bytes for ${fit.points.length} of ${N} hours`);
    expect(bytes).toBeLessThan(150 * 1024);
  });
});

it('self-consistency: thinning keeps the first and last item and spreads the rest evenly', () => {
  const list = Array.from({ length: 1001 }, (_, i) => i);
  expect(thinEvenly(list, 11)).toEqual([0, 100, 200, 300, 400, 500, 600, 700, 800, 900, 1000]);
  expect(thinEvenly([1, 2, 3], 5)).toEqual([1, 2, 3]);
});
