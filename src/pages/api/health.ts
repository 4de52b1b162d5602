import type { APIRoute } from 'astro';
import { health } from '~/server/health';

export const GET: APIRoute = async () => {
  const out = await health();
  return Response.json(out, { status: out.ok ? 200 : 503 });
};
