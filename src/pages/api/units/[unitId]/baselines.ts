import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { FitInput, fitDraft, unitBaselines, unitHourSpan } from '~/server/services/baselines';
import { parseBody } from '~/server/services/plant-http';

/** A unit's baseline versions (newest first) and the span of its hours, for the builder. */
export const GET: APIRoute = async ({ params }) =>
  answer(async () => {
    const versions = await unitBaselines(params.unitId!);
    return Response.json({ versions, span: await unitHourSpan(params.unitId!) });
  });

/** Fits a new draft version on the unit's steady hours of a reference period. */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, FitInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ baseline: await fitDraft(params.unitId!, body.data, locals.user!.id) }, { status: 201 }));
};
