import type { APIRoute } from 'astro';
import { siteTags, unlinkedTags } from '../../../../server/services/plant';

/** Tags of the site: ?unlinked=1 for those without a current link; ?q= searches name and description. */
export const GET: APIRoute = async ({ params, url }) => {
  const q = url.searchParams.get('q') ?? undefined;
  const tags = url.searchParams.get('unlinked') ? await unlinkedTags(params.siteId!, q) : await siteTags(params.siteId!, q);
  return Response.json({ tags });
};
