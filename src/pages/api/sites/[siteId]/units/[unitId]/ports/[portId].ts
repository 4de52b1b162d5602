import type { APIRoute } from 'astro';
import { PortUpdateInput, deletePort, updatePort } from '~/server/services/plant';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

export const PATCH: APIRoute = async ({ params, request }) => {
  const body = await parseBody(request, PortUpdateInput);
  if (!body.ok) return body.response;
  try {
    await updatePort(params.siteId!, params.unitId!, params.portId!, body.data);
    return Response.json({ ok: true });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const DELETE: APIRoute = async ({ params }) => {
  try {
    await deletePort(params.siteId!, params.unitId!, params.portId!);
    return Response.json({ ok: true });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
