/** The answer of GET /api/v1/sites/{siteId}/ledger: LedgerAnswer of src/lib/views/ledger.ts. */
import { z } from 'zod';
import { RANGES } from '../views/period';
import { Currency, Id, Instant } from './common';

const Hours = z.object({ steady: z.number(), unsettled: z.number(), idle: z.number(), suspect: z.number() }).describe('Hours of each state in the period.');

const Sums = {
  hours: Hours,
  destruction_MWh: z.number(),
  destruction_U_MWh: z.number().describe('Expanded (k = 2) uncertainty, hours taken as fully correlated.'),
  fuel_MWh: z.number(),
  product_MWh: z.number(),
  loss_MWh: z.number(),
  cost: z.number().nullable().describe('Cost of the destruction over steady hours [site currency]; null when no steady hour has a cost.'),
  cost_U: z.number().nullable(),
};

export const LedgerRowSchema = z.object({
  rank: z.number().int(),
  unitId: Id,
  name: z.string(),
  kind: z.string(),
  kindLabel: z.string(),
  ...Sums,
  hoursWithoutCost: z.number(),
  share: z.number().nullable().describe('Share of the site total [-]: of cost when the site has costs, else of destruction.'),
  efficiencyMean: z.number().nullable(),
  efficiencyMean_U: z.number().nullable(),
});

export const PeriodSchema = z.object({
  range: z.enum(RANGES),
  timeZone: z.string(),
  fromMs: z.number(),
  toMs: z.number(),
  from: Instant,
  to: Instant,
  firstDay: z.string(),
  lastDay: z.string(),
  label: z.string(),
  prevAnchor: z.string(),
  nextAnchor: z.string(),
  hours: z.number(),
});

export const LedgerAnswerSchema = z.object({
  site: z.object({ id: Id, name: z.string(), timeZone: z.string(), currency: Currency }),
  period: PeriodSchema,
  opened: z
    .enum(['asked', 'latest-full', 'latest-partial', 'now'])
    .describe('Why this period: the one asked for, the latest full period with data (the default), the partial one holding the latest hour when no full one has data, or the present one when the site has none.'),
  freshness: z
    .object({
      lastHourStart: Instant.nullable().describe('Start of the latest computed hour; null when the site has none.'),
      lastHourText: z.string().nullable().describe("That hour in the site's clock with its zone."),
      ago: z.string().nullable().describe('How long ago that hour ended, in words.'),
      stale: z.boolean().describe('True when that hour ended more than a day ago.'),
      text: z.string().describe('The sentence the pages show.'),
    })
    .describe("How fresh the site's figures are."),
  rows: z.array(LedgerRowSchema).describe('The units ranked by the cost of their destruction (or by destruction when the site has no costs).'),
  shareBasis: z.enum(['cost', 'destruction']),
  totals: z.object(Sums),
});
export type LedgerAnswerSchema = z.infer<typeof LedgerAnswerSchema>;
