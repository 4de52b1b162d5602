import { endpoint } from '~/server/endpoint';
import { completeBrowserUpload } from '~/server/services/uploads';

export const POST = endpoint({}, async (_ctx, { params }) => Response.json(await completeBrowserUpload(params.uploadId!), { status: 202 }));
