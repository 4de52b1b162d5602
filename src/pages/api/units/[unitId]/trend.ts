import { endpoint } from '~/server/endpoint';
import { unitTrendJson } from '~/server/services/views';
import { PeriodQuery } from '~/lib/views/period';

/** A unit's hours over a period of the site's clock, with the expected band, context and notices (a TrendAnswer). */
export const GET = endpoint({ query: PeriodQuery }, async (_ctx, { params, query }) =>
  new Response(await unitTrendJson(params.unitId!, query), { headers: { 'content-type': 'application/json' } }),
);
