import { endpoint } from '~/server/endpoint';
import { oneWithDisplay } from '~/server/services/notice-display';
import { AcknowledgeInput, acknowledgeNotice } from '~/server/services/notices';

/** Marks an open notice as seen (with an optional comment). */
export const POST = endpoint({ body: AcknowledgeInput }, async ({ locals }, { params, body }) =>
  Response.json({ notice: await oneWithDisplay(await acknowledgeNotice(params.noticeId!, locals.user!.id, body.comment)) }),
);
