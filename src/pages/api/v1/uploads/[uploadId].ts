import { UploadAnswer } from '~/lib/api/uploads';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { getUploadRow, uploadView } from '~/server/services/uploads';

export const GET = endpoint(
  {
    answers: { 200: UploadAnswer },
    doc: {
      group: 'Uploads',
      summary: 'An upload and its report',
      description:
        "Where a file is: queued, processing, then done or read-with-problems (hours stored) or failed (nothing stored; reason says why). Poll until it is in one of these last states; summary holds the reader's counts.",
    },
  },
  async ({ locals }, { params }) => {
    const up = await getUploadRow(params.uploadId!);
    requireSite(locals, up.siteId);
    const view = uploadView(up);
    return answer(UploadAnswer, { ...view, createdAt: view.createdAt.toISOString(), finishedAt: view.finishedAt?.toISOString() ?? null });
  },
);
