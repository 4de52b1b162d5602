import { endpoint } from '~/server/endpoint';
import { InviteInput, inviteUser, listUsers } from '~/server/services/users';

export const GET = endpoint({}, async () => Response.json({ users: await listUsers() }));

export const POST = endpoint({ body: InviteInput }, async ({ locals }, { body }) => Response.json(await inviteUser(body, locals.user!.id), { status: 201 }));
