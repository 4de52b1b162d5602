import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { siteTags, unlinkedTags } from '~/server/services/plant';

const Query = z.object({ q: z.string().max(200).optional(), unlinked: z.string().max(10).optional() });

/** Tags of the site: ?unlinked=1 for those without a current link; ?q= searches name and description. */
export const GET = endpoint({ query: Query }, async (_ctx, { params, query }) =>
  Response.json({ tags: query.unlinked ? await unlinkedTags(params.siteId!, query.q) : await siteTags(params.siteId!, query.q) }),
);
