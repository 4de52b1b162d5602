// Tables of baselines, drift notices and reports (issue: insight). Owned by the insight work.
import type { CloseOutcome, NoticeTrend, PriorReason, VerdictView } from '~/lib/notice-view';
import { sql } from 'drizzle-orm';
import { boolean, date, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import type { BaselineModel, BaselineTerm } from '~/lib/analytics/baseline';
import { user } from './auth-schema';
import { idColumn, siteIdColumn, unitIdColumn } from './columns';

export const BASELINE_STATUSES = ['draft', 'active', 'discarded', 'retired'] as const;
export type BaselineStatus = (typeof BASELINE_STATUSES)[number];

/**
 * A unit's baseline, versioned per unit: efficiency and exergy destruction regressed on load and
 * ambient temperature (T0 of the hour) over a reference period of steady hours. A fit is saved as a
 * draft; accepting it makes it active and retires the previous active one (at most one active per
 * unit, enforced by a partial unique index). Models are the analytics library's JSON-friendly
 * BaselineModel (coefficients, scaled basis, (Z^T Z)^-1 and fit statistics); efficiency is null for
 * dissipative units (valves, coolers) that have no product.
 */
export const baselines = pgTable(
  'baselines',
  {
    id: idColumn(),
    unitId: unitIdColumn(),
    version: integer('version').notNull(),
    status: text('status').$type<BaselineStatus>().notNull().default('draft'),
    /** Reference period [periodFrom, periodTo), hour starts. */
    periodFrom: timestamp('period_from', { withTimezone: true }).notNull(),
    periodTo: timestamp('period_to', { withTimezone: true }).notNull(),
    terms: jsonb('terms').$type<BaselineTerm[]>().notNull(),
    /** Steady hours fitted. */
    hours: integer('hours').notNull(),
    efficiencyModel: jsonb('efficiency_model').$type<BaselineModel>(),
    destructionModel: jsonb('destruction_model').$type<BaselineModel>().notNull(),
    loadUnit: text('load_unit'),
    note: text('note'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    decidedBy: text('decided_by').references(() => user.id, { onDelete: 'set null' }),
    decidedAt: timestamp('decided_at', { withTimezone: true }),
    retiredAt: timestamp('retired_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('baselines_unit_version').on(t.unitId, t.version),
    uniqueIndex('baselines_one_active').on(t.unitId).where(sql`status = 'active'`),
  ],
);

/** Per-unit CUSUM settings (docs/domain.md section 7: k = 0.5, h = 8 by default); energy leads edit. */
export const driftSettings = pgTable('drift_settings', {
  unitId: unitIdColumn().primaryKey(),
  k: doublePrecision('k').notNull().default(0.5),
  h: doublePrecision('h').notNull().default(5),
  updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * The drift check's saved state, one row per steady hour after the active baseline's period: the
 * residual of destruction against the baseline and the tabular CUSUM after that hour. Keyed by unit
 * and hour, so a re-run over the same hours rewrites rather than adds; the last row is the state the
 * next hour continues from (zero after a signal).
 */
export const driftPoints = pgTable(
  'drift_points',
  {
    unitId: unitIdColumn(),
    hourStart: timestamp('hour_start', { withTimezone: true }).notNull(),
    baselineId: uuid('baseline_id')
      .notNull()
      .references(() => baselines.id, { onDelete: 'cascade' }),
    /** CUSUM step (1 = first steady hour after the reference period). */
    step: integer('step').notNull(),
    destruction_W: doublePrecision('destruction_w').notNull(),
    expected_W: doublePrecision('expected_w').notNull(),
    residual_W: doublePrecision('residual_w').notNull(),
    /** The CUSUM input: the residual's standardised AR(1) innovation (residual / s for a baseline without phi) [-]. */
    x: doublePrecision('x').notNull(),
    /** CUSUM sums after this hour (before the restart that follows a signal) [-]. */
    cPlus: doublePrecision('c_plus').notNull(),
    cMinus: doublePrecision('c_minus').notNull(),
    nPlus: integer('n_plus').notNull(),
    nMinus: integer('n_minus').notNull(),
    /** The sums crossed h at this hour ('up', 'down' or 'both'); the next hour starts again from zero. */
    signal: text('signal').$type<'up' | 'down' | 'both'>(),
    destructionU_W: doublePrecision('destruction_u_w'),
    /** Cost of the hour's destruction [currency per hour], for the unit's cost rate. */
    destructionCost_per_h: doublePrecision('destruction_cost_per_h'),
  },
  (t) => [primaryKey({ columns: [t.unitId, t.hourStart] }), index('drift_points_step').on(t.unitId, t.step)],
);

export const NOTICE_KINDS = ['drift', 'idle', 'limit'] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];

export const NOTICE_STATUSES = ['open', 'acknowledged', 'closed'] as const;
export type NoticeStatus = (typeof NOTICE_STATUSES)[number];
export const CLOSE_OUTCOMES = ['repaired', 'instrument-fault', 'new-normal', 'no-action'] as const satisfies readonly CloseOutcome[];
export type { CloseOutcome, NoticeTrend, PriorReason };
/** The repair verdict's figures as stored (W, currency per month): the view without its hour and result. */
export type StoredVerdict = Omit<VerdictView, 'hour' | 'back'>;

/**
 * A drift notice: a sustained shift of a unit's destruction from its expected value (a CUSUM
 * signal). Figures at opening: extra destruction (mean residual from onset to signal), its cost per
 * day, and the comparison with the measurement uncertainty. One notice per unit and direction is
 * open (or acknowledged) at a time, enforced by a partial unique index.
 */
export const driftNotices = pgTable(
  'drift_notices',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    unitId: unitIdColumn(),
    baselineId: uuid('baseline_id').references(() => baselines.id, { onDelete: 'set null' }),
    /**
     * 'drift' (a CUSUM signal), 'idle' (a unit declared normally idle runs) or 'limit' (a unit crossed a
     * limit an energy lead set); the last two from src/server/services/unit-rules.ts. For those,
     * extra_W is the run's mean destruction and extraCost_per_day its cost per day, expected_W,
     * shift_sigma, k and h are 0, and direction is 'up'.
     */
    kind: text('kind').$type<NoticeKind>().notNull().default('drift'),
    /** Idle and limit notices: the rule in words at opening ("normally idle always, while TG1 runs"). */
    ruleText: text('rule_text'),
    /** Idle and limit notices: the consecutive hours that open a notice [h]. */
    ruleHours: integer('rule_hours'),
    /** Limit notices: the limits crossed, 'cost' and/or 'efficiency', and the limits as set. */
    ruleCrossed: jsonb('rule_crossed').$type<string[]>(),
    ruleLimits: jsonb('rule_limits').$type<{ maxCost_per_day: number | null; minEfficiency: number | null }>(),
    /** Idle and limit notices: mean exergy efficiency of the run's hours [-]. */
    meanEfficiency: doublePrecision('mean_efficiency'),
    direction: text('direction').$type<'up' | 'down'>().notNull(),
    status: text('status').$type<NoticeStatus>().notNull().default('open'),
    onsetHour: timestamp('onset_hour', { withTimezone: true }).notNull(),
    signalHour: timestamp('signal_hour', { withTimezone: true }).notNull(),
    /** Latest hour at which the CUSUM signalled again while the notice was not closed. */
    lastSignalHour: timestamp('last_signal_hour', { withTimezone: true }).notNull(),
    /** Steady hours from onset to signal. */
    hours: integer('hours').notNull(),
    /** Mean measured minus expected destruction from onset to signal [W] (negative: less than expected). */
    extra_W: doublePrecision('extra_w').notNull(),
    expected_W: doublePrecision('expected_w').notNull(),
    /** Shift in units of the baseline's residual spread [-]. */
    shift_sigma: doublePrecision('shift_sigma').notNull(),
    /** Cost per day of extra_W [currency/day]; null when no cost rate is known. */
    extraCost_per_day: doublePrecision('extra_cost_per_day'),
    currency: text('currency').notNull(),
    cF_per_J: doublePrecision('cf_per_j'),
    costBasis: text('cost_basis'),
    /** Mean expanded (k = 2) uncertainty of one hour's destruction [W]. */
    hourU_W: doublePrecision('hour_u_w'),
    /** Uncertainty of the mean shift, hourU_W / sqrt(hours) [W]. */
    shiftU_W: doublePrecision('shift_u_w'),
    /** |extra_W| > shiftU_W; null when the hours carry no uncertainty. */
    exceedsUncertainty: boolean('exceeds_uncertainty'),
    k: doublePrecision('k').notNull(),
    h: doublePrecision('h').notNull(),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull().defaultNow(),
    acknowledgedBy: text('acknowledged_by').references(() => user.id, { onDelete: 'set null' }),
    acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }),
    acknowledgeComment: text('acknowledge_comment'),
    closedBy: text('closed_by').references(() => user.id, { onDelete: 'set null' }),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    closeComment: text('close_comment'),
    // ---- live figures (recomputed at every drift check; the columns above keep the first figures) ----
    /** Mean residual of the last 24 steady hours [W], its combined expanded uncertainty and hours. */
    current_W: doublePrecision('current_w'),
    currentU_W: doublePrecision('current_u_w'),
    currentMeasU_W: doublePrecision('current_meas_u_w'),
    currentHours: integer('current_hours'),
    /** |current_W| beyond its measurement uncertainty; null when the hours carry none. */
    currentExceeds: boolean('current_exceeds'),
    currentCost_per_day: doublePrecision('current_cost_per_day'),
    currentCostU_per_day: doublePrecision('current_cost_u_per_day'),
    /** Mean residual from onset to the latest hour [W], its uncertainty and hours. */
    sinceOnset_W: doublePrecision('since_onset_w'),
    sinceOnsetU_W: doublePrecision('since_onset_u_w'),
    sinceOnsetHours: integer('since_onset_hours'),
    trend: text('trend').$type<NoticeTrend>(),
    /** Latest steady hour behind the live figures. */
    figuresHour: timestamp('figures_hour', { withTimezone: true }),
    /** The shift has gone since this hour; the notice no longer takes later signals. */
    fadedSince: timestamp('faded_since', { withTimezone: true }),
    /** A later, clearly larger shift of the unit opened this notice. */
    supersededBy: uuid('superseded_by'),
    /** The earlier notice of the unit and direction this one follows, and why it is a notice of its own. */
    priorNoticeId: uuid('prior_notice_id').references((): AnyPgColumn => driftNotices.id, { onDelete: 'set null' }),
    priorReason: text('prior_reason').$type<PriorReason>(),
    // ---- closing and the repair verdict ----
    closeOutcome: text('close_outcome').$type<CloseOutcome>(),
    repairedAt: timestamp('repaired_at', { withTimezone: true }),
    newNormalFrom: timestamp('new_normal_from', { withTimezone: true }),
    /** The last steady hour of the reporting period when the verdict was given. */
    verdictHour: timestamp('verdict_hour', { withTimezone: true }),
    verdictBack: boolean('verdict_back'),
    verdict: jsonb('verdict').$type<StoredVerdict>(),
    followUpNoticeId: uuid('follow_up_notice_id').references((): AnyPgColumn => driftNotices.id, { onDelete: 'set null' }),
    // ---- escalation ----
    /** Cost per day stated by the latest mail about this notice (opening or escalation). */
    mailedCost_per_day: doublePrecision('mailed_cost_per_day'),
    escalationStep: integer('escalation_step').notNull().default(0),
  },
  (t) => [
    uniqueIndex('drift_notices_one_open')
      .on(t.unitId, t.kind, t.direction)
      .where(sql`status <> 'closed' and faded_since is null and superseded_by is null`),
    index('drift_notices_status').on(t.status, t.openedAt),
  ],
);

/**
 * One row per notice and person mailed: the marker that makes "one mail when a notice opens" hold
 * under retries and concurrent checks (insert ... on conflict do nothing, and the mail job is queued
 * in the same transaction only for rows actually inserted).
 */
export const noticeMails = pgTable(
  'notice_mails',
  {
    noticeId: uuid('notice_id')
      .notNull()
      .references(() => driftNotices.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    queuedAt: timestamp('queued_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.noticeId, t.userId] })],
);

/** Per-person notice settings: the optional daily digest of open notices. */
export const noticePreferences = pgTable('notice_preferences', {
  userId: text('user_id')
    .primaryKey()
    .references(() => user.id, { onDelete: 'cascade' }),
  dailyDigest: boolean('daily_digest').notNull().default(false),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One digest per person and local day (in the zone of their first site, src/lib/digest-time.ts), whatever the number of runs. */
export const noticeDigests = pgTable(
  'notice_digests',
  {
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    day: date('day').notNull(),
    notices: integer('notices').notNull(),
    queuedAt: timestamp('queued_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.day] })],
);

/**
 * One row per notice, escalation step and person: the marker that makes "one escalation mail per
 * step" hold under retries and concurrent checks (as notice_mails does for the opening mail).
 */
export const noticeEscalations = pgTable(
  'notice_escalations',
  {
    noticeId: uuid('notice_id')
      .notNull()
      .references(() => driftNotices.id, { onDelete: 'cascade' }),
    step: integer('step').notNull(),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    cost_per_day: doublePrecision('cost_per_day').notNull(),
    queuedAt: timestamp('queued_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.noticeId, t.step, t.userId] })],
);

/** Per-site notice settings an energy lead sets: the growth of cost per day that sends an escalation mail. */
export const noticeSiteSettings = pgTable('notice_site_settings', {
  siteId: siteIdColumn().primaryKey(),
  /** Multiple of the cost per day at the last mail that sends the next one [-]; default 2. */
  escalationMultiple: doublePrecision('escalation_multiple').notNull().default(2),
  updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
