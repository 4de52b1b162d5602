import { endpoint } from '~/server/endpoint';
import { oneWithDisplay } from '~/server/services/notice-display';
import { CloseInput, closeNotice } from '~/server/services/notices';

/**
 * Closes an open or seen notice; the comment (what was found or done) is required. Optional: outcome
 * (repaired, instrument-fault, new-normal, no-action), repairedAt (with repaired), newNormalFrom
 * (with new-normal), as YYYY-MM-DD in the site's time zone or an ISO date and time.
 */
export const POST = endpoint({ body: CloseInput }, async ({ locals }, { params, body }) =>
  Response.json({ notice: await oneWithDisplay(await closeNotice(params.noticeId!, locals.user!.id, body.comment, { outcome: body.outcome, repairedAt: body.repairedAt, newNormalFrom: body.newNormalFrom })) }),
);
