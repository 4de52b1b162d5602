import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { UpdateUserInput, updateUser } from '~/server/services/users';

export const PATCH = endpoint({ params: z.object({ userId: z.string().min(1).max(200) }), body: UpdateUserInput }, async ({ locals, request }, { params, body }) => {
  await updateUser(params.userId, body, { userId: locals.user!.id, headers: request.headers });
  return Response.json({ ok: true });
});
