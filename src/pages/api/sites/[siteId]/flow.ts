import { endpoint } from '~/server/endpoint';
import { siteFlow } from '~/server/services/views';
import { PeriodQuery } from '~/lib/views/period';

/** The site's exergy flow over a period: sources into units, out as product, loss and destruction. */
export const GET = endpoint({ query: PeriodQuery }, async (_ctx, { params, query }) => Response.json(await siteFlow(params.siteId!, query)));
