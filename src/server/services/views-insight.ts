/**
 * What the views take from the insight work: the active baseline's expected band (./baselines.ts,
 * expectedRows with k = 2) and drift notices (drift_notices), shaped for charts and reports.
 */
import { and, asc, eq, gte, inArray, lt, ne, or, isNull, sql } from 'drizzle-orm';
import type { BaselineInfo, ExpectedHour, NoticeMark } from '~/lib/views/trend';
import { db } from '../db/client';
import { driftNotices, plantUnits } from '../db/schema';
import { baselineModelsOf, expectedRows, type BaselineModels, type BaselineSummary } from './baselines';
import { cachedHours } from '../hours-cache';

export type { BaselineInfo, ExpectedHour, NoticeMark } from '~/lib/views/trend';

export function baselineInfo(b: BaselineSummary): BaselineInfo {
  return {
    id: b.id,
    version: b.version,
    label: b.label,
    loadUnit: b.loadUnit,
    hasEfficiency: b.efficiency !== null,
    meetsGuideline14: b.meetsGuideline14,
    efficiencyCvRmse: b.efficiency?.stats.cvRmse ?? null,
    destructionCvRmse: b.destruction.stats.cvRmse,
    trustWarnings: b.trust.trusted ? [] : b.trust.warnings,
  };
}

/**
 * A unit's active baseline as the views show it, with its fitted models: kept in the read cache
 * (src/server/hours-cache.ts) until baselines, units or sites change (migration web-access-cache
 * notifies on baselines and sites), so a trend's two band look-ups cost no query.
 */
export function activeBaselineOf(unitId: string): Promise<{ info: BaselineInfo; models: BaselineModels | null } | null> {
  return cachedHours(`baseline:${unitId}`, async () => {
    const { summary, models } = await baselineModelsOf(unitId);
    return summary ? { info: baselineInfo(summary), models } : null;
  });
}

/** Expected band for the given hours from the unit's active baseline; nulls when it has none. */
export async function expectedBand(
  unitId: string,
  rows: { hourStart: Date; load: number | null; T0_K: number | null }[],
): Promise<{ baseline: BaselineInfo | null; expected: (ExpectedHour | null)[] }> {
  const active = await activeBaselineOf(unitId);
  if (!active) return { baseline: null, expected: rows.map(() => null) };
  const out = expectedRows(active.models, rows);
  return {
    baseline: active.info,
    expected: out.map((r) =>
      r.efficiency || r.destruction_W
        ? {
            efficiency: r.efficiency?.expected ?? null,
            efficiencyLo: r.efficiency?.lower ?? null,
            efficiencyHi: r.efficiency?.upper ?? null,
            destruction_W: r.destruction_W?.expected ?? null,
            destructionLo_W: r.destruction_W?.lower ?? null,
            destructionHi_W: r.destruction_W?.upper ?? null,
          }
        : null,
    ),
  };
}


/**
 * Notices of some units (or of a site) that touch [fromMs, toMs): opened before its end and not closed
 * before its start. `openOnly` keeps those not closed.
 */
export async function siteNotices(q: { siteId?: string; unitIds?: string[]; fromMs?: number; toMs?: number; openOnly?: boolean }): Promise<NoticeMark[]> {
  const where = [];
  if (q.siteId) where.push(eq(driftNotices.siteId, q.siteId));
  if (q.unitIds) {
    if (!q.unitIds.length) return [];
    where.push(inArray(driftNotices.unitId, q.unitIds));
  }
  if (q.toMs !== undefined) where.push(lt(driftNotices.onsetHour, new Date(q.toMs)));
  if (q.fromMs !== undefined) where.push(or(isNull(driftNotices.closedAt), gte(driftNotices.closedAt, new Date(q.fromMs)))!);
  if (q.openOnly) where.push(ne(driftNotices.status, 'closed'));
  const rows = await db()
    .select({ n: driftNotices, unitName: plantUnits.name })
    .from(driftNotices)
    .innerJoin(plantUnits, eq(plantUnits.id, driftNotices.unitId))
    .where(and(...where))
    .orderBy(asc(driftNotices.onsetHour));
  return rows.map(({ n, unitName }) => ({
    id: n.id,
    unitId: n.unitId,
    unitName,
    direction: n.direction,
    status: n.status,
    onsetMs: n.onsetHour.getTime(),
    signalMs: n.signalHour.getTime(),
    hours: n.hours,
    extra_W: n.extra_W,
    shiftU_W: n.shiftU_W,
    exceedsUncertainty: n.exceedsUncertainty,
    extraCost_per_day: n.extraCost_per_day,
    currency: n.currency,
  }));
}

/** Notices of a site that are not closed (open or acknowledged). */
export async function openNoticeCount(siteId: string): Promise<number> {
  const [r] = await db()
    .select({ n: sql<number>`count(*)::int` })
    .from(driftNotices)
    .where(and(eq(driftNotices.siteId, siteId), ne(driftNotices.status, 'closed')));
  return r?.n ?? 0;
}
