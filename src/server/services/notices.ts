/**
 * Drift notices: opened by the drift check (./drift.ts), read by everyone, acknowledged ('seen') and
 * closed with a comment by planners, energy leads and admins. One e-mail per notice and person when it
 * opens, guaranteed by the notice_mails marker committed in the same transaction as the mail job;
 * an optional daily digest of open notices per person (notice_preferences, notice_digests).
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { and, asc, desc, eq, gte, inArray, lt, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import { QUEUES } from '../../jobs';
import { extraDestructionCost_per_day, fuelExergyCost_per_J } from '../../lib/analytics/cost';
import type { Role } from '../../lib/roles';
import { db } from '../db/client';
import type { NoticeView } from '../../lib/notice-view';
import { baselines, driftNotices, driftPoints, noticeDigests, noticeMails, noticePreferences, plantUnits, sites, user, type NoticeStatus } from '../db/schema';
import { env } from '../env';
import { escapeHtml } from '../mail';
import { queue } from '../queue';
import { InsightError, isUuid } from './baselines';
import { inInsightTx, type Exec, type Tx } from './drift-tx';
import { ruleFigureLines, ruleNoticeMail, ruleViewFields } from './unit-rule-words';

/** docs/domain.md section 8, shown on every notice page and in every notice mail. */
export const NOTICE_CAUTION =
  'Steam, hot water, compressed gas and fuel systems can kill. Lossline is a monitoring aid: this drift notice is not an alarm, ' +
  'and Lossline is not a protective or control system. Its figures depend on the instruments behind them. Any intervention ' +
  "follows the site's procedures, local codes and the judgement of licensed engineers.";

/** The product's words for the statuses (docs/design.md): open, seen, closed. */
export const NOTICE_STATUS_WORDS: Record<NoticeStatus, string> = { open: 'open', acknowledged: 'seen', closed: 'closed' };

/** Who receives a notice's opening mail. */
export const NOTICE_RECIPIENT_ROLES: readonly Role[] = ['planner', 'energy-lead'];
/** Who may acknowledge and close notices, and opt in to the digest. */
export const NOTICE_ACTORS: readonly Role[] = ['admin', 'energy-lead', 'planner'];

/**
 * Exergy-to-LHV ratio used when a notice's cost falls back to the site's fuel price because the hours
 * carry no cost: about 1.04 for natural gas (docs/domain.md section 4, Kotas 1985, from memory).
 */
export const FALLBACK_EXERGY_TO_LHV = 1.04;

export interface SignalFigures {
  unitId: string;
  baselineId: string;
  direction: 'up' | 'down';
  onsetHour: Date;
  signalHour: Date;
  hours: number;
  /** Mean residual, measured minus expected destruction, onset to signal [W]. */
  extra_W: number;
  expected_W: number;
  measured_W: number;
  shift_sigma: number;
  /** Mean expanded (k = 2) uncertainty of one hour's destruction [W]; null when not every hour has one. */
  hourU_W: number | null;
  /** Cost per joule of destroyed exergy from the hours' own cost [currency/J]; null when they carry none. */
  unitCost: number | null;
  k: number;
  h: number;
}

/**
 * Whether a shift exceeds the measurement uncertainty. Rule: the shift is the mean of n hourly
 * residuals; with the hours' errors independent, the expanded uncertainty of that mean is
 * U_hour / sqrt(n) (GUM, JCGM 100:2008, 4.2.3, applied to the mean of n readings). The shift exceeds
 * the measurement uncertainty when |shift| > U_hour / sqrt(n). A slow instrument drift is not
 * independent hour to hour; the notice therefore also shows U_hour itself.
 */
export function shiftAgainstUncertainty(extra_W: number, hourU_W: number | null, n: number): { shiftU_W: number | null; exceeds: boolean | null } {
  if (hourU_W === null || !Number.isFinite(hourU_W) || n < 1) return { shiftU_W: null, exceeds: null };
  const shiftU_W = hourU_W / Math.sqrt(n);
  return { shiftU_W, exceeds: Math.abs(extra_W) > shiftU_W };
}

