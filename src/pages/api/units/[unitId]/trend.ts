import { endpoint } from '~/server/endpoint';
import { unitTrend } from '~/server/services/views';
import { PeriodQuery } from '~/lib/views/period';

/** A unit's hours over a period of the site's clock, with the expected band, context and notices. */
export const GET = endpoint({ query: PeriodQuery }, async (_ctx, { params, query }) => Response.json(await unitTrend(params.unitId!, query)));
