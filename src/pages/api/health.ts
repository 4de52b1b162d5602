import { endpoint } from '~/server/endpoint';
import { health } from '~/server/health';

export const GET = endpoint({}, async () => {
  const out = await health();
  return Response.json(out, { status: out.ok ? 200 : 503 });
});