async function costRate(tx: Tx, unitId: string, unitCost: number | null): Promise<{ cF: number | null; basis: string | null; currency: string }> {
  const [u] = await tx
    .select({ currency: sites.currency, prices: sites.prices, fuel: plantUnits.fuel })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .where(eq(plantUnits.id, unitId));
  const currency = u?.currency ?? 'EUR';
  if (unitCost !== null && Number.isFinite(unitCost)) return { cF: unitCost, basis: "the unit's hours (cost of destruction per hour)", currency };
  const fuels = (u?.prices ?? []).filter((p) => p.kind === 'fuel');
  const named = u?.fuel?.price ? fuels.find((p) => p.name === u.fuel!.price) : undefined;
  const price = named ?? fuels[0];
  if (!price) return { cF: null, basis: null, currency };
  return {
    cF: fuelExergyCost_per_J(price.price_per_MWh, FALLBACK_EXERGY_TO_LHV),
    basis: `the site's fuel price '${price.name}' (${price.price_per_MWh} ${price.currency}/MWh LHV, exergy/LHV ${FALLBACK_EXERGY_TO_LHV})`,
    currency,
  };
}

/**
 * A CUSUM signal: opens a notice (and queues its mails in the same transaction) unless one for the
 * unit and direction is still open (then its last signal hour moves on) or this shift was already
 * reported (a notice whose last signal is at or after this signal's onset: a re-run of known hours).
 * @returns the id of the notice opened, or null
 */
export async function openOrAbsorbSignal(tx: Tx, exec: Exec, f: SignalFigures): Promise<string | null> {
  const [open] = await tx
    .select({ id: driftNotices.id, lastSignalHour: driftNotices.lastSignalHour })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, f.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, f.direction), ne(driftNotices.status, 'closed')));
  if (open) {
    if (f.signalHour > open.lastSignalHour) await tx.update(driftNotices).set({ lastSignalHour: f.signalHour }).where(eq(driftNotices.id, open.id));
    return null;
  }
  const [reported] = await tx
    .select({ id: driftNotices.id })
    .from(driftNotices)
    .where(and(eq(driftNotices.unitId, f.unitId), eq(driftNotices.kind, 'drift'), eq(driftNotices.direction, f.direction), gte(driftNotices.lastSignalHour, f.onsetHour)))
    .limit(1);
  if (reported) return null;
  const [unit] = await tx.select({ siteId: plantUnits.siteId }).from(plantUnits).where(eq(plantUnits.id, f.unitId));
  const cost = await costRate(tx, f.unitId, f.unitCost);
  const u = shiftAgainstUncertainty(f.extra_W, f.hourU_W, f.hours);
  const [row] = await tx
    .insert(driftNotices)
    .values({
      siteId: unit!.siteId,
      unitId: f.unitId,
      baselineId: f.baselineId,
      direction: f.direction,
      status: 'open',
      onsetHour: f.onsetHour,
      signalHour: f.signalHour,
      lastSignalHour: f.signalHour,
      hours: f.hours,
      extra_W: f.extra_W,
      expected_W: f.expected_W,
      shift_sigma: f.shift_sigma,
      extraCost_per_day: cost.cF === null ? null : extraDestructionCost_per_day(cost.cF, f.measured_W, f.expected_W).cost_per_day,
      currency: cost.currency,
      cF_per_J: cost.cF,
      costBasis: cost.basis,
      hourU_W: f.hourU_W,
      shiftU_W: u.shiftU_W,
      exceedsUncertainty: u.exceeds,
      k: f.k,
      h: f.h,
    })
    .onConflictDoNothing()
    .returning({ id: driftNotices.id });
  if (!row) return null;
  await queueNoticeMails(tx, exec, row.id);
  return row.id;
}

// ---- reading -------------------------------------------------------------------------------------

const acker = alias(user, 'acker');
const closer = alias(user, 'closer');

function noticeQuery() {
  return noticeQueryOn(db());
}

type NoticeRow = Awaited<ReturnType<ReturnType<typeof noticeQuery>['execute']>>[number];

