/**
 * The drift check (job "check-drift"): per unit with an active baseline, the tabular CUSUM of Page
 * (1954) on the residuals of exergy destruction against the baseline, continued hour by hour from the
 * state saved in drift_points. Hourly residuals are serially correlated, so the CUSUM input x is the
 * residual's standardised AR(1) innovation with the phi and innovation spread fitted on the baseline's
 * reference period (src/lib/analytics/autocorrelation.ts; docs/domain.md section 7); a baseline saved
 * before phi was stored counts as phi = 0 (x = residual / s, as before). A signal opens a drift notice
 * (one open per unit and direction) and queues its mail in the same transaction.
 *
 * Re-runs are idempotent: every steady hour has one row keyed by unit and hour; a check over hours
 * that were already seen deletes the rows from the first affected hour on and recomputes them from
 * the state just before, so changed earlier hours flow through and unchanged ones give the same rows.
 */
import { and, asc, desc, eq, gt, gte, inArray, isNotNull, lt, ne, sql } from 'drizzle-orm';
import { z } from 'zod';
import { CheckDriftPayload, QUEUES, sendJob } from '~/jobs';
import { predict, type BaselineModel } from '~/lib/analytics/baseline';
import { ar1Innovation, type Ar1Model } from '~/lib/analytics/autocorrelation';
import { DRIFT_CHECK_DEFAULTS, cusumInit, cusumStep, type CusumState, type DriftSignal } from '~/lib/analytics/drift';
import { baselines, driftNotices, driftPoints, driftSettings, plantUnits, unitHours } from '../db/schema';
import { queue } from '../queue';
import { db } from '../db/client';
import { isId } from '../access';
import { AppError } from '../errors';
import { inInsightTx, type Tx } from './drift-tx';
import { reconcileNotices } from './notice-life';
import { usableSteadyHour } from './baselines-read';
import { HOUR_MS } from '~/lib/time';


/**
 * CUSUM defaults on the standardised innovations (docs/domain.md section 7): k = 0.5 sigma (the
 * classic choice, tuned to a shift of one spread), h = 8 sigma, so that the two-sided in-control
 * average run length is about 9,500 steady hours (Brook & Evans Markov chain; at least 8,760: at most
 * one chance notice per unit per year). `npm run bench:drift` prints what these give.
 */
export const DRIFT_DEFAULTS = { k: DRIFT_CHECK_DEFAULTS.k, h: DRIFT_CHECK_DEFAULTS.h } as const;

export const DriftSettingsInput = z.strictObject({
  /** Reference value k in spreads of the CUSUM input (the standardised innovations) [-]. */
  k: z.number().finite().min(0, 'k cannot be negative.').max(3, 'k above 3 s would hide most shifts.'),
  /** Decision interval h in spreads of the CUSUM input [-]. */
  h: z.number().finite().gt(0, 'h must be above zero.').max(20, 'h above 20 s would hardly ever signal.'),
});

/** A unit's CUSUM settings (the defaults when nobody changed them). */
export async function driftSettingsFor(unitId: string, r: Pick<Tx, 'select'> = db()) {
  if (!isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit.');
  const [u] = await r.select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.id, unitId));
  if (!u) throw new AppError('NOT_FOUND', 'No such unit.');
  const [s] = await r.select().from(driftSettings).where(eq(driftSettings.unitId, unitId));
  return s ? { k: s.k, h: s.h, isDefault: false, updatedAt: s.updatedAt.toISOString() } : { ...DRIFT_DEFAULTS, isDefault: true, updatedAt: null };
}

/**
 * Changes a unit's k and h. The saved CUSUM no longer matches, so the unit's drift rows are dropped
 * and a check over all its hours is queued (open notices stay as they are).
 */
