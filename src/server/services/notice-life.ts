/**
 * How a drift notice lives, run by the drift check (./drift.ts) in its transaction after it saved the
 * unit's drift rows:
 * - each CUSUM signal, in time order, either opens a notice (with its mails), is absorbed by the
 *   unit's live notice of that direction, or, when its size clearly exceeds that notice's current
 *   size, opens a notice of its own that names the earlier (which is then superseded);
 * - a live notice whose shift has gone is marked faded and takes no later signal;
 * - every notice not closed gets its live figures (current size over the last 24 steady hours and
 *   since onset, each with its uncertainty, cost per day, trend);
 * - a live notice whose cost per day has grown past the site's multiple since its last mail sends one
 *   escalation mail per step;
 * - a notice closed as repaired gets its verdict once VERIFY_HOURS steady hours have passed after the
 *   repair date, and a new notice (naming it) when the shift is still there.
 * The rules themselves are pure and tested in src/lib/analytics/notice-figures.ts.
 */
import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, gte, isNotNull, isNull, ne } from 'drizzle-orm';
import type { DriftSignal } from '~/lib/analytics/drift';
import { extraDestructionCost_per_day } from '~/lib/analytics/cost';
import { costOfHours } from '~/lib/engine/unit-cost';
import {
  CURRENT_WINDOW_HOURS,
  VERIFY_HOURS,
  clearlyLarger,
  costPerDay,
  fadedAt,
  liveFigures,
  repairVerdict,
  shiftFigure,
  type Direction,
  type ResidualHour,
} from '~/lib/analytics/notice-figures';
import { driftNotices, driftPoints, type PriorReason } from '../db/schema';
import type { Exec, Tx } from './drift-tx';
import { costRate, escalationMultipleFor, queueEscalationMails, queueNoticeMails } from './notices';

export interface PendingSignals {
  hourStart: Date;
  step: number;
  signals: DriftSignal[];
}

interface Ctx {
  unitId: string;
  siteId: string;
  baselineId: string;
  /** Spread of the residuals of the baseline's fit [W]. */
  sigma_W: number;
  /** Lag-one autocorrelation of the residuals (0 when the baseline has none). */
  phi: number;
  k: number;
  h: number;
}

interface Point extends ResidualHour {
  step: number;
  expected_W: number;
  destruction_W: number;
  destructionCost_per_h: number | null;
}

type NoticeRow = typeof driftNotices.$inferSelect;

const isLive = (n: NoticeRow) => n.status !== 'closed' && !n.fadedSince && !n.supersededBy;

type Between = (fromMs: number, toMs: number) => Point[];

/** The unit's saved drift rows of this baseline, in hour order. */
async function loadPoints(tx: Tx, ctx: Ctx): Promise<Point[]> {
  const rows = await tx
    .select()
    .from(driftPoints)
    .where(and(eq(driftPoints.unitId, ctx.unitId), eq(driftPoints.baselineId, ctx.baselineId)))
    .orderBy(asc(driftPoints.hourStart));
  return rows.map((r) => ({
    hourStart_ms: r.hourStart.getTime(),
    residual_W: r.residual_W,
    hourU_W: r.destructionU_W,
    cPlus: r.cPlus,
    cMinus: r.cMinus,
    signal: r.signal,
    step: r.step,
    expected_W: r.expected_W,
    destruction_W: r.destruction_W,
    destructionCost_per_h: r.destructionCost_per_h,
  }));
}

/** Each pending CUSUM signal in time order; returns the notices it opened and how many signals there were. */
async function applySignals(tx: Tx, exec: Exec, ctx: Ctx, points: Point[], between: Between, pending: PendingSignals[]): Promise<{ opened: string[]; signals: number }> {
  const opened: string[] = [];
  let signals = 0;
  for (const p of pending) {
    for (const sig of p.signals) {
      signals++;
      const id = await onSignal(tx, exec, ctx, points, between, sig);
      if (id) opened.push(id);
    }
  }
  return { opened, signals };
}

/**
 * One notice not closed: marks it faded when its shift has gone, stores its live figures as of the
 * last drift row, and sends an escalation mail when its cost per day has grown past the site's multiple.
 */