export type { NoticeView } from '../../lib/notice-view';

const localDay = (d: Date, tz: string) => format(new TZDate(d.getTime(), tz), 'yyyy-MM-dd');

function toView(r: NoticeRow): NoticeView {
  const n = r.n;
  return {
    id: n.id,
    siteId: n.siteId,
    siteName: r.siteName,
    timeZone: r.timeZone,
    unitId: n.unitId,
    unitName: r.unitName,
    unitKind: r.unitKind,
    baselineId: n.baselineId,
    baselineLabel:
      r.baselineVersion !== null && r.baselinePeriodFrom && r.baselinePeriodTo
        ? `Baseline v${r.baselineVersion} (${localDay(r.baselinePeriodFrom, r.timeZone)} to ${localDay(new Date(r.baselinePeriodTo.getTime() - 1), r.timeZone)})`
        : null,
    direction: n.direction,
    ...ruleViewFields(n),
    status: n.status,
    statusWord: NOTICE_STATUS_WORDS[n.status],
    onsetHour: n.onsetHour.toISOString(),
    signalHour: n.signalHour.toISOString(),
    lastSignalHour: n.lastSignalHour.toISOString(),
    hours: n.hours,
    extra_W: n.extra_W,
    expected_W: n.expected_W,
    shift_sigma: n.shift_sigma,
    extraCost_per_day: n.extraCost_per_day,
    currency: n.currency,
    costBasis: n.costBasis,
    hourU_W: n.hourU_W,
    shiftU_W: n.shiftU_W,
    exceedsUncertainty: n.exceedsUncertainty,
    k: n.k,
    h: n.h,
    openedAt: n.openedAt.toISOString(),
    acknowledgedBy: r.acknowledgedByName,
    acknowledgedAt: n.acknowledgedAt?.toISOString() ?? null,
    acknowledgeComment: n.acknowledgeComment,
    closedBy: r.closedByName,
    closedAt: n.closedAt?.toISOString() ?? null,
    closeComment: n.closeComment,
    url: noticeUrl(n.id),
  };
}

export function noticeUrl(id: string): string {
  return `${env().PUBLIC_BASE_URL.replace(/\/+$/, '')}/notices/${id}`;
}

/** Notices, open first (then seen, then closed), newest first within each. */
export async function listNotices(filter: { status?: NoticeStatus | 'not-closed'; unitId?: string; siteId?: string; limit?: number } = {}): Promise<NoticeView[]> {
  const where = and(
    filter.status === 'not-closed' ? ne(driftNotices.status, 'closed') : filter.status ? eq(driftNotices.status, filter.status) : undefined,
    filter.unitId && isUuid(filter.unitId) ? eq(driftNotices.unitId, filter.unitId) : undefined,
    filter.siteId && isUuid(filter.siteId) ? eq(driftNotices.siteId, filter.siteId) : undefined,
  );
  const rows = await noticeQuery()
    .where(where)
    .orderBy(sql`case ${driftNotices.status} when 'open' then 0 when 'acknowledged' then 1 else 2 end`, desc(driftNotices.openedAt))
    .limit(filter.limit ?? 500);
  return rows.map(toView);
}

export async function getNotice(noticeId: string): Promise<NoticeView> {
  if (!isUuid(noticeId)) throw new InsightError('NOT_FOUND', 'No such drift notice.');
  const [r] = await noticeQuery().where(eq(driftNotices.id, noticeId));
  if (!r) throw new InsightError('NOT_FOUND', 'No such drift notice.');
  return toView(r);
}

/** Hours of context drawn before the onset and after the latest signal on a notice's chart. */
const CHART_MARGIN_ms = 72 * 3_600_000;

/**
 * A notice with its caution and the unit's drift rows around it: residual [W], normalised residual
 * and the CUSUM sums (in units of s) as saved after each hour.
 */
