import { endpoint } from '~/server/endpoint';
import { NewUploadInput, createBrowserUpload } from '~/server/services/uploads';
import { UploadListQuery, listUploadPage } from '~/server/services/upload-list';

/** A page of the site's uploads, newest first; `next` is the cursor of the older page (`?before=`). */
export const GET = endpoint({ query: UploadListQuery }, async (_ctx, { params, query }) => Response.json(await listUploadPage(params.siteId!, query)));

export const POST = endpoint({ body: NewUploadInput }, async ({ locals }, { params, body }) =>
  Response.json(await createBrowserUpload(params.siteId!, body, locals.user!.id), { status: 201 }),
);
