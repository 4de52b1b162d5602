/**
 * The drift check on the demo plant, end to end, for measuring what the demo's baselines show:
 * loads the demo (docs/demo.md) into the database of DATABASE_URL with the worker's handlers running
 * in this process, then, per unit with an active baseline, prints the AR(1) fit of its reference
 * residuals and the drift signals after the reference period, and writes the reference residuals to
 * a JSON file (for scripts/ar1-reference.py or a look by hand).
 *
 *   node --import tsx scripts/drift-demo-check.ts [--recompute] [--refit] [--out demo-residuals.json]
 *
 * --recompute computes every unit hour of the site again (after a change of the engine's method);
 * --refit fits and accepts a new baseline version per unit (so the fit of the current code is
 * stored) and waits for the drift check. Needs the test services (./docker-free-start.sh test-services).
 * Measurement aid, not part of the product; it never runs in tests.
 */
import { writeFileSync } from 'node:fs';
import { and, asc, eq, gte, isNotNull, lt, sql } from 'drizzle-orm';
import { QUEUES } from '~/jobs';
import { predict, type BaselineModel } from '~/lib/analytics/baseline';
import { fitAr1 } from '~/lib/analytics/autocorrelation';
import { closeDb, db } from '~/server/db/client';
import { baselines, driftPoints, plantUnits, sites, unitHours } from '~/server/db/schema';
import { queue, stopQueue } from '~/server/queue';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { handleComputeUnitHours } from '~/server/services/engine';
import { registerHandlers } from '~/worker/handlers';
import { DEMO_BASELINE_TERMS, loadDemo } from './demo/load';

const args = process.argv.slice(2);
const refit = args.includes('--refit');
const recompute = args.includes('--recompute');
const outAt = args.indexOf('--out');
const out = outAt >= 0 ? args[outAt + 1] : null;
const siteName = process.env.DEMO_SITE ?? 'Drift check demo';

async function pending(): Promise<number> {
  const res = await db().execute(sql`select count(*)::int as n from pgboss.job where state in ('created', 'retry', 'active') and name <> ${QUEUES.noticeDigest}`);
  return (res.rows[0] as { n: number }).n;
}

await registerHandlers(await queue());
const t0 = Date.now();
const report = await loadDemo({ siteName, days: Number(process.env.DEMO_DAYS ?? 365), seed: Number(process.env.DEMO_SEED ?? 7), waitTimeoutMs: 90 * 60_000 });
console.log(`loaded in ${((Date.now() - t0) / 1000).toFixed(0)} s: ${report.unitHours} unit hours, ${report.notices} notice(s)`);
const [site] = await db().select().from(sites).where(eq(sites.name, siteName));
const units = await db().select().from(plantUnits).where(eq(plantUnits.siteId, site!.id)).orderBy(asc(plantUnits.name));
if (recompute) {
  const t1 = Date.now();
  const res = await handleComputeUnitHours({ siteId: site!.id, fromMs: Date.UTC(2024, 0, 1), toMs: Date.UTC(2027, 0, 1) });
  console.log(`recomputed in ${((Date.now() - t1) / 1000).toFixed(0)} s: ${res.computed} unit hours, ${res.written} written`);
  const states = await db().execute(sql`select u.name, h.state, count(*)::int as n from unit_hours h join plant_units u on u.id = h.unit_id where u.site_id = ${site!.id} group by 1, 2 order by 1, 2`);
  console.log(states.rows.map((r) => `${r.name} ${r.state} ${r.n}`).join('; '));
}
if (refit) {
  for (const u of units) {
    const [b] = await db().select().from(baselines).where(and(eq(baselines.unitId, u.id), eq(baselines.status, 'active')));
    if (!b) continue;
    const d = await fitDraft(u.id, { periodFrom: b.periodFrom, periodTo: b.periodTo, terms: DEMO_BASELINE_TERMS, note: 'refit by scripts/drift-demo-check.ts' }, null);
    await acceptBaseline(d.id, null);
  }
  for (let i = 0; (await pending()) > 0 && i < 3600; i++) await new Promise((r) => setTimeout(r, 1000));
}
const dump: Record<string, { hourStartMs: number[]; residual_W: number[] }> = {};
for (const u of units) {
  const [b] = await db().select().from(baselines).where(and(eq(baselines.unitId, u.id), eq(baselines.status, 'active')));
  if (!b) {
    console.log(`${u.name}: no baseline`);
    continue;
  }
  const m = b.destructionModel as BaselineModel;
  const hs = await db()
    .select({ t: unitHours.hourStart, load: unitHours.load, T0: unitHours.T0_K, D: unitHours.destruction_W })
    .from(unitHours)
    .where(and(eq(unitHours.unitId, u.id), eq(unitHours.state, 'steady'), gte(unitHours.hourStart, b.periodFrom), lt(unitHours.hourStart, b.periodTo), isNotNull(unitHours.load), isNotNull(unitHours.T0_K), isNotNull(unitHours.destruction_W)))
    .orderBy(asc(unitHours.hourStart));
  const t = hs.map((h) => h.t.getTime());
  const r = hs.map((h) => h.D! - predict(m, h.load!, h.T0!));
  dump[u.name] = { hourStartMs: t, residual_W: r };
  const fit = fitAr1(r, t);
  const sig = await db()
    .select({ t: driftPoints.hourStart, signal: driftPoints.signal, x: driftPoints.x })
    .from(driftPoints)
    .where(and(eq(driftPoints.unitId, u.id), isNotNull(driftPoints.signal)))
    .orderBy(asc(driftPoints.hourStart));
  const [{ n }] = (await db().select({ n: sql<number>`count(*)::int` }).from(driftPoints).where(eq(driftPoints.unitId, u.id))) as [{ n: number }];
  console.log(
    `${u.name}: ${hs.length} reference hours, s = ${(m.stats.s / 1e3).toFixed(2)} kW, stored phi = ${m.stats.phi ?? 'none'}; ` +
      `fit phi = ${fit.phi.toFixed(3)} on ${fit.pairs} pairs, innovation spread ${(fit.sInnovation / 1e3).toFixed(2)} kW; ` +
      `${n} checked hours, signals: ${sig.map((s) => `${s.t.toISOString().slice(0, 13)} ${s.signal}`).join(', ') || 'none'}`,
  );
}
if (out) writeFileSync(out, JSON.stringify(dump));
await stopQueue().catch(() => undefined);
await closeDb().catch(() => undefined);
process.exit(0);