export async function noticeDetail(noticeId: string) {
  const notice = await getNotice(noticeId);
  const from = new Date(new Date(notice.onsetHour).getTime() - CHART_MARGIN_ms);
  const to = new Date(new Date(notice.lastSignalHour).getTime() + CHART_MARGIN_ms);
  const rows = await db()
    .select({
      hourStart: driftPoints.hourStart,
      residual_W: driftPoints.residual_W,
      x: driftPoints.x,
      cPlus: driftPoints.cPlus,
      cMinus: driftPoints.cMinus,
    })
    .from(driftPoints)
    .where(and(eq(driftPoints.unitId, notice.unitId), gte(driftPoints.hourStart, from), lt(driftPoints.hourStart, to)))
    .orderBy(asc(driftPoints.hourStart))
    .limit(1000);
  return {
    notice,
    caution: notice.kind === 'drift' ? NOTICE_CAUTION : NOTICE_CAUTION.replace('this drift notice', 'this notice'),
    series: rows.map((r) => ({ hourStart: r.hourStart.toISOString(), residual_W: r.residual_W, x: r.x, cPlus: r.cPlus, cMinus: r.cMinus })),
  };
}

// ---- acting --------------------------------------------------------------------------------------

export const AcknowledgeInput = z.strictObject({ comment: z.string().trim().max(2000).optional() });
export const CloseInput = z.strictObject({
  comment: z.string().trim().min(1, 'Say why the notice is closed (what was found or done).').max(2000),
});

/** Marks an open notice as seen. */
export async function acknowledgeNotice(noticeId: string, userId: string, comment?: string): Promise<NoticeView> {
  const n = await getNotice(noticeId);
  const done = await db()
    .update(driftNotices)
    .set({ status: 'acknowledged', acknowledgedBy: userId, acknowledgedAt: new Date(), acknowledgeComment: comment || null })
    .where(and(eq(driftNotices.id, noticeId), eq(driftNotices.status, 'open')))
    .returning({ id: driftNotices.id });
  if (!done.length) throw new InsightError('CONFLICT', `This notice is already ${n.statusWord}.`);
  return getNotice(noticeId);
}

/** Closes an open or seen notice, with the comment that says why. */
export async function closeNotice(noticeId: string, userId: string, comment: string): Promise<NoticeView> {
  const n = await getNotice(noticeId);
  if (!comment.trim()) throw new InsightError('VALIDATION_FAILED', 'Say why the notice is closed (what was found or done).');
  const done = await db()
    .update(driftNotices)
    .set({ status: 'closed', closedBy: userId, closedAt: new Date(), closeComment: comment.trim() })
    .where(and(eq(driftNotices.id, noticeId), ne(driftNotices.status, 'closed')))
    .returning({ id: driftNotices.id });
  if (!done.length) throw new InsightError('CONFLICT', `This notice is already ${n.statusWord}.`);
  return getNotice(noticeId);
}

// ---- mail ----------------------------------------------------------------------------------------

const kW = (W: number) => `${(W / 1000).toLocaleString('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} kW`;
const money = (v: number, currency: string) => `${currency} ${v.toLocaleString('en-GB', { maximumFractionDigits: 0 })}`;
const when = (iso: string, tz: string) => `${format(new TZDate(new Date(iso).getTime(), tz), 'yyyy-MM-dd HH:mm')} (${tz})`;

/** The lines of figures a notice states, shared by its mail and its digest entry. */
export function noticeFigureLines(n: NoticeView): string[] {
  if (n.kind !== 'drift') return ruleFigureLines(n);
  const lines = [
    `Extra destruction: ${n.extra_W >= 0 ? '+' : '-'}${kW(Math.abs(n.extra_W))} against the expected ${kW(n.expected_W)} (mean of ${n.hours} steady hours)`,
    n.extraCost_per_day === null
      ? 'Cost per day: not known (no cost rate for this unit or site)'
      : `Cost per day: ${money(n.extraCost_per_day, n.currency)}`,
    `Since: ${when(n.onsetHour, n.timeZone)} (onset estimate; sustained shift confirmed ${when(n.signalHour, n.timeZone)})`,
    n.exceedsUncertainty === null
      ? 'Against measurement uncertainty: not known (the hours carry no uncertainty)'
      : n.exceedsUncertainty
        ? `Against measurement uncertainty: exceeds it (shift ${kW(Math.abs(n.extra_W))} against +/- ${kW(n.shiftU_W!)} for the mean of ${n.hours} hours; one hour +/- ${kW(n.hourU_W!)})`
        : `Against measurement uncertainty: within it (shift ${kW(Math.abs(n.extra_W))} against +/- ${kW(n.shiftU_W!)} for the mean of ${n.hours} hours)`,
  ];
  return lines;
}

