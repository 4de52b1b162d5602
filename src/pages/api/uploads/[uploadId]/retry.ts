import { endpoint } from '~/server/endpoint';
import { retryUpload } from '~/server/services/uploads';

export const POST = endpoint({}, async (_ctx, { params }) => {
  await retryUpload(params.uploadId!);
  return Response.json({ status: 'queued' }, { status: 202 });
});
