import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer, jsonBody } from '~/server/http';
import { NewUploadInput, createBrowserUpload, listUploads } from '~/server/services/uploads';

export const GET: APIRoute = ({ params }) => answer(async () => Response.json({ uploads: await listUploads(params.siteId!) }));

export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    const parsed = NewUploadInput.safeParse(await jsonBody(request));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'The file description is not complete.', parsed.error.issues);
    return Response.json(await createBrowserUpload(params.siteId!, parsed.data, locals.user!.id), { status: 201 });
  });
