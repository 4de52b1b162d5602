import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { createSiteFromModel } from '~/server/services/plant-model';
import { plantErrorResponse } from '~/server/services/plant-http';

/** Creates a new site from a plant model file (docs/plant-model.md); all or nothing. */
export const POST: APIRoute = async ({ request }) => {
  const body = await request.json().catch(() => undefined);
  if (body === undefined) return apiError('VALIDATION_FAILED', 'The request body is not JSON.', [{ path: '$', message: 'Send the model file as JSON.' }]);
  try {
    return Response.json(await createSiteFromModel(body), { status: 201 });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
