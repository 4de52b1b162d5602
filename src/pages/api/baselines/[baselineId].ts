import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { baselineFitView, getBaseline } from '~/server/services/baselines';

/** One version with its reference hours, fitted values and curve (for the builder's scatter). */
export const GET: APIRoute = async ({ params }) =>
  answer(async () => {
    const baseline = await getBaseline(params.baselineId!);
    return Response.json({ baseline, fit: await baselineFitView(baseline.id) });
  });
