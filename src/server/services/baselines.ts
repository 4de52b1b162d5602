/**
 * Baselines per unit: efficiency and exergy destruction regressed on load and ambient temperature
 * (the hour's T0) over a reference period of steady hours (ISO 50006; fit quality per ASHRAE
 * Guideline 14-2014, hourly criteria), versioned per unit with the states draft, active, discarded
 * and retired. The numbers come from src/lib/analytics/baseline.ts; this file only reads hours,
 * stores versions and answers what is expected.
 *
 * Stable names other screens call: activeBaseline(unitId) and expectedFor(unitId, rows).
 */
import { and, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import {
  BaselineError,
  QUADRATIC_TERMS,
  fitBaseline,
  predict,
  predictionInterval,
  type BaselineModel,
  type BaselineTerm,
} from '~/lib/analytics/baseline';
import { QUEUES, sendJob } from '~/jobs';
import { db } from '../db/client';
import type { BaselineSummary, FitView } from '~/lib/baseline-view';
import { hourCeil } from '~/lib/time';
import { curveLoads } from '~/lib/views/trend';
import { thinEvenly } from '~/lib/views/thin';

/** Most reference hours the fit view sends for the scatter (the page loads under 150 KB). */
export const FIT_VIEW_POINTS = 500;
import { baselines } from '../db/schema';
import { isId } from '../access';
import { AppError } from '../errors';
import { queue } from '../queue';
import { activeBaseline, getBaseline, steadyHours, unitRow } from './baselines-read';


/** Coverage factor of the expected band (docs/domain.md section 7: k = 2). */
export const EXPECTED_BAND_K = 2;

export const BaselineTermSchema = z.enum(QUADRATIC_TERMS as unknown as [BaselineTerm, ...BaselineTerm[]]);

/** What an energy lead sends to fit a baseline. */
export const FitInput = z.strictObject({
  /** First hour of the reference period (ISO instant). */
  periodFrom: z.coerce.date(),
  /** End of the reference period, exclusive (ISO instant). */
  periodTo: z.coerce.date(),
  terms: z.array(BaselineTermSchema).min(1, 'Choose at least one term (load, T_amb ...).'),
  note: z.string().trim().max(500).optional(),
});
export type FitInput = z.infer<typeof FitInput>;

export type { BaselineSummary, ModelSummary } from '~/lib/baseline-view';
export { activeBaseline, baselineLabel, baselineOverview, getBaseline, unitBaselines, unitChoices, unitHourSpan } from './baselines-read';


/** Expected value with its band, yhat +- 2 s sqrt(1 + x0' (X'X)^-1 x0) (analytics predictionInterval, k = 2). */
export interface ExpectedBand {
  expected: number;
  lower: number;
  upper: number;
}

export interface ExpectedRow {
  hourStart: string;
  /** Expected exergy efficiency [-]; null for units without one or hours without load or T0. */
  efficiency: ExpectedBand | null;
  /** Expected exergy destruction [W]; null for hours without load or T0. */
  destruction_W: ExpectedBand | null;
}

function band(model: BaselineModel, load: number, T0_K: number): ExpectedBand {
  const pi = predictionInterval(model, load, T0_K, { k: EXPECTED_BAND_K });
  return { expected: pi.yhat, lower: pi.lower, upper: pi.upper };
}

/**
 * What the unit's baseline expects for given hours (docs/design.md: "expected").
 *
 * @param unitId plant unit id
 * @param rows hours with their load [the unit's load unit] and T0_K [K]
 * @param options baselineId: use that version instead of the active one
 * @returns the baseline used (null when the unit has none: every row is then null) and one row per input
 */
export async function expectedFor(
  unitId: string,
  rows: readonly { hourStart: Date | string; load: number | null; T0_K: number | null }[],
  options: { baselineId?: string } = {},
): Promise<{ baseline: BaselineSummary | null; rows: ExpectedRow[] }> {
  const { summary, models } = await baselineModelsOf(unitId, options);
  return { baseline: summary, rows: expectedRows(models, rows) };
}

export type BaselineModels = { efficiency: BaselineModel | null; destruction: BaselineModel };

/** A unit's active baseline (or the version named) with its two fitted models; nulls when it has none. */
export async function baselineModelsOf(unitId: string, options: { baselineId?: string } = {}): Promise<{ summary: BaselineSummary | null; models: BaselineModels | null }> {
  let summary: BaselineSummary | null;
  let models: BaselineModels | null = null;
  if (options.baselineId) {
    summary = await getBaseline(options.baselineId);
    if (summary.unitId !== unitId) throw new AppError('NOT_FOUND', 'That baseline belongs to another unit.');
  } else {
    summary = await activeBaseline(unitId);
  }
  if (summary) {
    const [m] = await db()
      .select({ efficiency: baselines.efficiencyModel, destruction: baselines.destructionModel })
      .from(baselines)
      .where(eq(baselines.id, summary.id));
    models = m ?? null;
  }
  return { summary, models };
}

/** What fitted models expect for given hours (every row null without models). */
export function expectedRows(models: BaselineModels | null, rows: readonly { hourStart: Date | string; load: number | null; T0_K: number | null }[]): ExpectedRow[] {
  return rows.map((r) => {
    const hourStart = new Date(r.hourStart).toISOString();
    const ok = models && r.load !== null && r.T0_K !== null && Number.isFinite(r.load) && Number.isFinite(r.T0_K);
    return {
      hourStart,
      efficiency: ok && models!.efficiency ? band(models!.efficiency, r.load!, r.T0_K!) : null,
      destruction_W: ok ? band(models!.destruction, r.load!, r.T0_K!) : null,
    };
  });
}

/** Fewest steady hours a baseline is fitted on (common practice: at least a full day of steady hours). */
export const MIN_HOURS = 24;

/**
 * Fits efficiency and destruction on the unit's steady hours of the period and saves the result as a
 * draft (the next version number of the unit).
 * @throws AppError UNPROCESSABLE when the hours do not support the chosen terms
 */
export async function fitDraft(unitId: string, input: FitInput, userId: string | null): Promise<BaselineSummary> {
  const unit = await unitRow(unitId);
  if (!(input.periodTo.getTime() > input.periodFrom.getTime())) throw new AppError('VALIDATION_FAILED', 'The reference period must end after it starts.');
  const hours = await steadyHours(unitId, input.periodFrom, input.periodTo);
  if (hours.length < MIN_HOURS) {
    throw new AppError(
      'UNPROCESSABLE',
      `The period has ${hours.length} steady hours with load and T0 for ${unit.name}; a baseline needs at least ${MIN_HOURS}. Choose a longer period.`,
    );
  }
  const terms = [...new Set(input.terms)];
  let destructionModel: BaselineModel;
  let efficiencyModel: BaselineModel | null = null;
  try {
    destructionModel = fitBaseline(
      { load: hours.map((h) => h.load!), T_amb_K: hours.map((h) => h.T0_K!), y: hours.map((h) => h.destruction_W!), hourStartMs: hours.map((h) => h.hourStart.getTime()) },
      { terms },
    );
    const withEff = hours.filter((h) => h.efficiency !== null && Number.isFinite(h.efficiency));
    // Efficiency only where the unit has one in (nearly) every steady hour: dissipative units have none.
    if (withEff.length >= Math.max(MIN_HOURS, 0.9 * hours.length)) {
      efficiencyModel = fitBaseline(
        { load: withEff.map((h) => h.load!), T_amb_K: withEff.map((h) => h.T0_K!), y: withEff.map((h) => h.efficiency!) },
        { terms },
      );
    }
  } catch (err) {
    if (err instanceof BaselineError) throw new AppError('UNPROCESSABLE', `The fit failed: ${err.message}.`);
    throw err;
  }
  const loadUnit = hours.find((h) => h.loadUnit)?.loadUnit ?? null;
  const id = await db().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'baselines:' + unitId}))`);
    const [{ next } = { next: 1 }] = await tx
      .select({ next: sql<number>`coalesce(max(${baselines.version}), 0)::int + 1` })
      .from(baselines)
      .where(eq(baselines.unitId, unitId));
    const [row] = await tx
      .insert(baselines)
      .values({
        unitId,
        version: next,
        status: 'draft',
        periodFrom: input.periodFrom,
        periodTo: input.periodTo,
        terms,
        hours: hours.length,
        efficiencyModel,
        destructionModel,
        loadUnit,
        note: input.note ?? null,
        createdBy: userId,
      })
      .returning({ id: baselines.id });
    return row!.id;
  });
  return getBaseline(id);
}

/**
 * Accepts a draft: it becomes the unit's active baseline and the previous active one is retired,
 * in one transaction (the partial unique index keeps one active per unit even under a race).
 */
export async function acceptBaseline(baselineId: string, userId: string | null): Promise<BaselineSummary> {
  const b = await getBaseline(baselineId);
  if (b.status === 'draft' && !b.trust.acceptable) {
    throw new AppError('UNPROCESSABLE', `Version ${b.version} cannot be accepted: ${b.trust.warnings[0] ?? 'its fit saw too few hours.'}`);
  }
  await db().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'baselines:' + b.unitId}))`);
    const [now] = await tx.select({ status: baselines.status }).from(baselines).where(eq(baselines.id, baselineId));
    if (now?.status !== 'draft') throw new AppError('CONFLICT', `Version ${b.version} is ${now?.status}; only a draft can be accepted.`);
    await tx
      .update(baselines)
      .set({ status: 'retired', retiredAt: new Date() })
      .where(and(eq(baselines.unitId, b.unitId), eq(baselines.status, 'active')));
    await tx.update(baselines).set({ status: 'active', decidedBy: userId, decidedAt: new Date() }).where(eq(baselines.id, baselineId));
  });
  // The hours after the reference period are checked against the new baseline right away.
  const boss = await queue();
  await sendJob(boss, QUEUES.checkDrift, { siteId: b.siteId, fromMs: new Date(b.periodTo).getTime(), toMs: hourCeil(Date.now()), unitIds: [b.unitId] });
  return getBaseline(baselineId);
}

