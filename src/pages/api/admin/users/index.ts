import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { InviteInput, UserRuleError, inviteUser, listUsers } from '~/server/services/users';

export const GET: APIRoute = async () => Response.json({ users: await listUsers() });

export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = InviteInput.safeParse(await request.json().catch(() => null));
  if (!parsed.success) return apiError('VALIDATION_FAILED', 'The invitation is not complete.', parsed.error.issues);
  try {
    const out = await inviteUser(parsed.data, locals.user!.id);
    return Response.json(out, { status: 201 });
  } catch (err) {
    if (err instanceof UserRuleError) return apiError(err.code, err.message);
    throw err;
  }
};
