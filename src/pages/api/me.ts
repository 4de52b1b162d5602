import type { APIRoute } from 'astro';

export const GET: APIRoute = async ({ locals }) => Response.json({ user: locals.user });
