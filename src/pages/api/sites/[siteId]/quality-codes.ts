import { endpoint } from '~/server/endpoint';
import { QualityCodesInput, getQualityCodes, setQualityCodes } from '~/server/services/quality-codes';

/** The site's good quality codes for wide files with quality columns (docs/api.md). */
export const GET = endpoint({}, async (_ctx, { params }) => Response.json(await getQualityCodes(params.siteId!)));

export const PUT = endpoint({ body: QualityCodesInput }, async ({ locals }, { params, body }) =>
  Response.json(await setQualityCodes(params.siteId!, body, locals.user!.id)),
);
