import { z } from 'zod';
import { endpoint, requireSite } from '~/server/endpoint';
import { tagHoursOf } from '~/server/services/tag-hours';

const Query = z.object({
  tag: z.string('Name the tag: ?tag=NAME').min(1, 'Name the tag: ?tag=NAME').max(200),
  from: z.iso.datetime({ offset: true }),
  to: z.iso.datetime({ offset: true }),
});

export const GET = endpoint({ query: Query }, async ({ locals }, { params, query }) => {
  requireSite(locals, params.siteId!);
  return Response.json(await tagHoursOf(params.siteId!, query.tag, new Date(query.from), new Date(query.to)));
});
