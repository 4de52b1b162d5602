import { visibleToCaller } from '../../../server/access';
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { apiError } from '../../../server/errors';
import { answer } from '../../../server/http';
import { listNotices } from '../../../server/services/notices';

const Query = z.object({
  status: z.enum(['open', 'acknowledged', 'closed', 'not-closed']).optional(),
  unitId: z.string().uuid().optional(),
  siteId: z.string().uuid().optional(),
});

/** Drift notices, open first, then seen, then closed; newest first within each. */
export const GET: APIRoute = async ({ url, locals }) => {
  const q = Query.safeParse(Object.fromEntries(url.searchParams));
  if (!q.success) return apiError('VALIDATION_FAILED', 'Unknown filter: status is open, acknowledged, closed or not-closed; unitId and siteId are ids.', q.error.issues);
  return answer(async () => Response.json({ notices: visibleToCaller(locals, await listNotices(q.data), (n) => n.siteId) }));
};