export function noticeMail(n: NoticeView, to: string) {
  if (n.kind !== 'drift') return ruleNoticeMail(n, to, NOTICE_CAUTION);
  const more = n.direction === 'up' ? 'more' : 'less';
  const subject = `Drift notice: ${n.unitName} at ${n.siteName} destroys ${kW(Math.abs(n.extra_W))} ${more} exergy than expected`;
  const lines = noticeFigureLines(n);
  const text = [
    `${n.unitName} (${n.siteName}) has shifted from its expected exergy destruction${n.baselineLabel ? ` (${n.baselineLabel})` : ''}.`,
    '',
    ...lines,
    '',
    `Open the notice: ${n.url}`,
    '',
    NOTICE_CAUTION,
  ].join('\n');
  const html = [
    `<p>${escapeHtml(n.unitName)} (${escapeHtml(n.siteName)}) has shifted from its expected exergy destruction${n.baselineLabel ? ` (${escapeHtml(n.baselineLabel)})` : ''}.</p>`,
    `<ul>${lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul>`,
    `<p><a href="${escapeHtml(n.url)}">Open the notice</a></p>`,
    `<p style="border:1px solid #c98a12;background:#f7e6bf;padding:8px">${escapeHtml(NOTICE_CAUTION)}</p>`,
  ].join('\n');
  return { to, subject, text, html };
}

/**
 * Queues the opening mail of a notice to every active planner and energy lead who has not had it.
 * The marker row and the mail job commit in the caller's transaction, so a retry, a re-run or a
 * concurrent check can never queue a second mail for the same notice and person.
 * @returns the addresses queued now
 */
export async function queueNoticeMails(tx: Tx, exec: Exec, noticeId: string): Promise<string[]> {
  const people = await tx
    .select({ id: user.id, email: user.email })
    .from(user)
    .where(and(inArray(user.role, [...NOTICE_RECIPIENT_ROLES]), eq(user.deactivated, false)))
    .orderBy(asc(user.email));
  if (!people.length) return [];
  const marked = await tx
    .insert(noticeMails)
    .values(people.map((p) => ({ noticeId, userId: p.id })))
    .onConflictDoNothing()
    .returning({ userId: noticeMails.userId });
  if (!marked.length) return [];
  const [r] = await noticeQueryOn(tx).where(eq(driftNotices.id, noticeId));
  const view = toView(r!);
  const boss = await queue();
  const byId = new Map(people.map((p) => [p.id, p.email]));
  const sent: string[] = [];
  for (const m of marked) {
    const to = byId.get(m.userId)!;
    await boss.send(QUEUES.sendMail, noticeMail(view, to), { retryLimit: 3, retryDelay: 30, db: { executeSql: exec as never } });
    sent.push(to);
  }
  return sent;
}

/** Notices with their unit, site, baseline and people, on the pool or a transaction. */
function noticeQueryOn(tx: Pick<Tx, 'select'>) {
  return tx
    .select({
      n: driftNotices,
      unitName: plantUnits.name,
      unitKind: plantUnits.kind,
      siteName: sites.name,
      timeZone: sites.timeZone,
      baselineVersion: baselines.version,
      baselinePeriodFrom: baselines.periodFrom,
      baselinePeriodTo: baselines.periodTo,
      acknowledgedByName: acker.name,
      closedByName: closer.name,
    })
    .from(driftNotices)
    .innerJoin(plantUnits, eq(plantUnits.id, driftNotices.unitId))
    .innerJoin(sites, eq(sites.id, driftNotices.siteId))
    .leftJoin(baselines, eq(baselines.id, driftNotices.baselineId))
    .leftJoin(acker, eq(acker.id, driftNotices.acknowledgedBy))
    .leftJoin(closer, eq(closer.id, driftNotices.closedBy));
}

