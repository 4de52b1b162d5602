import { visibleToCaller } from '~/server/access';
import { endpoint } from '~/server/endpoint';
import { SiteInput, createSite, listSites } from '~/server/services/plant';

export const GET = endpoint({}, async ({ locals }) => Response.json({ sites: visibleToCaller(locals, await listSites()) }));

export const POST = endpoint({ body: SiteInput }, async (_ctx, { body }) => Response.json({ site: await createSite(body) }, { status: 201 }));
