/**
 * The unit rules (issue 10, "units that should be idle"): a unit declared normally idle that runs,
 * or a unit that crosses a limit an energy lead set, for more than a set number of consecutive hours,
 * opens a notice of its own kind ('idle' or 'limit') in the drift notices table, mailed like a drift
 * notice (one mail per notice and person, queued in the same transaction as the notice). Run after
 * every drift check (src/worker/handlers.ts) and on its own queue when a rule changes.
 *
 * One notice per unit and kind is open at a time; a later run of the same unit and kind while it is
 * open moves its last hour on and refreshes its figures (those of the latest run). It never closes
 * by itself: only a person closes it. Hours up to a closed notice's last hour count as reported, so
 * a re-run over known hours opens nothing, and a unit that keeps running after its notice was closed
 * opens a new one once it has run more than the set hours again.
 */
import { and, asc, eq, gte, inArray, isNotNull, lt, max, ne, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { CheckUnitRulesPayload, QUEUES, sendJob } from '~/jobs';
import { writerOf } from '~/lib/units/writer';
import type { NumberStyle } from '~/lib/format';
import { siteDisplay } from './display-units';
import { idleRuns, limitRuns, limitText, type CrossedLimit, type RuleHour, type RuleRun, type UnitLimits } from '~/lib/analytics/unit-rules';
import { DEFAULT_RULE_HOURS, MAX_RULE_HOURS, normallyIdleText, type NormallyIdle } from '~/lib/plant/idle';
import { db } from '../db/client';
import { driftNotices, plantUnits, sites, unitHours, unitLimits, type NoticeKind } from '../db/schema';
import { queue } from '../queue';
import { isId } from '../access';
import { AppError } from '../errors';
import { inInsightTx, type Exec, type Tx } from './drift-tx';
import { queueNoticeMails } from './notices';
import { HOUR_MS } from '~/lib/time';

/** How far before the checked hours a run is looked for (a run that began earlier keeps its onset). */
const LOOKBACK_ms = 31 * 24 * HOUR_MS;

// ---- limits (energy leads) ---------------------------------------------------------------------------

export const UnitLimitsInput = z.strictObject({
  /** [currency of the site per day]; null: no cost limit. */
  maxCost_per_day: z.number().finite().positive('A cost limit is above zero; leave it empty for none.').nullable(),
  /** [-], 0 to 1; null: no efficiency limit. */
  minEfficiency: z.number().finite().gt(0, 'An efficiency limit is above 0; leave it empty for none.').lt(1, 'An efficiency limit is below 1 (100 %).').nullable(),
  hours: z.number().int('Give the hours as a whole number.').min(1).max(MAX_RULE_HOURS).default(DEFAULT_RULE_HOURS),
});

export async function unitLimitsFor(unitId: string, r: Pick<Tx, 'select'> = db()) {
  if (!isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit.');
  const [u] = await r
    .select({ id: plantUnits.id, kind: plantUnits.kind, normallyIdle: plantUnits.normallyIdle, currency: sites.currency })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .where(eq(plantUnits.id, unitId));
  if (!u) throw new AppError('NOT_FOUND', 'No such unit.');
  const [l] = await r.select().from(unitLimits).where(eq(unitLimits.unitId, unitId));
  return {
    maxCost_per_day: l?.maxCost_per_day ?? null,
    minEfficiency: l?.minEfficiency ?? null,
    hours: l?.hours ?? DEFAULT_RULE_HOURS,
    currency: u.currency,
    /** The plant model's declaration, shown beside the limits (admins edit it on the unit's model page). */
    normallyIdle: u.normallyIdle ? normallyIdleText(u.normallyIdle) : null,
    updatedAt: l?.updatedAt.toISOString() ?? null,
  };
}

/** Sets a unit's limits and queues a check of its hours against them. */
export async function setUnitLimits(unitId: string, input: z.input<typeof UnitLimitsInput>, userId: string | null) {
  await unitLimitsFor(unitId);
  const v = UnitLimitsInput.parse(input);
  const [unit] = await db().select({ siteId: plantUnits.siteId }).from(plantUnits).where(eq(plantUnits.id, unitId));
  await inInsightTx(async (tx, exec) => {
    const values = { maxCost_per_day: v.maxCost_per_day, minEfficiency: v.minEfficiency, hours: v.hours, updatedBy: userId, updatedAt: new Date() };
    await tx.insert(unitLimits).values({ unitId, ...values }).onConflictDoUpdate({ target: unitLimits.unitId, set: values });
    await queueUnitRuleCheck(unit!.siteId, [unitId], exec);
  });
  return unitLimitsFor(unitId);
}

/** Queues a check of every hour of the units (after a rule changed); in the caller's transaction when `exec` is given. */
export async function queueUnitRuleCheck(siteId: string, unitIds?: string[], exec?: Exec): Promise<void> {
  const boss = await queue();
  const payload = CheckUnitRulesPayload.parse({ siteId, fromMs: 0, toMs: Math.ceil(Date.now() / HOUR_MS) * HOUR_MS, ...(unitIds ? { unitIds } : {}) });
  await sendJob(boss, QUEUES.checkUnitRules, payload, exec ? { db: { executeSql: exec as never } } : { retryLimit: 2, retryDelay: 10 });
}

// ---- the check ----------------------------------------------------------------------------------------

export interface UnitRuleCheck {
  unitId: string;
  kind: Exclude<NoticeKind, 'drift'>;
  runs: number;
  /** Notices opened by this check. */
  opened: string[];
}

/**
 * Checks the site's units that carry a rule over the payload's hours (and the month before them, so
 * a run that began earlier keeps its onset). Units whose declaration waits for a unit of the payload
 * are checked too. Safe to repeat and to run concurrently (a per-unit advisory lock).
 */
export async function checkUnitRules(payload: z.input<typeof CheckUnitRulesPayload>): Promise<UnitRuleCheck[]> {
  const p = CheckUnitRulesPayload.parse(payload);
  const units = await db()
    .select({ id: plantUnits.id, name: plantUnits.name, normallyIdle: plantUnits.normallyIdle, limits: unitLimits, timeZone: sites.timeZone, currency: sites.currency })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .leftJoin(unitLimits, eq(unitLimits.unitId, plantUnits.id))
    .where(and(eq(plantUnits.siteId, p.siteId), or(isNotNull(plantUnits.normallyIdle), isNotNull(unitLimits.unitId))))
    .orderBy(asc(plantUnits.name));
  const listed = p.unitIds?.length ? new Set(p.unitIds) : null;
  const names = listed
    ? new Set((await db().select({ name: plantUnits.name }).from(plantUnits).where(inArray(plantUnits.id, [...listed]))).map((u) => u.name))
    : null;
  const out: UnitRuleCheck[] = [];
  // The limits in a rule's words are written in the site's number style, as its mails write money.
  const style = units.some((u) => u.limits) ? writerOf(await siteDisplay(p.siteId)).style : {};
  for (const u of units) {
    const waitsFor = u.normallyIdle?.whileRunning ?? [];
    if (listed && !listed.has(u.id) && !waitsFor.some((n) => names!.has(n))) continue;
    const fromMs = Math.max(0, p.fromMs - LOOKBACK_ms);
    if (u.normallyIdle) out.push(await checkIdle(u.id, u.normallyIdle, u.timeZone, p.siteId, fromMs, p.toMs));
    const l = u.limits;
    if (l && (l.maxCost_per_day !== null || l.minEfficiency !== null)) {
      out.push(await checkLimits(u.id, { maxCost_per_day: l.maxCost_per_day, minEfficiency: l.minEfficiency, hours: l.hours }, u.currency, style, fromMs, p.toMs));
    }
  }
  return out;
}

async function ruleHours(tx: Tx, unitId: string, fromMs: number, toMs: number): Promise<RuleHour[]> {
  const rows = await tx
    .select({
      hourStart: unitHours.hourStart,
      state: unitHours.state,
      destruction_W: unitHours.destruction_W,
      destructionCost_per_h: unitHours.destructionCost_per_h,
      efficiency: unitHours.efficiency,
    })
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unitId), gte(unitHours.hourStart, new Date(fromMs)), lt(unitHours.hourStart, new Date(toMs))))
    .orderBy(asc(unitHours.hourStart));
  return rows.map((r) => ({ hourStartMs: r.hourStart.getTime(), state: r.state, destruction_W: r.destruction_W, destructionCost_per_h: r.destructionCost_per_h, efficiency: r.efficiency }));
}

