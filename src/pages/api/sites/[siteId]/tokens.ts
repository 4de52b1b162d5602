import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer, jsonBody } from '~/server/http';
import { NewTokenInput, listTokens } from '~/server/services/tokens';
import { issueApiToken } from '~/server/tokens';

export const GET: APIRoute = ({ params }) => answer(async () => Response.json({ tokens: await listTokens(params.siteId!) }));

/** Issues a token; its secret is in this answer only (stored hashed). */
export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    const parsed = NewTokenInput.safeParse(await jsonBody(request));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'The token needs a name.', parsed.error.issues);
    const out = await issueApiToken({ siteId: params.siteId!, name: parsed.data.name, role: parsed.data.role, createdBy: locals.user!.id });
    return Response.json({ id: out.id, token: out.secret, note: 'Copy it now: Lossline keeps only its hash and cannot show it again.' }, { status: 201 });
  });
