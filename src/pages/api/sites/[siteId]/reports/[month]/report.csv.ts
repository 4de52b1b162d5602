import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { reportData, reportFileName } from '~/server/services/report';
import { reportCsvLines } from '~/server/services/report-csv';

/** The month as yyyy-MM; the service checks it is one. */
const MonthParams = z.object({ month: z.string().max(20) });

/** The monthly site report as CSV (UTF-8 with a byte-order mark, CRLF), streamed line by line. */
export const GET = endpoint({ params: MonthParams }, async (_ctx, { params }) => {
  const data = await reportData(params.siteId!, params.month);
  const lines = reportCsvLines(data);
  const enc = new TextEncoder();
  let i = 0;
  const body = new ReadableStream<Uint8Array>({
    start(c) {
      c.enqueue(enc.encode('\ufeff'));
    },
    pull(c) {
      if (i >= lines.length) return c.close();
      const chunk = lines.slice(i, i + 200).join('\r\n') + '\r\n';
      i += 200;
      c.enqueue(enc.encode(chunk));
    },
  });
  return new Response(body, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${reportFileName(data.site.name, data.month, 'csv')}"`,
      'cache-control': 'no-store',
    },
  });
});