/** Hours up to the last hour of the unit's latest closed notice of the kind count as reported. */
async function coveredUntilMs(tx: Tx, unitId: string, kind: NoticeKind): Promise<number> {
  const [r] = await tx
    .select({ last: max(driftNotices.lastSignalHour) })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, unitId), eq(driftNotices.kind, kind), eq(driftNotices.status, 'closed')));
  return r?.last ? new Date(r.last).getTime() : -Infinity;
}

async function checkIdle(unitId: string, decl: NormallyIdle, timeZone: string, siteId: string, fromMs: number, toMs: number): Promise<UnitRuleCheck> {
  return inInsightTx(async (tx, exec) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'unit-rules:' + unitId}))`);
    const covered = await coveredUntilMs(tx, unitId, 'idle');
    const hours = (await ruleHours(tx, unitId, fromMs, toMs)).filter((h) => h.hourStartMs > covered);
    let othersRunning: (ms: number) => boolean = () => true;
    if (decl.whileRunning?.length) {
      const others = await tx
        .select({ id: plantUnits.id })
        .from(plantUnits)
        .where(and(eq(plantUnits.siteId, siteId), inArray(plantUnits.name, decl.whileRunning)));
      const counts = new Map<number, number>();
      if (others.length === decl.whileRunning.length) {
        const rows = await tx
          .select({ hourStart: unitHours.hourStart })
          .from(unitHours)
          .where(
            and(
              inArray(unitHours.unitId, others.map((o) => o.id)),
              inArray(unitHours.state, ['steady', 'unsettled']),
              gte(unitHours.hourStart, new Date(fromMs)),
              lt(unitHours.hourStart, new Date(toMs)),
            ),
          );
        for (const r of rows) counts.set(r.hourStart.getTime(), (counts.get(r.hourStart.getTime()) ?? 0) + 1);
      }
      othersRunning = (ms) => counts.get(ms) === others.length && others.length === decl.whileRunning!.length;
    }
    const runs = idleRuns(hours, decl, timeZone, othersRunning);
    const n = decl.hours ?? DEFAULT_RULE_HOURS;
    const opened = await record(tx, exec, unitId, 'idle', runs, () => ({ ruleText: `normally idle ${normallyIdleText(decl)}`, ruleHours: n, ruleCrossed: null, ruleLimits: null }));
    return { unitId, kind: 'idle', runs: runs.length, opened };
  });
}

async function checkLimits(unitId: string, limits: UnitLimits, currency: string, style: NumberStyle, fromMs: number, toMs: number): Promise<UnitRuleCheck> {
  return inInsightTx(async (tx, exec) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'unit-rules:' + unitId}))`);
    const covered = await coveredUntilMs(tx, unitId, 'limit');
    const hours = (await ruleHours(tx, unitId, fromMs, toMs)).filter((h) => h.hourStartMs > covered);
    const runs = limitRuns(hours, limits);
    const opened = await record(tx, exec, unitId, 'limit', runs, (crossed) => ({
      ruleText: crossed.map((c) => limitText(c as CrossedLimit, limits, currency, style)).join('; '),
      ruleHours: limits.hours ?? DEFAULT_RULE_HOURS,
      ruleCrossed: crossed,
      ruleLimits: { maxCost_per_day: limits.maxCost_per_day ?? null, minEfficiency: limits.minEfficiency ?? null },
    }));
    return { unitId, kind: 'limit', runs: runs.length, opened };
  });
}

