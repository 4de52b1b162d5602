/**
 * Drift notices: opened and kept current by the drift check (./drift.ts, ./notice-life.ts), read by
 * everyone, acknowledged ('seen') and closed with what was done by planners, energy leads and admins.
 * One e-mail per notice and person when it opens, guaranteed by the notice_mails marker committed in
 * the same transaction as the mail job; one escalation mail per step and person when its cost per day
 * has grown past the site's multiple (notice_escalations); an optional daily digest of open notices
 * per person (notice_preferences, notice_digests).
 */
import { personMayUseSite, siteScopeFor } from '../access';
import { and, asc, eq, inArray, ne } from 'drizzle-orm';
import { z } from 'zod';
import { QUEUES, sendJob, type SendMailPayload } from '~/jobs';
type MailJob = z.infer<typeof SendMailPayload>;
import { unitFuelCost } from '~/lib/engine/unit-cost';
import { siteDay, siteDayStart } from '~/lib/site-time';
import { digestDayDue, digestTimeWords, digestZoneOf } from '~/lib/digest-time';
import { DAY_MS, hourCeil, hourFloor } from '~/lib/time';
import type { UnitKind } from '~/lib/kinds';
import type { Role } from '~/lib/roles';
import { db } from '../db/client';
import type { NoticeView } from '~/lib/notice-view';
import {
  CLOSE_OUTCOMES,
  baselines,
  driftNotices,
  noticeDigests,
  noticeEscalations,
  noticeMails,
  noticePreferences,
  noticeSiteSettings,
  plantPorts,
  plantUnits,
  sites,
  user,
  type CloseOutcome,
} from '../db/schema';
import { queue } from '../queue';
import { isId } from '../access';
import { AppError } from '../errors';
import { inInsightTx, type Exec, type Tx } from './drift-tx';
import { digestMail, escalationMail, noticeMail } from './notice-mail';

export { TREND_WORDS, digestMail, escalationMail, noticeFigureLines, noticeMail } from './notice-mail';
export { NOTICE_SORTS, NOTICE_STATUS_WORDS, getNotice, listNotices, noticeDetail, noticeUrl, type NoticeSort, type NoticeView } from './notice-read';
import { getNotice, listNotices, noticeQueryOn, toView } from './notice-read';
import { oneWithDisplay, withDisplay } from './notice-display';


/** Who receives a notice's opening mail: planners and energy leads (docs/notices.md, "E-mail"). */
export const NOTICE_RECIPIENT_ROLES: readonly Role[] = ['planner', 'energy-lead'];
/**
 * Who receives the opening mail of a notice of LESS destruction than expected: the energy leads
 * only. Less destruction is no work for maintenance; it says the baseline no longer describes the
 * unit (a better operation, a repair, or an instrument that has drifted), which is the energy
 * lead's to judge. Planners still see the notice in the list.
 */
export const LESS_DESTRUCTION_RECIPIENT_ROLES: readonly Role[] = ['energy-lead'];

/** The roles a notice's mails go to, by its direction. */
export function noticeRecipientRoles(direction: 'up' | 'down'): readonly Role[] {
  return direction === 'down' ? LESS_DESTRUCTION_RECIPIENT_ROLES : NOTICE_RECIPIENT_ROLES;
}
/** Who may acknowledge and close notices, and opt in to the digest. */
export const NOTICE_ACTORS: readonly Role[] = ['admin', 'energy-lead', 'planner'];

/**
 * The cost rate of a unit's destroyed exergy: the hours' own, else the site's price of the unit's
 * fuel by the engine's rule (src/lib/engine/unit-cost.ts): electricity for pumps, compressors, fans
 * and motors, the boiler's fuel for boilers and the units downstream of them.
 */
