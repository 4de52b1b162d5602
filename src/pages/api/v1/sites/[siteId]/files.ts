import { Readable } from 'node:stream';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import { z } from 'zod';
import { UploadAccepted } from '~/lib/api/uploads';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { AppError } from '~/server/errors';
import { receiveApiUpload } from '~/server/services/uploads';

/** The file's name (the service checks its characters and length). */
const Query = z.object({ name: z.string().max(1000).optional().meta({ description: "The file's name (or send it as X-File-Name); left out: export-<time>.csv." }) });

/**
 * A scheduled export posts its file as the request body (Authorization: Bearer <site token>).
 * The name comes from ?name= or the X-File-Name header. Answers 202 { uploadId }.
 */
export const POST = endpoint(
  {
    query: Query,
    answers: { 202: UploadAccepted },
    doc: {
      group: 'Uploads',
      summary: 'Send a historian file',
      upload: ['text/csv', 'application/octet-stream'],
      description:
        'The raw bytes of one historian export (CSV, any size up to the upload limit) as the request body. The file is kept as sent and read in the background: poll GET /api/v1/uploads/{uploadId}. The same bytes sent again answer duplicateOf and are not read again.',
    },
  },
  async ({ request, locals }, { params, query }) => {
  const siteId = params.siteId!;
  requireSite(locals, siteId);
  if (!request.body) throw new AppError('VALIDATION_FAILED', 'Send the file as the request body.');
  const name = query.name ?? request.headers.get('x-file-name') ?? `export-${new Date().toISOString().slice(0, 19).replace(/:/g, '')}.csv`;
  const body = Readable.fromWeb(request.body as unknown as WebReadableStream<Uint8Array>);
  const out = await receiveApiUpload(siteId, name, body, locals.apiToken ? { apiTokenId: locals.apiToken.id } : { userId: locals.user!.id });
  return answer(UploadAccepted, out, { status: 202 });
  },
);
