import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { retryUpload } from '~/server/services/uploads';

export const POST: APIRoute = ({ params }) =>
  answer(async () => {
    await retryUpload(params.uploadId!);
    return Response.json({ status: 'queued' }, { status: 202 });
  });