export async function costRate(tx: Tx, unitId: string, unitCost: number | null): Promise<{ cF: number | null; basis: string | null; currency: string }> {
  const [u] = await tx
    .select({ siteId: sites.id, currency: sites.currency, prices: sites.prices, T0_K: sites.T0_K, kind: plantUnits.kind, fuel: plantUnits.fuel })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .where(eq(plantUnits.id, unitId));
  if (!u) return { cF: null, basis: null, currency: 'EUR' };
  const currency = u.currency;
  if (unitCost !== null && Number.isFinite(unitCost)) return { cF: unitCost, basis: "the unit's hours (cost of destruction per hour)", currency };
  const ports = await tx.select({ fluid: plantPorts.fluid }).from(plantPorts).where(eq(plantPorts.unitId, unitId));
  const boilers = await tx
    .select({ fuel: plantUnits.fuel })
    .from(plantUnits)
    .where(and(eq(plantUnits.siteId, u.siteId), eq(plantUnits.kind, 'boiler')))
    .orderBy(asc(plantUnits.name));
  const unit = { kind: u.kind as UnitKind, fuel: u.fuel ?? null, ports: ports.map((p) => ({ fluid: p.fluid ?? null })) };
  const c = unitFuelCost(unit, { prices: u.prices, currency, T0_K: u.T0_K }, boilers.map((b) => ({ fuel: b.fuel ?? null })));
  return c ? { cF: c.cF_per_J, basis: `the site's prices: ${c.basis}`, currency } : { cF: null, basis: null, currency };
}

/** Default multiple of the cost per day at the last mail that sends an escalation mail (common practice). */
export const DEFAULT_ESCALATION_MULTIPLE = 2;

export const NoticeSettingsInput = z.strictObject({
  /** Multiple of the cost per day at the last mail [-]. */
  escalationMultiple: z.number().finite().min(1.1, 'The multiple must be at least 1.1 (else every small change mails).').max(100, 'A multiple above 100 would hardly ever mail.'),
});

/** Sites by name, for the settings form. */
export async function siteChoices(): Promise<{ id: string; name: string }[]> {
  return db().select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name));
}

/** The multiple that sends an escalation mail at a site. */
export async function escalationMultipleFor(r: Pick<Tx, 'select'>, siteId: string): Promise<number> {
  const [row] = await r.select({ m: noticeSiteSettings.escalationMultiple }).from(noticeSiteSettings).where(eq(noticeSiteSettings.siteId, siteId));
  return row?.m ?? DEFAULT_ESCALATION_MULTIPLE;
}

/** A site's notice settings (the defaults when nobody changed them). */
export async function noticeSettingsFor(siteId: string) {
  if (!isId(siteId)) throw new AppError('NOT_FOUND', 'No such site.');
  const [site] = await db().select({ id: sites.id }).from(sites).where(eq(sites.id, siteId));
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  const [row] = await db().select().from(noticeSiteSettings).where(eq(noticeSiteSettings.siteId, siteId));
  return row
    ? { siteId, escalationMultiple: row.escalationMultiple, isDefault: false, updatedAt: row.updatedAt.toISOString() }
    : { siteId, escalationMultiple: DEFAULT_ESCALATION_MULTIPLE, isDefault: true, updatedAt: null };
}

export async function setNoticeSettings(siteId: string, input: z.infer<typeof NoticeSettingsInput>, userId: string | null) {
  await noticeSettingsFor(siteId);
  await db()
    .insert(noticeSiteSettings)
    .values({ siteId, escalationMultiple: input.escalationMultiple, updatedBy: userId, updatedAt: new Date() })
    .onConflictDoUpdate({ target: noticeSiteSettings.siteId, set: { escalationMultiple: input.escalationMultiple, updatedBy: userId, updatedAt: new Date() } });
  return noticeSettingsFor(siteId);
}

// ---- acting --------------------------------------------------------------------------------------

export const AcknowledgeInput = z.strictObject({ comment: z.string().trim().max(2000).optional() });
const Day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})?)?$/, 'Give the date as YYYY-MM-DD (or an ISO date and time).');

/**
 * Closing says what was done. The old shape ({ comment }) still closes a notice (outcome not said).
 * - repaired: with the date of the work (repairedAt); the drift check restarts the unit's sums there
 *   and gives the verdict after VERIFY_HOURS steady hours;
 * - instrument-fault: the shift was in the instruments, not the unit;
 * - new-normal: accepted as the unit's new normal; newNormalFrom is the date a new baseline version
 *   should start from (the page offers to build it);
 * - no-action.
 */
