import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { discardBaseline } from '~/server/services/baselines';

/** Discards a draft (kept for the record, never used). */
export const POST: APIRoute = async ({ params, locals }) =>
  answer(async () => Response.json({ baseline: await discardBaseline(params.baselineId!, locals.user!.id) }));
