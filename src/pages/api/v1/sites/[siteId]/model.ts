import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { exportModel, importModel } from '~/server/services/plant-model';
import { plantErrorResponse, tokenSiteMismatch } from '~/server/services/plant-http';

/** The site's plant model file (docs/plant-model.md). */
export const GET: APIRoute = async ({ params, locals }) => {
  const wrong = tokenSiteMismatch(locals, params.siteId);
  if (wrong) return wrong;
  try {
    const model = await exportModel(params.siteId!);
    const file = `${model.site.name.replace(/[^\w.-]+/g, '-').toLowerCase()}.plant-model.json`;
    return new Response(JSON.stringify(model, null, 2) + '\n', {
      headers: { 'content-type': 'application/json; charset=utf-8', 'content-disposition': `inline; filename="${file}"` },
    });
  } catch (err) {
    return plantErrorResponse(err);
  }
};

/** Replaces the site's model with the file's: all or nothing, every problem with its JSON path. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const wrong = tokenSiteMismatch(locals, params.siteId);
  if (wrong) return wrong;
  const body = await request.json().catch(() => undefined);
  if (body === undefined) return apiError('VALIDATION_FAILED', 'The request body is not JSON.', [{ path: '$', message: 'Send the model file as JSON.' }]);
  try {
    return Response.json(await importModel(params.siteId!, body));
  } catch (err) {
    return plantErrorResponse(err);
  }
};