export const CloseInput = z
  .strictObject({
    comment: z.string().trim().min(1, 'Say why the notice is closed (what was found or done).').max(2000),
    outcome: z.enum(CLOSE_OUTCOMES).optional(),
    repairedAt: Day.optional(),
    newNormalFrom: Day.optional(),
  })
  .superRefine((v, ctx) => {
    if (v.outcome === 'repaired' && !v.repairedAt) ctx.addIssue({ code: 'custom', path: ['repairedAt'], message: 'Give the date of the repair work.' });
    if (v.repairedAt && v.outcome !== 'repaired') ctx.addIssue({ code: 'custom', path: ['repairedAt'], message: 'A repair date goes with the outcome "repaired".' });
    if (v.newNormalFrom && v.outcome !== 'new-normal') ctx.addIssue({ code: 'custom', path: ['newNormalFrom'], message: 'A date for the new normal goes with the outcome "new-normal".' });
  });
export type CloseDetails = Omit<z.infer<typeof CloseInput>, 'comment'>;

/** Marks an open notice as seen. */
export async function acknowledgeNotice(noticeId: string, userId: string, comment?: string): Promise<NoticeView> {
  const n = await getNotice(noticeId);
  const done = await db()
    .update(driftNotices)
    .set({ status: 'acknowledged', acknowledgedBy: userId, acknowledgedAt: new Date(), acknowledgeComment: comment || null })
    .where(and(eq(driftNotices.id, noticeId), eq(driftNotices.status, 'open')))
    .returning({ id: driftNotices.id });
  if (!done.length) throw new AppError('CONFLICT', `This notice is already ${n.statusWord}.`);
  return getNotice(noticeId);
}

/** A date given as YYYY-MM-DD is the start of that day in the site's time zone. */
function siteDate(text: string, tz: string): Date {
  const day = siteDayStart(text, tz);
  return day !== null ? new Date(day) : new Date(text);
}

/**
 * Closes an open or seen notice, with the comment that says why and, optionally, what was done. A
 * repair queues a drift check of the unit from the repair date in the same transaction.
 */
export async function closeNotice(noticeId: string, userId: string, comment: string, details: CloseDetails = {}): Promise<NoticeView> {
  const n = await getNotice(noticeId);
  if (!comment.trim()) throw new AppError('VALIDATION_FAILED', 'Say why the notice is closed (what was found or done).');
  const outcome: CloseOutcome | null = details.outcome ?? null;
  if (outcome === 'repaired' && !details.repairedAt) throw new AppError('VALIDATION_FAILED', 'Give the date of the repair work.');
  const repairedAt = outcome === 'repaired' ? siteDate(details.repairedAt!, n.timeZone) : null;
  const newNormalFrom = outcome === 'new-normal' && details.newNormalFrom ? siteDate(details.newNormalFrom, n.timeZone) : null;
  if (repairedAt) {
    if (Number.isNaN(repairedAt.getTime())) throw new AppError('VALIDATION_FAILED', 'The repair date is not a date.');
    if (repairedAt.getTime() < new Date(n.onsetHour).getTime()) throw new AppError('VALIDATION_FAILED', 'The repair date is before the shift began.');
    if (repairedAt.getTime() > Date.now() + DAY_MS) throw new AppError('VALIDATION_FAILED', 'The repair date is in the future.');
  }
  if (newNormalFrom && Number.isNaN(newNormalFrom.getTime())) throw new AppError('VALIDATION_FAILED', 'The date of the new normal is not a date.');
  const closed = await inInsightTx(async (tx, exec) => {
    const done = await tx
      .update(driftNotices)
      .set({ status: 'closed', closedBy: userId, closedAt: new Date(), closeComment: comment.trim(), closeOutcome: outcome, repairedAt, newNormalFrom })
      .where(and(eq(driftNotices.id, noticeId), ne(driftNotices.status, 'closed')))
      .returning({ id: driftNotices.id });
    if (!done.length) return false;
    if (repairedAt) {
      const boss = await queue();
      const hourMs = hourFloor(repairedAt.getTime());
      await sendJob(
        boss,
        QUEUES.checkDrift,
        { siteId: n.siteId, fromMs: hourMs, toMs: hourCeil(Date.now()), unitIds: [n.unitId] },
        { db: { executeSql: exec as never } },
      );
    }
    return true;
  });
  if (!closed) throw new AppError('CONFLICT', `This notice is already ${n.statusWord}.`);
  return getNotice(noticeId);
}

