import type { APIRoute } from 'astro';
import { SiteInput, deleteSite, siteOverview, updateSite } from '~/server/services/plant';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

/** The site with its units, ports, current links and each unit's completeness. */
export const GET: APIRoute = async ({ params }) => {
  try {
    return Response.json(await siteOverview(params.siteId!));
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const PATCH: APIRoute = async ({ params, request }) => {
  const body = await parseBody(request, SiteInput);
  if (!body.ok) return body.response;
  try {
    return Response.json({ site: await updateSite(params.siteId!, body.data) });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const DELETE: APIRoute = async ({ params }) => {
  try {
    await deleteSite(params.siteId!);
    return Response.json({ ok: true });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
