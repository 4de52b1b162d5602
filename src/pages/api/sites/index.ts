import { visibleToCaller } from '~/server/access';
import type { APIRoute } from 'astro';
import { SiteInput, createSite, listSites } from '~/server/services/plant';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

export const GET: APIRoute = async ({ locals }) => Response.json({ sites: visibleToCaller(locals, await listSites()) });

export const POST: APIRoute = async ({ request }) => {
  const body = await parseBody(request, SiteInput);
  if (!body.ok) return body.response;
  try {
    return Response.json({ site: await createSite(body.data) }, { status: 201 });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