// ---- mail (the texts are in ./notice-mail.ts) -----------------------------------------------------

/**
 * Active people of the notice's recipient roles (noticeRecipientRoles: planners and energy leads, or
 * energy leads only for less destruction) who may use the notice's site, by address.
 */
async function noticeRecipients(tx: Tx, noticeId: string) {
  const [n] = await tx.select({ siteId: driftNotices.siteId, direction: driftNotices.direction }).from(driftNotices).where(eq(driftNotices.id, noticeId));
  if (!n) return [];
  return tx
    .select({ id: user.id, email: user.email })
    .from(user)
    .where(and(inArray(user.role, [...noticeRecipientRoles(n.direction)]), eq(user.deactivated, false), personMayUseSite(n.siteId)))
    .orderBy(asc(user.email));
}

/**
 * Queues the opening mail of a notice to every active planner and energy lead who has not had it.
 * The marker row and the mail job commit in the caller's transaction, so a retry, a re-run or a
 * concurrent check can never queue a second mail for the same notice and person.
 * @returns the addresses queued now
 */
export async function queueNoticeMails(tx: Tx, exec: Exec, noticeId: string): Promise<string[]> {
  return queueMarkedMails(
    tx,
    exec,
    noticeId,
    async (people) => tx.insert(noticeMails).values(people.map((p) => ({ noticeId, userId: p.id }))).onConflictDoNothing().returning({ userId: noticeMails.userId }),
    noticeMail,
  );
}

/**
 * Queues escalation step `step` of a notice to every active planner and energy lead who has not had
 * it; the marker rows (notice, step, person) and the jobs commit in the caller's transaction, so a
 * step is mailed at most once per person.
 */
export async function queueEscalationMails(tx: Tx, exec: Exec, noticeId: string, step: number, fromCost_per_day: number, toCost_per_day: number): Promise<string[]> {
  return queueMarkedMails(
    tx,
    exec,
    noticeId,
    async (people) =>
      tx
        .insert(noticeEscalations)
        .values(people.map((p) => ({ noticeId, step, userId: p.id, cost_per_day: toCost_per_day })))
        .onConflictDoNothing()
        .returning({ userId: noticeEscalations.userId }),
    (view, to) => escalationMail(view, to, step, fromCost_per_day, toCost_per_day),
  );
}

/**
 * The one marker-then-send loop of notice mails: mark the people who have not had this mail (the
 * marker's unique key refuses a second), then queue one mail job for each person marked now, both
 * in the caller's transaction. @returns the addresses queued now
 */
async function queueMarkedMails(
  tx: Tx,
  exec: Exec,
  noticeId: string,
  mark: (people: { id: string; email: string }[]) => Promise<{ userId: string }[]>,
  compose: (view: NoticeView, to: string) => MailJob,
): Promise<string[]> {
  const people = await noticeRecipients(tx, noticeId);
  if (!people.length) return [];
  const marked = await mark(people);
  if (!marked.length) return [];
  const [r] = await noticeQueryOn(tx).where(eq(driftNotices.id, noticeId));
  const view = await oneWithDisplay(toView(r!), tx);
  const boss = await queue();
  const byId = new Map(people.map((p) => [p.id, p.email]));
  const sent: string[] = [];
  for (const m of marked) {
    const to = byId.get(m.userId)!;
    await sendJob(boss, QUEUES.sendMail, compose(view, to), { retryLimit: 3, retryDelay: 30, db: { executeSql: exec as never } });
    sent.push(to);
  }
  return sent;
}

/** Queues a notice's opening mails to whoever has not had one (idempotent; for retries by hand). */
export async function mailNoticeOpened(noticeId: string): Promise<string[]> {
  await getNotice(noticeId);
  return inInsightTx((tx, exec) => queueNoticeMails(tx, exec, noticeId));
}