type RuleColumns = { ruleText: string; ruleHours: number; ruleCrossed: string[] | null; ruleLimits: { maxCost_per_day: number | null; minEfficiency: number | null } | null };

/**
 * Opens a notice for the first run when none of the unit and kind is open, and lets later runs move
 * its last hour on and refresh its figures. The mails are queued in the same transaction.
 */
async function record(tx: Tx, exec: Exec, unitId: string, kind: 'idle' | 'limit', runs: RuleRun[], rule: (crossed: string[]) => RuleColumns): Promise<string[]> {
  const opened: string[] = [];
  for (const run of runs) {
    const figures = {
      hours: run.hours,
      extra_W: run.meanDestruction_W ?? 0,
      extraCost_per_day: run.cost_per_day,
      meanEfficiency: run.meanEfficiency,
    };
    const [open] = await tx
      .select({ id: driftNotices.id, lastSignalHour: driftNotices.lastSignalHour, hours: driftNotices.hours, ruleCrossed: driftNotices.ruleCrossed })
      .from(driftNotices)
      .where(and(eq(driftNotices.unitId, unitId), eq(driftNotices.kind, kind), ne(driftNotices.status, 'closed')));
    if (open) {
      // a later run, or the same run seen whole again (not cut short by the look-back)
      const last = open.lastSignalHour.getTime();
      if (run.lastMs > last || (run.lastMs === last && run.hours >= open.hours)) {
        const crossed = [...new Set([...(open.ruleCrossed ?? []), ...run.crossed])].sort();
        await tx
          .update(driftNotices)
          .set({ lastSignalHour: new Date(run.lastMs), ...figures, ...(kind === 'limit' ? rule(crossed) : {}) })
          .where(eq(driftNotices.id, open.id));
      }
      continue;
    }
    const [unit] = await tx
      .select({ siteId: plantUnits.siteId, currency: sites.currency })
      .from(plantUnits)
      .innerJoin(sites, eq(sites.id, plantUnits.siteId))
      .where(eq(plantUnits.id, unitId));
    const [row] = await tx
      .insert(driftNotices)
      .values({
        siteId: unit!.siteId,
        unitId,
        kind,
        ...rule(run.crossed),
        direction: 'up',
        status: 'open',
        onsetHour: new Date(run.fromMs),
        signalHour: new Date(run.signalMs),
        lastSignalHour: new Date(run.lastMs),
        ...figures,
        expected_W: 0,
        shift_sigma: 0,
        currency: unit!.currency,
        costBasis: run.cost_per_day === null ? null : "the unit's hours (cost of destruction per hour)",
        k: 0,
        h: 0,
      })
      .onConflictDoNothing()
      .returning({ id: driftNotices.id });
    if (!row) continue;
    await queueNoticeMails(tx, exec, row.id);
    opened.push(row.id);
  }
  return opened;
}
