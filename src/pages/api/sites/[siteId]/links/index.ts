import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { LinkInput, linksForRange, linksValidAt, setLink } from '~/server/services/plant-links';
import { parseBody, plantErrorResponse } from '~/server/services/plant-http';
import { isId } from '~/server/services/plant';

/** Links holding at ?at= (default now), or every version overlapping ?from=&to=. */
export const GET: APIRoute = async ({ params, url }) => {
  if (!isId(params.siteId)) return apiError('NOT_FOUND', 'No such site.');
  const q = url.searchParams;
  const date = (v: string | null) => (v === null ? null : new Date(/^\d+$/.test(v) ? Number(v) : v));
  const from = date(q.get('from'));
  const to = date(q.get('to'));
  const at = date(q.get('at')) ?? new Date();
  for (const d of [from, to, at]) if (d && Number.isNaN(d.getTime())) return apiError('VALIDATION_FAILED', 'at, from and to are ISO 8601 instants or epoch milliseconds.');
  if (from && to) return Response.json({ links: await linksForRange(params.siteId!, from, to) });
  return Response.json({ links: await linksValidAt(params.siteId!, at) });
};

/** Links a tag or changes a link: a new version from validFrom (the holding one is closed there). */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, LinkInput);
  if (!body.ok) return body.response;
  try {
    return Response.json(await setLink(params.siteId!, body.data, locals.user?.id ?? null), { status: 201 });
  } catch (err) {
    return plantErrorResponse(err);
  }
};