// ---- digest --------------------------------------------------------------------------------------

export const PreferencesInput = z.strictObject({ dailyDigest: z.boolean() });

/** The sites a person may use, in the site list's order (by name), with their zones. */
async function sitesOfPerson(p: { id: string; role: string; allSites: boolean }, all?: { id: string; name: string; timeZone: string }[]) {
  const list = all ?? (await db().select({ id: sites.id, name: sites.name, timeZone: sites.timeZone }).from(sites).orderBy(asc(sites.name)));
  const scope = await siteScopeFor({ ...p, role: p.role as Role });
  return { scope, mine: scope === 'all' ? list : list.filter((s) => scope.includes(s.id)) };
}

/**
 * The person's notice settings, and when their digest arrives in words (`sendsAt`): 06:00 in the zone
 * of their first site (src/lib/digest-time.ts).
 */
export async function noticePreferencesFor(userId: string) {
  const [p] = await db().select().from(noticePreferences).where(eq(noticePreferences.userId, userId));
  const [person] = await db().select({ id: user.id, role: user.role, allSites: user.allSites }).from(user).where(eq(user.id, userId));
  const zone = person ? digestZoneOf((await sitesOfPerson(person)).mine) : null;
  return { dailyDigest: p?.dailyDigest ?? false, timeZone: zone?.timeZone ?? null, sendsAt: digestTimeWords(zone) };
}

export async function setNoticePreferences(userId: string, input: z.infer<typeof PreferencesInput>) {
  await db()
    .insert(noticePreferences)
    .values({ userId, dailyDigest: input.dailyDigest, updatedAt: new Date() })
    .onConflictDoUpdate({ target: noticePreferences.userId, set: { dailyDigest: input.dailyDigest, updatedAt: new Date() } });
  return noticePreferencesFor(userId);
}

/**
 * The daily digest (job "notice-digest", run every hour): to each active person who opted in, one
 * mail per local day listing the notices not yet closed on their sites, sent in the first run from
 * 06:00 in the zone of their first site (src/lib/digest-time.ts: until noon, so a missed run is made
 * up the same morning). The notice_digests row, keyed by that local day, makes every later run of the
 * day send nothing. Nobody is mailed when nothing is open.
 * @param anyHour a run by hand: send to everyone not yet mailed for their local day at `now`, whatever the hour
 * @returns the addresses queued
 */
export async function sendNoticeDigests(now = new Date(), { anyHour = false } = {}): Promise<string[]> {
  const open = await withDisplay(await listNotices({ status: 'not-closed' }));
  if (!open.length) return [];
  const siteList = await db().select({ id: sites.id, name: sites.name, timeZone: sites.timeZone }).from(sites).orderBy(asc(sites.name));
  const people = await db()
    .select({ id: user.id, email: user.email, role: user.role, allSites: user.allSites })
    .from(noticePreferences)
    .innerJoin(user, eq(user.id, noticePreferences.userId))
    .where(and(eq(noticePreferences.dailyDigest, true), eq(user.deactivated, false), inArray(user.role, [...NOTICE_ACTORS])));
  const sent: string[] = [];
  for (const p of people) {
    // Each person hears only of the sites they may use (src/server/access.ts), at 06:00 of their first one.
    const { scope, mine } = await sitesOfPerson(p, siteList);
    const zone = digestZoneOf(mine);
    const day = zone && (anyHour ? siteDay(now, zone.timeZone) : digestDayDue(zone.timeZone, now));
    if (!day) continue;
    const theirs = scope === 'all' ? open : open.filter((n) => scope.includes(n.siteId));
    if (!theirs.length) continue;
    const queued = await inInsightTx(async (tx, exec) => {
      const [mark] = await tx.insert(noticeDigests).values({ userId: p.id, day, notices: theirs.length }).onConflictDoNothing().returning({ userId: noticeDigests.userId });
      if (!mark) return false;
      const boss = await queue();
      await sendJob(boss, QUEUES.sendMail, digestMail(theirs, p.email, now), { retryLimit: 3, retryDelay: 30, db: { executeSql: exec as never } });
      return true;
    });
    if (queued) sent.push(p.email);
  }
  return sent;
}
