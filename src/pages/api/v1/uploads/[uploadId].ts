import { endpoint, requireSite } from '~/server/endpoint';
import { getUploadRow, uploadView } from '~/server/services/uploads';

export const GET = endpoint({}, async ({ locals }, { params }) => {
  const up = await getUploadRow(params.uploadId!);
  requireSite(locals, up.siteId);
  return Response.json(uploadView(up));
});
