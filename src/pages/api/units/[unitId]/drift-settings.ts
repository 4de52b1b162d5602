import { endpoint } from '~/server/endpoint';
import { DriftSettingsInput, driftSettingsFor, setDriftSettings } from '~/server/services/drift';

/** The unit's CUSUM k and h (in spreads of the CUSUM input, the standardised innovations of the residuals). */
export const GET = endpoint({}, async (_ctx, { params }) => Response.json({ settings: await driftSettingsFor(params.unitId!) }));

/** New k and h: the unit's drift state is recomputed from its first hour after the baseline. */
export const PUT = endpoint({ body: DriftSettingsInput }, async ({ locals }, { params, body }) =>
  Response.json({ settings: await setDriftSettings(params.unitId!, body, locals.user!.id) }),
);
