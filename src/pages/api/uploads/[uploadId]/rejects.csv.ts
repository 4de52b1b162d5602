import { endpoint } from '~/server/endpoint';
import { getUploadRow, rejectsCsv } from '~/server/services/uploads';

export const GET = endpoint({}, async (_ctx, { params }) => {
  const up = await getUploadRow(params.uploadId!);
  return new Response(await rejectsCsv(up.id), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="rejected-cells-${up.fileName.replace(/[^\w.-]+/g, '_')}.csv"`,
    },
  });
});
