import { endpoint } from '~/server/endpoint';
import { discardBaseline } from '~/server/services/baselines';

/** Discards a draft (kept for the record, never used). */
export const POST = endpoint({}, async ({ locals }, { params }) => Response.json({ baseline: await discardBaseline(params.baselineId!, locals.user!.id) }));
