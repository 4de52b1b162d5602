import { endpoint } from '~/server/endpoint';
import { FitInput, fitDraft, unitBaselines, unitHourSpan } from '~/server/services/baselines';

/** A unit's baseline versions (newest first) and the span of its hours, for the builder. */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const versions = await unitBaselines(params.unitId!);
  return Response.json({ versions, span: await unitHourSpan(params.unitId!) });
});

/** Fits a new draft version on the unit's steady hours of a reference period. */
export const POST = endpoint({ body: FitInput }, async ({ locals }, { params, body }) =>
  Response.json({ baseline: await fitDraft(params.unitId!, body, locals.user!.id) }, { status: 201 }),
);
