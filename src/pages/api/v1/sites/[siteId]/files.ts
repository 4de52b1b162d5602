import { Readable } from 'node:stream';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer, siteAllowed, tokenForOtherSite } from '~/server/http';
import { receiveApiUpload } from '~/server/services/uploads';

/**
 * A scheduled export posts its file as the request body (Authorization: Bearer <site token>).
 * The name comes from ?name= or the X-File-Name header. Answers 202 { uploadId }.
 */
export const POST: APIRoute = ({ params, request, url, locals }) =>
  answer(async () => {
    const siteId = params.siteId!;
    if (!siteAllowed(locals, siteId)) return tokenForOtherSite();
    if (!request.body) return apiError('VALIDATION_FAILED', 'Send the file as the request body.');
    const name = url.searchParams.get('name') ?? request.headers.get('x-file-name') ?? `export-${new Date().toISOString().slice(0, 19).replace(/:/g, '')}.csv`;
    const body = Readable.fromWeb(request.body as unknown as WebReadableStream<Uint8Array>);
    const out = await receiveApiUpload(siteId, name, body, locals.apiToken ? { apiTokenId: locals.apiToken.id } : { userId: locals.user!.id });
    return Response.json(out, { status: 202 });
  });