/** Queues a notice's opening mails to whoever has not had one (idempotent; for retries by hand). */
export async function mailNoticeOpened(noticeId: string): Promise<string[]> {
  await getNotice(noticeId);
  return inInsightTx((tx, exec) => queueNoticeMails(tx, exec, noticeId));
}

// ---- digest --------------------------------------------------------------------------------------

export const PreferencesInput = z.strictObject({ dailyDigest: z.boolean() });

export async function noticePreferencesFor(userId: string) {
  const [p] = await db().select().from(noticePreferences).where(eq(noticePreferences.userId, userId));
  return { dailyDigest: p?.dailyDigest ?? false };
}

export async function setNoticePreferences(userId: string, input: z.infer<typeof PreferencesInput>) {
  await db()
    .insert(noticePreferences)
    .values({ userId, dailyDigest: input.dailyDigest, updatedAt: new Date() })
    .onConflictDoUpdate({ target: noticePreferences.userId, set: { dailyDigest: input.dailyDigest, updatedAt: new Date() } });
  return noticePreferencesFor(userId);
}

/**
 * The daily digest (job "notice-digest"): to each active person who opted in, one mail a day (UTC
 * day; the notice_digests row makes a second run the same day send nothing) listing the notices
 * not yet closed. Nobody is mailed when nothing is open.
 * @returns the addresses queued
 */
export async function sendNoticeDigests(now = new Date()): Promise<string[]> {
  const open = await listNotices({ status: 'not-closed' });
  if (!open.length) return [];
  const day = now.toISOString().slice(0, 10);
  const people = await db()
    .select({ id: user.id, email: user.email })
    .from(noticePreferences)
    .innerJoin(user, eq(user.id, noticePreferences.userId))
    .where(and(eq(noticePreferences.dailyDigest, true), eq(user.deactivated, false), inArray(user.role, [...NOTICE_ACTORS])));
  const sent: string[] = [];
  for (const p of people) {
    const queued = await inInsightTx(async (tx, exec) => {
      const [mark] = await tx.insert(noticeDigests).values({ userId: p.id, day, notices: open.length }).onConflictDoNothing().returning({ userId: noticeDigests.userId });
      if (!mark) return false;
      const boss = await queue();
      await boss.send(QUEUES.sendMail, digestMail(open, p.email, day), { retryLimit: 3, retryDelay: 30, db: { executeSql: exec as never } });
      return true;
    });
    if (queued) sent.push(p.email);
  }
  return sent;
}

export function digestMail(open: NoticeView[], to: string, day: string) {
  const subject = `Lossline: ${open.length} drift notice${open.length === 1 ? '' : 's'} not closed (${day})`;
  const blocks = open.map((n) => [`${n.unitName} at ${n.siteName} - ${n.statusWord}`, ...noticeFigureLines(n).map((l) => `  ${l}`), `  ${n.url}`].join('\n'));
  const text = [`Drift notices not yet closed on ${day}:`, '', ...blocks.flatMap((b) => [b, '']), NOTICE_CAUTION].join('\n');
  const html = [
    `<p>Drift notices not yet closed on ${escapeHtml(day)}:</p>`,
    ...open.map(
      (n) =>
        `<h3><a href="${escapeHtml(n.url)}">${escapeHtml(n.unitName)} at ${escapeHtml(n.siteName)}</a> (${escapeHtml(n.statusWord)})</h3><ul>${noticeFigureLines(n)
          .map((l) => `<li>${escapeHtml(l)}</li>`)
          .join('')}</ul>`,
    ),
    `<p style="border:1px solid #c98a12;background:#f7e6bf;padding:8px">${escapeHtml(NOTICE_CAUTION)}</p>`,
  ].join('\n');
  return { to, subject, text, html };
}
