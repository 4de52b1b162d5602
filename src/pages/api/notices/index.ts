import { visibleToCaller } from '~/server/access';
import type { APIRoute } from 'astro';
import { z } from 'zod';
import { apiError } from '~/server/errors';
import { answer } from '~/server/http';
import { listNotices } from '~/server/services/notices';

const Query = z.object({
  status: z.enum(['open', 'acknowledged', 'closed', 'not-closed', 'all']).optional(),
  unitId: z.string().uuid().optional(),
  siteId: z.string().uuid().optional(),
  sort: z.enum(['cost', 'newest']).optional(),
});

/** Drift notices, those not closed first; by current cost per day (default) or newest first (sort=newest). */
export const GET: APIRoute = async ({ url, locals }) => {
  const q = Query.safeParse(Object.fromEntries(url.searchParams));
  if (!q.success) return apiError('VALIDATION_FAILED', 'Unknown filter: status is open, acknowledged, closed, not-closed or all; unitId and siteId are ids; sort is cost or newest.', q.error.issues);
  const { status, ...rest } = q.data;
  return answer(async () => Response.json({ notices: visibleToCaller(locals, await listNotices({ ...rest, status: status === 'all' ? undefined : status }), (n) => n.siteId) }));
};
