import { endpoint } from '~/server/endpoint';
import { NewUploadInput, createBrowserUpload, listUploads } from '~/server/services/uploads';

export const GET = endpoint({}, async (_ctx, { params }) => Response.json({ uploads: await listUploads(params.siteId!) }));

export const POST = endpoint({ body: NewUploadInput }, async ({ locals }, { params, body }) =>
  Response.json(await createBrowserUpload(params.siteId!, body, locals.user!.id), { status: 201 }),
);
