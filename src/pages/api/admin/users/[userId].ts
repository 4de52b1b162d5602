import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { UpdateUserInput, UserRuleError, updateUser } from '~/server/services/users';

export const PATCH: APIRoute = async ({ request, params, locals }) => {
  const parsed = UpdateUserInput.safeParse(await request.json().catch(() => null));
  if (!parsed.success) return apiError('VALIDATION_FAILED', 'Nothing to change, or a value is not allowed.', parsed.error.issues);
  try {
    await updateUser(params.userId!, parsed.data, { userId: locals.user!.id, headers: request.headers });
    return Response.json({ ok: true });
  } catch (err) {
    if (err instanceof UserRuleError) return apiError(err.code, err.message);
    throw err;
  }
};