async function refreshNotice(tx: Tx, exec: Exec, ctx: Ctx, between: Between, lastMs: number | null, n: NoticeRow): Promise<void> {
  const d = n.direction;
  let fadedSince = n.fadedSince;
  if (isLive(n)) {
    const f = fadedAt(between(n.lastSignalHour.getTime() + 1, Infinity), ctx.sigma_W, ctx.phi, d);
    if (f !== null) fadedSince = new Date(f);
  }
  const since = between(n.onsetHour.getTime(), Infinity);
  if (!since.length || lastMs === null) return;
  const live = liveFigures(since, ctx.sigma_W, ctx.phi, d);
  const cost = costPerDay(live.current, n.cF_per_J);
  await tx
    .update(driftNotices)
    .set({
      current_W: live.current.mean_W,
      currentU_W: live.current.U_W,
      currentMeasU_W: live.current.measU_W,
      currentHours: live.current.hours,
      currentExceeds: live.current.exceedsMeasurement,
      currentCost_per_day: cost.cost_per_day,
      currentCostU_per_day: cost.costU_per_day,
      sinceOnset_W: live.sinceOnset.mean_W,
      sinceOnsetU_W: live.sinceOnset.U_W,
      sinceOnsetHours: live.sinceOnset.hours,
      trend: live.trend,
      figuresHour: new Date(lastMs),
      fadedSince,
    })
    .where(eq(driftNotices.id, n.id));
  // Escalation: a live notice of more destruction whose cost per day has grown past the multiple.
  // (Notices opened before live figures existed stated their first figure in their mail.)
  const mailed = n.mailedCost_per_day ?? n.extraCost_per_day;
  if (!fadedSince && !n.supersededBy && d === 'up' && cost.cost_per_day !== null && mailed !== null && mailed > 0) {
    const multiple = await escalationMultipleFor(tx, n.siteId);
    if (cost.cost_per_day >= multiple * mailed) {
      const step = n.escalationStep + 1;
      await tx.update(driftNotices).set({ escalationStep: step, mailedCost_per_day: cost.cost_per_day }).where(eq(driftNotices.id, n.id));
      await queueEscalationMails(tx, exec, n.id, step, mailed, cost.cost_per_day);
    }
  }
}

/** Fading and live figures of every notice of this baseline that is not closed. */
async function refreshNotices(tx: Tx, exec: Exec, ctx: Ctx, points: Point[], between: Between): Promise<void> {
  const lastMs = points.length ? points[points.length - 1]!.hourStart_ms : null;
  const notClosed = await tx
    .select()
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.baselineId, ctx.baselineId), ne(driftNotices.status, 'closed')));
  for (const n of notClosed) await refreshNotice(tx, exec, ctx, between, lastMs, n);
}

/**
 * The notice that follows a repair whose shift is still there: a later notice of the same direction
 * opened since the repair, or a new one naming the repaired notice. Returns its id (null when none
 * opened) and whether it was opened here.
 */
async function followUpOf(tx: Tx, exec: Exec, ctx: Ctx, n: NoticeRow, after: Point[], afterMean_W: number): Promise<{ id: string | null; opened: boolean }> {
  const [later] = await tx
    .select({ id: driftNotices.id, onsetHour: driftNotices.onsetHour })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, n.direction), ne(driftNotices.id, n.id)))
    .orderBy(desc(driftNotices.onsetHour))
    .limit(1);
  if (later && later.onsetHour.getTime() >= n.repairedAt!.getTime()) return { id: later.id, opened: false };
  const id = await openNotice(tx, exec, ctx, after, n.direction, { priorId: n.id, reason: 'after-repair', shift_sigma: afterMean_W / ctx.sigma_W });
  return { id, opened: id !== null };
}

/** One repaired notice: its verdict once VERIFY_HOURS steady hours have passed; returns the id of a follow-up it opened. */
async function verdictOfRepair(tx: Tx, exec: Exec, ctx: Ctx, between: Between, n: NoticeRow): Promise<string | null> {
  const repairMs = n.repairedAt!.getTime();
  const after = between(repairMs, Infinity).slice(0, VERIFY_HOURS);
  if (after.length < VERIFY_HOURS) return null;
  const beforeHours = between(n.onsetHour.getTime(), repairMs).slice(-CURRENT_WINDOW_HOURS);
  // Without drift rows before the repair (another baseline since), the notice's first figure stands in.
  const before = beforeHours.length
    ? shiftFigure(beforeHours, ctx.sigma_W, ctx.phi)
    : { ...shiftFigure([{ hourStart_ms: n.onsetHour.getTime(), residual_W: n.extra_W, hourU_W: null }], ctx.sigma_W, ctx.phi), hours: n.hours, U_W: n.shiftU_W ?? 0 };
  const afterFig = shiftFigure(after, ctx.sigma_W, ctx.phi);
  const v = repairVerdict(before, afterFig, n.direction, n.cF_per_J);
  const verdictHour = new Date(after[after.length - 1]!.hourStart_ms);
  let followUp: string | null = n.followUpNoticeId;
  let opened: string | null = null;
  if (!v.back && !followUp) {
    const f = await followUpOf(tx, exec, ctx, n, after, afterFig.mean_W);
    followUp = f.id;
    if (f.opened) opened = f.id;
  }
  await tx
    .update(driftNotices)
    .set({
      verdictHour,
      verdictBack: v.back,
      verdict: {
        before_W: v.before.mean_W,
        beforeU_W: v.before.U_W,
        beforeHours: v.before.hours,
        after_W: v.after.mean_W,
        afterU_W: v.after.U_W,
        afterHours: v.after.hours,
        avoided_W: v.avoided_W,
        avoidedU_W: v.avoidedU_W,
        avoidedCost_per_month: v.avoidedCost_per_month,
        avoidedCostU_per_month: v.avoidedCostU_per_month,
      },
      followUpNoticeId: followUp,
    })
    .where(eq(driftNotices.id, n.id));
  return opened;
}

