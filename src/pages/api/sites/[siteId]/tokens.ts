import { endpoint } from '~/server/endpoint';
import { NewTokenInput, listTokens } from '~/server/services/tokens';
import { issueApiToken } from '~/server/tokens';

export const GET = endpoint({}, async (_ctx, { params }) => Response.json({ tokens: await listTokens(params.siteId!) }));

/** Issues a token; its secret is in this answer only (stored hashed). */
export const POST = endpoint({ body: NewTokenInput }, async ({ locals }, { params, body }) => {
  const out = await issueApiToken({ siteId: params.siteId!, name: body.name, role: body.role, createdBy: locals.user!.id });
  return Response.json({ id: out.id, token: out.secret, note: 'Copy it now: Lossline keeps only its hash and cannot show it again.' }, { status: 201 });
});
