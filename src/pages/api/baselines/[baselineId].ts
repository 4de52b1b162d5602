import { endpoint } from '~/server/endpoint';
import { baselineFitView, getBaseline } from '~/server/services/baselines';

/** One version with its reference hours, fitted values and curve (for the builder's scatter). */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const baseline = await getBaseline(params.baselineId!);
  return Response.json({ baseline, fit: await baselineFitView(baseline.id) });
});