/** Repair verdicts of the unit's notices closed as repaired and not yet judged; returns the follow-ups opened. */
async function repairVerdicts(tx: Tx, exec: Exec, ctx: Ctx, between: Between): Promise<string[]> {
  const repaired = await tx
    .select()
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.closeOutcome, 'repaired'), isNotNull(driftNotices.repairedAt), isNull(driftNotices.verdictHour)));
  const opened: string[] = [];
  for (const n of repaired) {
    const id = await verdictOfRepair(tx, exec, ctx, between, n);
    if (id) opened.push(id);
  }
  return opened;
}

/** Runs the notice rules over the unit's saved drift rows; returns the ids of the notices opened. */
export async function reconcileNotices(tx: Tx, exec: Exec, ctx: Ctx, pending: PendingSignals[]): Promise<{ opened: string[]; signals: number }> {
  const points = await loadPoints(tx, ctx);
  const between: Between = (fromMs, toMs) => points.filter((p) => p.hourStart_ms >= fromMs && p.hourStart_ms < toMs);
  const { opened, signals } = await applySignals(tx, exec, ctx, points, between, pending);
  await refreshNotices(tx, exec, ctx, points, between);
  opened.push(...(await repairVerdicts(tx, exec, ctx, between)));
  return { opened, signals };
}

const meanExpected = (hs: readonly Point[]) => (hs.length ? hs.reduce((t, p) => t + p.expected_W, 0) / hs.length : NaN);

/** One CUSUM signal: absorbed, a re-run of a known one, or a new notice. */
async function onSignal(tx: Tx, exec: Exec, ctx: Ctx, points: Point[], between: (a: number, b: number) => Point[], sig: DriftSignal): Promise<string | null> {
  const hours = points.filter((p) => p.step >= sig.onsetStep && p.step <= sig.step);
  if (!hours.length) return null;
  const onsetMs = hours[0]!.hourStart_ms;
  const signalMs = hours[hours.length - 1]!.hourStart_ms;
  const d: Direction = sig.direction;

  const [live] = await tx
    .select()
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, d), ne(driftNotices.status, 'closed'), isNull(driftNotices.fadedSince), isNull(driftNotices.supersededBy)));
  if (live) {
    if (signalMs <= live.lastSignalHour.getTime()) return null; // a re-run of hours already seen
    const faded = fadedAt(between(live.lastSignalHour.getTime() + 1, signalMs), ctx.sigma_W, ctx.phi, d);
    if (faded !== null) {
      await tx.update(driftNotices).set({ fadedSince: new Date(faded) }).where(eq(driftNotices.id, live.id));
    } else {
      const window = between(live.onsetHour.getTime(), onsetMs).slice(-CURRENT_WINDOW_HOURS);
      const current = shiftFigure(window, ctx.sigma_W, ctx.phi);
      // The hours up to a crossing are picked by the stopping rule (their mean is at least k + h/N):
      // the new size must clear that floor too, so a re-signal of the same shift is absorbed.
      const sigFig = shiftFigure(hours, ctx.sigma_W, ctx.phi);
      const floor_W = (ctx.k + ctx.h / hours.length) * ctx.sigma_W;
      const duty = { signal_W: meanExpected(hours), current_W: meanExpected(window) };
      if (!clearlyLarger(sigFig, current, d, floor_W, duty)) {
        await tx.update(driftNotices).set({ lastSignalHour: new Date(signalMs) }).where(eq(driftNotices.id, live.id));
        return null;
      }
      const id = randomUUID();
      await tx.update(driftNotices).set({ supersededBy: id }).where(eq(driftNotices.id, live.id));
      return openNotice(tx, exec, ctx, hours, d, { id, priorId: live.id, reason: 'larger', shift_sigma: sig.shift_sigma });
    }
  }
  // A notice whose last signal is at or after this onset already reported this shift (a re-run).
  const [reported] = await tx
    .select({ id: driftNotices.id })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, d), gte(driftNotices.lastSignalHour, new Date(onsetMs))))
    .limit(1);
  if (reported) return null;
  const [prior] = await tx
    .select()
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, ctx.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, d)))
    .orderBy(desc(driftNotices.lastSignalHour))
    .limit(1);
  let reason: PriorReason | null = null;
  if (prior) {
    reason = prior.closeOutcome === 'repaired' ? 'after-repair' : prior.status === 'closed' ? 'after-close' : prior.supersededBy ? 'larger' : 'after-fade';
  }
  const id = await openNotice(tx, exec, ctx, hours, d, { priorId: prior?.id ?? null, reason, shift_sigma: sig.shift_sigma });
  if (id && prior && prior.closeOutcome === 'repaired' && !prior.followUpNoticeId && prior.repairedAt && prior.repairedAt.getTime() <= onsetMs) {
    await tx.update(driftNotices).set({ followUpNoticeId: id }).where(eq(driftNotices.id, prior.id));
  }
  return id;
}

