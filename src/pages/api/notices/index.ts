import { z } from 'zod';
import { visibleToCaller } from '~/server/access';
import { endpoint } from '~/server/endpoint';
import { listNotices } from '~/server/services/notices';

const Query = z.object({
  status: z.enum(['open', 'acknowledged', 'closed', 'not-closed', 'all']).optional(),
  unitId: z.uuid().optional(),
  siteId: z.uuid().optional(),
  sort: z.enum(['cost', 'newest']).optional(),
});

/** Drift notices, those not closed first; by current cost per day (default) or newest first (sort=newest). */
export const GET = endpoint({ query: Query }, async ({ locals }, { query }) => {
  const { status, ...rest } = query;
  return Response.json({ notices: visibleToCaller(locals, await listNotices({ ...rest, status: status === 'all' ? undefined : status }), (n) => n.siteId) });
});
