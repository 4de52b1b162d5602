import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { CloseInput, closeNotice } from '~/server/services/notices';
import { parseBody } from '~/server/services/plant-http';

/**
 * Closes an open or seen notice; the comment (what was found or done) is required. Optional: outcome
 * (repaired, instrument-fault, new-normal, no-action), repairedAt (with repaired), newNormalFrom
 * (with new-normal), as YYYY-MM-DD in the site's time zone or an ISO date and time.
 */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, CloseInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ notice: await closeNotice(params.noticeId!, locals.user!.id, body.data.comment, { outcome: body.data.outcome, repairedAt: body.data.repairedAt, newNormalFrom: body.data.newNormalFrom }) }));
};