/** Discards a draft (kept, for the record, but never used). */
export async function discardBaseline(baselineId: string, userId: string | null): Promise<BaselineSummary> {
  const b = await getBaseline(baselineId);
  const updated = await db()
    .update(baselines)
    .set({ status: 'discarded', decidedBy: userId, decidedAt: new Date() })
    .where(and(eq(baselines.id, baselineId), eq(baselines.status, 'draft')))
    .returning({ id: baselines.id });
  if (!updated.length) throw new AppError('CONFLICT', `Version ${b.version} is ${b.status}; only a draft can be discarded.`);
  return getBaseline(baselineId);
}

export type { FitPoint, FitView } from '~/lib/baseline-view';

/**
 * The reference hours of a version with the fitted values, and the fitted curve against load at the
 * period's mean T0, for the builder's scatter.
 */
export async function baselineFitView(baselineId: string): Promise<FitView> {
  if (!isId(baselineId)) throw new AppError('NOT_FOUND', 'No such baseline.');
  const [b] = await db().select().from(baselines).where(eq(baselines.id, baselineId));
  if (!b) throw new AppError('NOT_FOUND', 'No such baseline.');
  const hours = await steadyHours(b.unitId, b.periodFrom, b.periodTo);
  // The scatter draws at most FIT_VIEW_POINTS hours, evenly chosen.
  const points = thinEvenly(hours, FIT_VIEW_POINTS).map((h) => ({
    hourStart: h.hourStart.toISOString(),
    load: h.load!,
    T0_K: h.T0_K!,
    efficiency: h.efficiency,
    destruction_W: h.destruction_W!,
    expectedEfficiency: b.efficiencyModel ? predict(b.efficiencyModel, h.load!, h.T0_K!) : null,
    expectedDestruction_W: predict(b.destructionModel, h.load!, h.T0_K!),
  }));
  const meanT0_K = b.destructionModel.centre.T_amb_K;
  const curve = curveLoads(points).map((load) => ({
    load,
    efficiency: b.efficiencyModel ? predict(b.efficiencyModel, load, meanT0_K) : null,
    destruction_W: predict(b.destructionModel, load, meanT0_K),
  }));
  return { points, curve, meanT0_K, totalPoints: hours.length };
}
