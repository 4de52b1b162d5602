import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer, jsonBody } from '~/server/http';
import { QualityCodesInput, getQualityCodes, setQualityCodes } from '~/server/services/quality-codes';

/** The site's good quality codes for wide files with quality columns (docs/api.md). */
export const GET: APIRoute = ({ params }) => answer(async () => Response.json(await getQualityCodes(params.siteId!)));

export const PUT: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    const parsed = QualityCodesInput.safeParse(await jsonBody(request));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'The good quality codes are a list of short texts (at most 100).', parsed.error.issues);
    return Response.json(await setQualityCodes(params.siteId!, parsed.data, locals.user!.id));
  });
