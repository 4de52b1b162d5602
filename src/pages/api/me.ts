import { endpoint } from '~/server/endpoint';

export const GET = endpoint({}, ({ locals }) => Response.json({ user: locals.user }));
