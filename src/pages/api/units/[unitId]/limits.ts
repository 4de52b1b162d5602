import { endpoint } from '~/server/endpoint';
import { UnitLimitsInput, setUnitLimits, unitLimitsFor } from '~/server/services/unit-rules';

/** The unit's limits (cost of destruction per day, exergy efficiency) and the hours that open a limit notice. */
export const GET = endpoint({}, async (_ctx, { params }) => Response.json({ limits: await unitLimitsFor(params.unitId!) }));

/** New limits: the unit's hours are checked against them (a job). */
export const PUT = endpoint({ body: UnitLimitsInput }, async ({ locals }, { params, body }) =>
  Response.json({ limits: await setUnitLimits(params.unitId!, body, locals.user!.id) }),
);