/** Opens a notice on the given hours (onset to signal) and queues its mails in the caller's transaction. */
async function openNotice(
  tx: Tx,
  exec: Exec,
  ctx: Ctx,
  hours: Point[],
  direction: Direction,
  o: { id?: string; priorId: string | null; reason: PriorReason | null; shift_sigma: number },
): Promise<string | null> {
  const n = hours.length;
  const fig = shiftFigure(hours, ctx.sigma_W, ctx.phi);
  const expected_W = hours.reduce((a, p) => a + p.expected_W, 0) / n;
  const measured_W = hours.reduce((a, p) => a + p.destruction_W, 0) / n;
  const allU = hours.every((p) => p.hourU_W !== null);
  const hourU_W = allU ? hours.reduce((a, p) => a + p.hourU_W!, 0) / n : null;
  const cost = await costRate(tx, ctx.unitId, costOfHours(hours));
  const first = cost.cF === null ? null : extraDestructionCost_per_day(cost.cF, measured_W, expected_W).cost_per_day;
  const live = liveFigures(hours, ctx.sigma_W, ctx.phi, direction);
  const liveCost = costPerDay(live.current, cost.cF);
  const [row] = await tx
    .insert(driftNotices)
    .values({
      ...(o.id ? { id: o.id } : {}),
      siteId: ctx.siteId,
      unitId: ctx.unitId,
      baselineId: ctx.baselineId,
      direction,
      status: 'open',
      onsetHour: new Date(hours[0]!.hourStart_ms),
      signalHour: new Date(hours[n - 1]!.hourStart_ms),
      lastSignalHour: new Date(hours[n - 1]!.hourStart_ms),
      hours: n,
      extra_W: fig.mean_W,
      expected_W,
      shift_sigma: o.shift_sigma,
      extraCost_per_day: first,
      currency: cost.currency,
      cF_per_J: cost.cF,
      costBasis: cost.basis,
      hourU_W,
      shiftU_W: fig.measU_W,
      exceedsUncertainty: fig.exceedsMeasurement,
      k: ctx.k,
      h: ctx.h,
      current_W: live.current.mean_W,
      currentU_W: live.current.U_W,
      currentMeasU_W: live.current.measU_W,
      currentHours: live.current.hours,
      currentExceeds: live.current.exceedsMeasurement,
      currentCost_per_day: liveCost.cost_per_day,
      currentCostU_per_day: liveCost.costU_per_day,
      sinceOnset_W: live.sinceOnset.mean_W,
      sinceOnsetU_W: live.sinceOnset.U_W,
      sinceOnsetHours: live.sinceOnset.hours,
      trend: live.trend,
      figuresHour: new Date(hours[n - 1]!.hourStart_ms),
      priorNoticeId: o.priorId,
      priorReason: o.priorId ? o.reason : null,
      mailedCost_per_day: liveCost.cost_per_day,
    })
    .onConflictDoNothing()
    .returning({ id: driftNotices.id });
  if (!row) return null;
  await queueNoticeMails(tx, exec, row.id);
  return row.id;
}
