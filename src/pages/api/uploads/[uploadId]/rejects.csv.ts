import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { getUploadRow, rejectsCsv } from '~/server/services/uploads';

export const GET: APIRoute = ({ params }) =>
  answer(async () => {
    const up = await getUploadRow(params.uploadId!);
    return new Response(await rejectsCsv(up.id), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="rejected-cells-${up.fileName.replace(/[^\w.-]+/g, '_')}.csv"`,
      },
    });
  });
