import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { DriftSettingsInput, driftSettingsFor, setDriftSettings } from '~/server/services/drift';
import { parseBody } from '~/server/services/plant-http';

/** The unit's CUSUM k and h (in spreads of the CUSUM input, the standardised innovations of the residuals). */
export const GET: APIRoute = async ({ params }) => answer(async () => Response.json({ settings: await driftSettingsFor(params.unitId!) }));

/** New k and h: the unit's drift state is recomputed from its first hour after the baseline. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, DriftSettingsInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ settings: await setDriftSettings(params.unitId!, body.data, locals.user!.id) }));
};
