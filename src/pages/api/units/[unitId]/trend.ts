import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer } from '~/server/http';
import { unitTrend } from '~/server/services/views';
import { PeriodQuery, periodParams } from '~/lib/views/period';

/** A unit's hours over a period of the site's clock, with the expected band, context and notices. */
export const GET: APIRoute = ({ params, url }) =>
  answer(async () => {
    const q = PeriodQuery.safeParse(periodParams(url));
    if (!q.success) return apiError('VALIDATION_FAILED', 'The period is not valid.', q.error.issues);
    return Response.json(await unitTrend(params.unitId!, q.data));
  });
