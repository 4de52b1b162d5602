import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { acceptBaseline } from '~/server/services/baselines';

/** Accepts a draft: it becomes the unit's active baseline; the previous active one is retired. */
export const POST: APIRoute = async ({ params, locals }) =>
  answer(async () => Response.json({ baseline: await acceptBaseline(params.baselineId!, locals.user!.id) }));
