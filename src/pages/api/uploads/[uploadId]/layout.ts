import type { APIRoute } from 'astro';
import { z } from 'zod';
import { LayoutProfileSchema } from '~/lib/ingest/profile';
import { apiError } from '~/server/errors';
import { answer, jsonBody } from '~/server/http';
import { confirmLayout } from '~/server/services/uploads';

const Body = z.object({ name: z.string().trim().min(1).max(120), profile: LayoutProfileSchema });

export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    const parsed = Body.safeParse(await jsonBody(request));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'The layout is not complete.', parsed.error.issues);
    const out = await confirmLayout(params.uploadId!, parsed.data.profile, parsed.data.name, locals.user!.id);
    return Response.json(out, { status: 202 });
  });
