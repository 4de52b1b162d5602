/** Answers of the baselines under /api/v1 (GET /api/v1/sites/{siteId}/baselines): BaselineSummary of src/lib/baseline-view.ts. */
import { z } from 'zod';
import { QUADRATIC_TERMS, type BaselineTerm } from '../analytics/baseline';
import { pageOf } from './paging';
import { Id, Instant } from './common';

const Term = z.enum(QUADRATIC_TERMS as unknown as [BaselineTerm, ...BaselineTerm[]]);

const ModelSummary = z.object({
  coefficients: z.object({ intercept: z.number() }).catchall(z.number()).describe('In the raw variables: load in the unit of loadUnit, T_amb in K.'),
  stats: z.object({
    n: z.number().describe('hours fitted'),
    p: z.number().describe('parameters'),
    s: z.number().describe('residual standard deviation'),
    r2: z.number(),
    ybar: z.number(),
    cvRmse: z.number().describe('CV(RMSE) [-]'),
    nmbe: z.number().describe('NMBE [-]'),
  }),
  guideline14: z.object({ meets: z.boolean(), cvRmseOk: z.boolean(), nmbeOk: z.boolean(), cvRmseMax: z.number(), nmbeMax: z.number() }),
});

export const BaselineItem = z.object({
  id: Id,
  unitId: Id,
  unitName: z.string(),
  unitKind: z.string(),
  siteId: Id,
  siteName: z.string(),
  timeZone: z.string(),
  version: z.number().int(),
  status: z.enum(['draft', 'active', 'discarded', 'retired']),
  periodFrom: Instant,
  periodTo: Instant,
  terms: z.array(Term),
  hours: z.number().int(),
  loadUnit: z.string().nullable(),
  note: z.string().nullable(),
  efficiency: ModelSummary.nullable().describe('The fit of exergy efficiency [-]; null for units without one.'),
  destruction: ModelSummary.describe('The fit of exergy destruction [W].'),
  meetsGuideline14: z.boolean(),
  createdBy: z.string().nullable(),
  createdAt: Instant,
  decidedBy: z.string().nullable(),
  decidedAt: Instant.nullable(),
  retiredAt: Instant.nullable(),
  label: z.string(),
});
export type BaselineItem = z.infer<typeof BaselineItem>;

/** One unit of the site with its active baseline (null while none is accepted). */
export const UnitBaseline = z.object({
  unitId: Id,
  unitName: z.string(),
  unitKind: z.string(),
  active: BaselineItem.nullable(),
});
export type UnitBaseline = z.infer<typeof UnitBaseline>;

export const BaselinesPage = pageOf(UnitBaseline);
export type BaselinesPage = z.infer<typeof BaselinesPage>;
