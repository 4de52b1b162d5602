import { Readable } from 'node:stream';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import { z } from 'zod';
import { FileAccepted } from '~/lib/api/uploads';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { AppError } from '~/server/errors';
import { receiveApiUpload } from '~/server/services/uploads';

/** The file's name (the service checks its characters and length). */
const Query = z.object({ name: z.string().max(1000).optional() });

/**
 * A scheduled export posts its file as the request body (Authorization: Bearer <site token>).
 * The name comes from ?name= or the X-File-Name header. Answers 202 { uploadId, duplicateOf }; the
 * upload may already be read by then (read while uploading, services/ingest-early.ts).
 */
export const POST = endpoint(
  {
    query: Query,
    answers: { 202: FileAccepted },
    doc: {
      summary: 'Send a historian file',
      description:
        'The request body is the CSV file itself; name it with ?name= or X-File-Name. A file with a Content-Length in a layout the site already reads may be read while it arrives, and is then already read (done) when the answer comes; any other file is read in the background. Either way, follow it at /api/v1/uploads/{uploadId}, and the site’s figures at /api/v1/sites/{siteId}/state.',
      group: 'Files',
      upload: ['text/csv', 'application/octet-stream'],
    },
  },
  async ({ request, locals }, { params, query }) => {
    const siteId = params.siteId!;
    requireSite(locals, siteId);
    if (!request.body) throw new AppError('VALIDATION_FAILED', 'Send the file as the request body.');
    const name = query.name ?? request.headers.get('x-file-name') ?? `export-${new Date().toISOString().slice(0, 19).replace(/:/g, '')}.csv`;
    const body = Readable.fromWeb(request.body as unknown as WebReadableStream<Uint8Array>);
    // A declared length lets the body stream into the store as one PUT (services/uploads.ts).
    const length = request.headers.get('content-length');
    const sizeBytes = length !== null && /^\d{1,12}$/.test(length) ? Number(length) : undefined;
    const out = await receiveApiUpload(siteId, name, body, locals.apiToken ? { apiTokenId: locals.apiToken.id } : { userId: locals.user!.id }, sizeBytes);
    return answer(FileAccepted, { uploadId: out.uploadId, duplicateOf: out.duplicateOf }, { status: 202 });
  },
);
