import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { endLink } from '~/server/services/plant-links';
import { plantErrorResponse } from '~/server/services/plant-http';

/** Ends a link at ?at= (default now): the tag no longer measures this quantity from then on. */
export const DELETE: APIRoute = async ({ params, url }) => {
  const raw = url.searchParams.get('at');
  const at = raw === null ? new Date() : new Date(/^\d+$/.test(raw) ? Number(raw) : raw);
  if (Number.isNaN(at.getTime())) return apiError('VALIDATION_FAILED', 'at is an ISO 8601 instant or epoch milliseconds.');
  try {
    return Response.json(await endLink(params.siteId!, params.linkId!, at));
  } catch (err) {
    return plantErrorResponse(err);
  }
};
