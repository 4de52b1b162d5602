import { Readable } from 'node:stream';
import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { reportData, reportFileName } from '~/server/services/report';
import { reportPdf } from '~/server/services/report-pdf';

/** The monthly site report as PDF, streamed as pdfkit writes it. */
export const GET: APIRoute = ({ params }) =>
  answer(async () => {
    const data = await reportData(params.siteId!, params.month!);
    const doc = reportPdf(data);
    return new Response(Readable.toWeb(doc) as unknown as ReadableStream<Uint8Array>, {
      headers: {
        'content-type': 'application/pdf',
        'content-disposition': `attachment; filename="${reportFileName(data.site.name, data.month, 'pdf')}"`,
        'cache-control': 'no-store',
      },
    });
  });
