/** Answers of the drift notices under /api/v1 (GET /api/v1/sites/{siteId}/notices): NoticeView of src/lib/notice-view.ts. */
import { z } from 'zod';
import { pageOf } from './paging';
import { Id, Instant, Num } from './common';

const Verdict = z.object({
  hour: Instant,
  back: z.boolean(),
  before_W: z.number(),
  beforeU_W: z.number(),
  beforeHours: z.number(),
  after_W: z.number(),
  afterU_W: z.number(),
  afterHours: z.number(),
  avoided_W: z.number(),
  avoidedU_W: z.number(),
  avoidedCost_per_month: Num,
  avoidedCostU_per_month: Num,
});

const text = z.string().nullable();
const instant = Instant.nullable();

/** A notice with its first figures and its current ones (recomputed at every drift check; docs/notices.md). */
export const NoticeItem = z.object({
  id: Id,
  siteId: Id,
  siteName: z.string(),
  timeZone: z.string(),
  unitId: Id,
  unitName: z.string(),
  unitKind: z.string(),
  baselineId: Id.nullable(),
  baselineLabel: text,
  direction: z.enum(['up', 'down']),
  kind: z.enum(['drift', 'idle', 'limit']),
  kindWord: z.string(),
  ruleText: text,
  ruleHours: Num,
  ruleCrossed: z.array(z.string()).nullable(),
  meanEfficiency: Num,
  status: z.enum(['open', 'acknowledged', 'closed']),
  statusWord: z.string(),
  onsetHour: Instant,
  signalHour: Instant,
  lastSignalHour: Instant,
  hours: z.number(),
  extra_W: z.number(),
  expected_W: z.number(),
  shift_sigma: z.number(),
  extraCost_per_day: Num,
  currency: z.string(),
  costBasis: text,
  hourU_W: Num,
  shiftU_W: Num,
  exceedsUncertainty: z.boolean().nullable(),
  k: z.number(),
  h: z.number(),
  openedAt: Instant,
  acknowledgedBy: text,
  acknowledgedAt: instant,
  acknowledgeComment: text,
  closedBy: text,
  closedAt: instant,
  closeComment: text,
  url: z.string(),
  headline_W: z.number().describe('The current size (last 24 steady hours) when known, else the first figure [W].'),
  headlineU_W: Num,
  headlineCost_per_day: Num,
  headlineCostU_per_day: Num,
  headlineExceeds: z.boolean().nullable(),
  current_W: Num,
  currentU_W: Num,
  currentMeasU_W: Num,
  currentHours: Num,
  sinceOnset_W: Num,
  sinceOnsetU_W: Num,
  sinceOnsetHours: Num,
  trend: z.enum(['growing', 'steady', 'receding']).nullable(),
  figuresHour: instant,
  life: z.enum(['live', 'faded', 'superseded', 'closed']),
  fadedSince: instant,
  supersededBy: Id.nullable(),
  priorNoticeId: Id.nullable(),
  priorReason: z.enum(['larger', 'after-fade', 'after-close', 'after-repair']).nullable(),
  closeOutcome: z.enum(['repaired', 'instrument-fault', 'new-normal', 'no-action']).nullable(),
  repairedAt: instant,
  newNormalFrom: instant,
  verdict: Verdict.nullable(),
  followUpNoticeId: Id.nullable(),
  escalationStep: z.number().int(),
});
export type NoticeItem = z.infer<typeof NoticeItem>;

export const NoticesPage = pageOf(NoticeItem);
export type NoticesPage = z.infer<typeof NoticesPage>;

/** Filters of the list: status (default all), one unit. */
export const NoticesFilter = z.object({
  status: z.enum(['open', 'acknowledged', 'closed', 'not-closed', 'all']).default('all'),
  unitId: z.uuid().optional(),
});
