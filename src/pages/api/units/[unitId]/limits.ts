import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { parseBody } from '~/server/services/plant-http';
import { UnitLimitsInput, setUnitLimits, unitLimitsFor } from '~/server/services/unit-rules';

/** The unit's limits (cost of destruction per day, exergy efficiency) and the hours that open a limit notice. */
export const GET: APIRoute = async ({ params }) => answer(async () => Response.json({ limits: await unitLimitsFor(params.unitId!) }));

/** New limits: the unit's hours are checked against them (a job). */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, UnitLimitsInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ limits: await setUnitLimits(params.unitId!, body.data, locals.user!.id) }));
};
