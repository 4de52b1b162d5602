import type { APIRoute } from 'astro';
import { UnitCreateInput, createUnit, siteOverview } from '~/server/services/plant';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

export const GET: APIRoute = async ({ params }) => {
  try {
    return Response.json({ units: (await siteOverview(params.siteId!)).units });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const POST: APIRoute = async ({ params, request }) => {
  const body = await parseBody(request, UnitCreateInput);
  if (!body.ok) return body.response;
  try {
    return Response.json({ unit: await createUnit(params.siteId!, body.data) }, { status: 201 });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
