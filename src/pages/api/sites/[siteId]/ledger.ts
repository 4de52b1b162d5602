import { endpoint } from '~/server/endpoint';
import { siteLedger } from '~/server/services/views';
import { PeriodQuery } from '~/lib/views/period';

/** The loss ledger: a site's units ranked by the cost of their destruction over a period. */
export const GET = endpoint({ query: PeriodQuery }, async (_ctx, { params, query }) => Response.json(await siteLedger(params.siteId!, query)));
