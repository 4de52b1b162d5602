import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer } from '~/server/http';
import { siteFlow } from '~/server/services/views';
import { PeriodQuery, periodParams } from '~/lib/views/period';

/** The site's exergy flow over a period: sources into units, out as product, loss and destruction. */
export const GET: APIRoute = ({ params, url }) =>
  answer(async () => {
    const q = PeriodQuery.safeParse(periodParams(url));
    if (!q.success) return apiError('VALIDATION_FAILED', 'The period is not valid.', q.error.issues);
    return Response.json(await siteFlow(params.siteId!, q.data));
  });