export async function setDriftSettings(unitId: string, input: z.infer<typeof DriftSettingsInput>, userId: string | null) {
  await driftSettingsFor(unitId);
  const [unit] = await db().select({ siteId: plantUnits.siteId }).from(plantUnits).where(eq(plantUnits.id, unitId));
  await inInsightTx(async (tx, exec) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'drift:' + unitId}))`);
    await tx
      .insert(driftSettings)
      .values({ unitId, k: input.k, h: input.h, updatedBy: userId, updatedAt: new Date() })
      .onConflictDoUpdate({ target: driftSettings.unitId, set: { k: input.k, h: input.h, updatedBy: userId, updatedAt: new Date() } });
    await tx.delete(driftPoints).where(eq(driftPoints.unitId, unitId));
    const boss = await queue();
    await sendJob(boss, QUEUES.checkDrift, { siteId: unit!.siteId, fromMs: 0, toMs: Math.ceil(Date.now() / HOUR_MS) * HOUR_MS, unitIds: [unitId] }, { db: { executeSql: exec as never } });
  });
  return driftSettingsFor(unitId);
}

export interface UnitCheck {
  unitId: string;
  /** 'no-baseline' when the unit has no active baseline (nothing to compare with). */
  outcome: 'checked' | 'no-baseline';
  /** Steady hours (re)computed in this run. */
  hours: number;
  signals: number;
  /** Notices opened by this run. */
  opened: string[];
}

/**
 * Checks the units of a site (or the listed ones) over the hours of the payload and everything after
 * them. Safe to repeat and to run concurrently (a per-unit advisory lock orders two checks of a unit).
 */
export async function checkDrift(payload: z.infer<typeof CheckDriftPayload>): Promise<UnitCheck[]> {
  const p = CheckDriftPayload.parse(payload);
  const unitIds = p.unitIds?.length
    ? (await db().select({ id: plantUnits.id }).from(plantUnits).where(and(eq(plantUnits.siteId, p.siteId), inArray(plantUnits.id, p.unitIds)))).map((u) => u.id)
    : (await db().select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.siteId, p.siteId)).orderBy(asc(plantUnits.name))).map((u) => u.id);
  const out: UnitCheck[] = [];
  for (const unitId of unitIds) out.push(await checkUnit(unitId, p.fromMs));
  return out;
}

interface PendingPoint {
  hourStart: Date;
  step: number;
  state: CusumState;
  signals: DriftSignal[];
}

/**
 * A shift must have lasted this many steady hours before its crossing of h opens a notice, so one
 * outlying hour (a bad reading, a trip) does not; common practice, not from a standard. With h = 8 a
 * single hour rarely crosses on its own; the rule costs nothing on sustained shifts (bench:drift).
 */
export const SUSTAINED_HOURS = DRIFT_CHECK_DEFAULTS.sustainedHours;

type DriftRow = typeof driftPoints.$inferInsert;
type PrevRow = typeof driftPoints.$inferSelect;

/** The unit's active baseline (its id, the end of its reference period and its fitted model), if any. */
async function activeBaseline(tx: Tx, unitId: string) {
  const [b] = await tx
    .select({ id: baselines.id, periodTo: baselines.periodTo, model: baselines.destructionModel })
    .from(baselines)
    .where(and(eq(baselines.unitId, unitId), eq(baselines.status, 'active')));
  return b ? { ...b, model: b.model as BaselineModel } : undefined;
}

/** AR(1) of the reference residuals; a baseline saved before it was stored behaves as phi = 0. */
function ar1Of(model: BaselineModel): Ar1Model {
  const s = model.stats.s;
  return model.stats.phi !== undefined && model.stats.sInnovation !== undefined && model.stats.sInnovation > 0 ? { phi: model.stats.phi, sInnovation: model.stats.sInnovation } : { phi: 0, sInnovation: s };
}

/**
 * Where the run resumes: drops the rows of an earlier baseline and the rows from the first affected
 * hour on; returns the last row kept before it (if any) and the hour after which steady hours are read.
 */
async function resumePoint(tx: Tx, unitId: string, baselineId: string, periodTo: Date, fromMs: number): Promise<{ prev: PrevRow | undefined; after: Date }> {
  // Rows of an earlier baseline say nothing about this one.
  await tx.delete(driftPoints).where(and(eq(driftPoints.unitId, unitId), ne(driftPoints.baselineId, baselineId)));
  const from = new Date(Math.max(Math.floor(fromMs / HOUR_MS) * HOUR_MS, periodTo.getTime()));
  const [prev] = await tx
    .select()
    .from(driftPoints)
    .where(and(eq(driftPoints.unitId, unitId), lt(driftPoints.hourStart, from)))
    .orderBy(desc(driftPoints.hourStart))
    .limit(1);
  await tx.delete(driftPoints).where(and(eq(driftPoints.unitId, unitId), gte(driftPoints.hourStart, from)));
  return { prev, after: prev ? prev.hourStart : new Date(periodTo.getTime() - 1) };
}

/** The unit's steady hours with load, T0 and destruction after `after` and not before the baseline's period end. */
function steadyHoursAfter(tx: Tx, unitId: string, after: Date, periodTo: Date) {
  return tx
    .select({
      hourStart: unitHours.hourStart,
      load: unitHours.load,
      T0_K: unitHours.T0_K,
      destruction_W: unitHours.destruction_W,
      destructionU_W: unitHours.destruction_U_W,
      destructionCost_per_h: unitHours.destructionCost_per_h,
    })
    .from(unitHours)
    .where(
      and(usableSteadyHour(unitId), gt(unitHours.hourStart, after), gte(unitHours.hourStart, periodTo)),
    )
    .orderBy(asc(unitHours.hourStart));
}
type SteadyHour = Awaited<ReturnType<typeof steadyHoursAfter>>[number];

/** Repair dates of the unit's notices closed as repaired [ms], earliest first. */
async function repairTimes(tx: Tx, unitId: string): Promise<number[]> {
  const rows = await tx
    .select({ at: driftNotices.repairedAt })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, unitId), eq(driftNotices.closeOutcome, 'repaired'), isNotNull(driftNotices.repairedAt)));
  return rows.map((r) => r.at!.getTime()).sort((x, y) => x - y);
}

/** The CUSUM state to go on from: after a signal the sums restart at zero (resetOnSignal); the row keeps the crossing for the chart. */
function resumeState(prev: PrevRow | undefined): CusumState {
  if (!prev) return cusumInit();
  return prev.signal ? { ...cusumInit(), step: prev.step } : { step: prev.step, cPlus: prev.cPlus, cMinus: prev.cMinus, nPlus: prev.nPlus, nMinus: prev.nMinus };
}

interface CusumRun {
  unitId: string;
  baselineId: string;
  model: BaselineModel;
  ar1: Ar1Model;
  options: { k: number; h: number; resetOnSignal: boolean; minRunLength: number };
  repairs: number[];
}

/**
 * The CUSUM over the steady hours, from the state of `prev`: one drift row per hour and the hours that
 * signalled. After a repair the sums restart at zero from the repair date. Pure.
 */
function runCusum(run: CusumRun, prev: PrevRow | undefined, after: Date, hours: SteadyHour[]): { rows: DriftRow[]; pending: PendingPoint[] } {
  const { ar1, model } = run;
  let state = resumeState(prev);
  const rows: DriftRow[] = [];
  const pending: PendingPoint[] = [];
  let last: { r: number; ms: number } | null = prev ? { r: prev.residual_W, ms: prev.hourStart.getTime() } : null;
  let lastMs = after.getTime();
  for (const h of hours) {
    if (run.repairs.some((r) => r > lastMs && r <= h.hourStart.getTime())) {
      state = { ...cusumInit(), step: state.step };
      last = null; // the innovation after a repair does not lean on the hour before it
    }
    lastMs = h.hourStart.getTime();
    const expected_W = predict(model, h.load!, h.T0_K!);
    const residual_W = h.destruction_W! - expected_W;
    // The standardised one-step innovation; after a gap of g hours the g-step prediction (autocorrelation.ts).
    // A baseline without spread (a perfect fit) gives no CUSUM input: the hour is counted as skipped, as before.
    const x = ar1.sInnovation > 0 ? ar1Innovation(residual_W, last ? { r: last.r, hoursBack: (h.hourStart.getTime() - last.ms) / HOUR_MS } : null, ar1) : NaN;
    last = { r: residual_W, ms: h.hourStart.getTime() };
    const r = cusumStep(state, x, run.options);
    state = r.state;
    rows.push({
      unitId: run.unitId,
      hourStart: h.hourStart,
      baselineId: run.baselineId,
      step: state.step,
      destruction_W: h.destruction_W!,
      expected_W,
      residual_W,
      x,
      cPlus: r.point.cPlus,
      cMinus: r.point.cMinus,
      nPlus: r.point.nPlus,
      nMinus: r.point.nMinus,
      signal: r.point.signals.length === 2 ? 'both' : (r.point.signals[0]?.direction ?? null),
      destructionU_W: h.destructionU_W,
      destructionCost_per_h: h.destructionCost_per_h,
    });
    if (r.point.signals.length) pending.push({ hourStart: h.hourStart, step: state.step, state, signals: r.point.signals });
  }
  return { rows, pending };
}

/** One unit: resume from the last row before the first affected hour and run to the last hour. */
export async function checkUnit(unitId: string, fromMs: number): Promise<UnitCheck> {
  return inInsightTx(async (tx, exec) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'drift:' + unitId}))`);
    const b = await activeBaseline(tx, unitId);
    if (!b) return { unitId, outcome: 'no-baseline', hours: 0, signals: 0, opened: [] };
    const settings = await driftSettingsFor(unitId, tx);
    const ar1 = ar1Of(b.model);
    const { prev, after } = await resumePoint(tx, unitId, b.id, b.periodTo, fromMs);
    const hours = await steadyHoursAfter(tx, unitId, after, b.periodTo);
    const options = { k: settings.k, h: settings.h, resetOnSignal: true, minRunLength: SUSTAINED_HOURS };
    const repairs = await repairTimes(tx, unitId);
    const { rows, pending } = runCusum({ unitId, baselineId: b.id, model: b.model, ar1, options, repairs }, prev, after, hours);
    for (let i = 0; i < rows.length; i += 1000) await tx.insert(driftPoints).values(rows.slice(i, i + 1000));

    const [unit] = await tx.select({ siteId: plantUnits.siteId }).from(plantUnits).where(eq(plantUnits.id, unitId));
    const { opened, signals } = await reconcileNotices(
      tx,
      exec,
      { unitId, siteId: unit!.siteId, baselineId: b.id, sigma_W: b.model.stats.s, phi: ar1.phi, k: settings.k, h: settings.h },
      pending,
    );
    return { unitId, outcome: 'checked', hours: rows.length, signals, opened };
  });
}
