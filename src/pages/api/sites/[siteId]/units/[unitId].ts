import type { APIRoute } from 'astro';
import { UnitUpdateInput, deleteUnit, unitDetail, updateUnit } from '~/server/services/plant';
import { linkHistory } from '~/server/services/plant-links';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';

/** The unit with ports, current links, status and the history of its link versions. */
export const GET: APIRoute = async ({ params }) => {
  try {
    const detail = await unitDetail(params.siteId!, params.unitId!);
    return Response.json({ unit: detail.unit, history: await linkHistory(params.siteId!, params.unitId!) });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const PATCH: APIRoute = async ({ params, request }) => {
  const body = await parseBody(request, UnitUpdateInput);
  if (!body.ok) return body.response;
  try {
    return Response.json({ unit: await updateUnit(params.siteId!, params.unitId!, body.data) });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

export const DELETE: APIRoute = async ({ params }) => {
  try {
    await deleteUnit(params.siteId!, params.unitId!);
    return Response.json({ ok: true });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
