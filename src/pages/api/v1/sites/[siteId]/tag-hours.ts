import type { APIRoute } from 'astro';
import { z } from 'zod';
import { apiError } from '~/server/errors';
import { answer, siteAllowed, tokenForOtherSite } from '~/server/http';
import { tagHoursOf } from '~/server/services/tag-hours';

const Query = z.object({
  tag: z.string().min(1, 'Name the tag: ?tag=NAME'),
  from: z.iso.datetime({ offset: true }),
  to: z.iso.datetime({ offset: true }),
});

export const GET: APIRoute = ({ params, url, locals }) =>
  answer(async () => {
    if (!siteAllowed(locals, params.siteId!)) return tokenForOtherSite();
    const parsed = Query.safeParse(Object.fromEntries(url.searchParams));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'Give tag, from and to (ISO 8601 with offset or Z).', parsed.error.issues);
    const q = parsed.data;
    return Response.json(await tagHoursOf(params.siteId!, q.tag, new Date(q.from), new Date(q.to)));
  });
