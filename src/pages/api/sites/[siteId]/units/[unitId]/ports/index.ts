import type { APIRoute } from 'astro';
import { PortInput, createPort } from '~/server/services/plant';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

export const POST: APIRoute = async ({ params, request }) => {
  const body = await parseBody(request, PortInput);
  if (!body.ok) return body.response;
  try {
    return Response.json({ port: await createPort(params.siteId!, params.unitId!, body.data) }, { status: 201 });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
