import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer } from '~/server/http';
import { siteLedger } from '~/server/services/views';
import { PeriodQuery, periodParams } from '~/lib/views/period';

/** The loss ledger: a site's units ranked by the cost of their destruction over a period. */
export const GET: APIRoute = ({ params, url }) =>
  answer(async () => {
    const q = PeriodQuery.safeParse(periodParams(url));
    if (!q.success) return apiError('VALIDATION_FAILED', 'The period is not valid.', q.error.issues);
    return Response.json(await siteLedger(params.siteId!, q.data));
  });
