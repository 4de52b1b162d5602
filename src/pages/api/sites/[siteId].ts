import { endpoint } from '~/server/endpoint';
import { SiteInput, deleteSite, siteOverview, updateSite } from '~/server/services/plant';

/** The site with its units, ports, current links and each unit's completeness. */
export const GET = endpoint({}, async (_ctx, { params }) => Response.json(await siteOverview(params.siteId!)));

export const PATCH = endpoint({ body: SiteInput }, async (_ctx, { params, body }) => Response.json({ site: await updateSite(params.siteId!, body) }));

export const DELETE = endpoint({}, async (_ctx, { params }) => {
  await deleteSite(params.siteId!);
  return Response.json({ ok: true });
});
