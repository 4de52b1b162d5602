import { Readable } from 'node:stream';
import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { reportData, reportFileName } from '~/server/services/report';
import { reportPdf } from '~/server/services/report-pdf';

/** The month as yyyy-MM; the service checks it is one. */
const MonthParams = z.object({ month: z.string().max(20) });

/** The monthly site report as PDF, streamed as pdfkit writes it. */
export const GET = endpoint({ params: MonthParams }, async (_ctx, { params }) => {
  const data = await reportData(params.siteId!, params.month);
  const doc = reportPdf(data);
  return new Response(Readable.toWeb(doc) as unknown as ReadableStream<Uint8Array>, {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="${reportFileName(data.site.name, data.month, 'pdf')}"`,
      'cache-control': 'no-store',
    },
  });
});
