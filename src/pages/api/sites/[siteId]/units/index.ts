import { endpoint } from '~/server/endpoint';
import { UnitCreateInput, createUnit, siteOverview } from '~/server/services/plant';

export const GET = endpoint({}, async (_ctx, { params }) => Response.json({ units: (await siteOverview(params.siteId!)).units }));

export const POST = endpoint({ body: UnitCreateInput }, async (_ctx, { params, body }) => Response.json({ unit: await createUnit(params.siteId!, body) }, { status: 201 }));
