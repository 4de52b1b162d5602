import { endpoint } from '~/server/endpoint';
import { acceptBaseline } from '~/server/services/baselines';

/** Accepts a draft: it becomes the unit's active baseline; the previous active one is retired. */
export const POST = endpoint({}, async ({ locals }, { params }) => Response.json({ baseline: await acceptBaseline(params.baselineId!, locals.user!.id) }));
