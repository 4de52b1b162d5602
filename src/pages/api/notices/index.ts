import { z } from 'zod';
import { visibleToCaller } from '~/server/access';
import { endpoint } from '~/server/endpoint';
import { listNotices } from '~/server/services/notices';
import { withDisplay } from '~/server/services/notice-display';

const Query = z.object({
  status: z.enum(['open', 'acknowledged', 'closed', 'not-closed', 'all']).optional(),
  unitId: z.uuid().optional(),
  siteId: z.uuid().optional(),
  sort: z.enum(['cost', 'newest']).optional(),
});

/** Drift notices, those not closed first; by current cost per day (default) or newest first (sort=newest). */
export const GET = endpoint({ query: Query }, async ({ locals }, { query }) => {
  const { status, ...rest } = query;
  const seen = visibleToCaller(locals, await listNotices({ ...rest, status: status === 'all' ? undefined : status }), (n) => n.siteId);
  // Each with its site's display units, for the list's figures (the API under /api/v1 keeps SI).
  return Response.json({ notices: await withDisplay(seen) });
});
