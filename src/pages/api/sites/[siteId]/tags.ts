import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { isId, siteTags, unlinkedTags } from '~/server/services/plant';

/** Tags of the site: ?unlinked=1 for those without a current link; ?q= searches name and description. */
export const GET: APIRoute = async ({ params, url }) => {
  if (!isId(params.siteId)) return apiError('NOT_FOUND', 'No such site.');
  const q = url.searchParams.get('q') ?? undefined;
  const tags = url.searchParams.get('unlinked') ? await unlinkedTags(params.siteId!, q) : await siteTags(params.siteId!, q);
  return Response.json({ tags });
};
