import { UploadItem } from '~/lib/api/uploads';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { uploadItem } from '~/server/services/site-api';
import { getUploadRow } from '~/server/services/uploads';

export const GET = endpoint(
  {
    answers: { 200: UploadItem },
    doc: { summary: 'One upload with its state and report', group: 'Files' },
  },
  async ({ locals }, { params }) => {
    const up = await getUploadRow(params.uploadId!);
    requireSite(locals, up.siteId);
    return answer(UploadItem, uploadItem(up));
  },
);
