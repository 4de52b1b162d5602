import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { UpdateUserInput, updateUser } from '~/server/services/users';

export const PATCH = endpoint({ params: z.object({ userId: z.string().min(1).max(200) }), body: UpdateUserInput }, async ({ locals }, { params, body }) => {
  await updateUser(params.userId, body, locals.user!.id);
  return Response.json({ ok: true });
});
