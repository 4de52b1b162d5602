import type { APIRoute } from 'astro';
import { answer } from '../../../../server/http';
import { CloseInput, closeNotice } from '../../../../server/services/notices';
import { parseBody } from '../../../../server/services/plant-http';

/** Closes an open or seen notice; the comment (what was found or done) is required. */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, CloseInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ notice: await closeNotice(params.noticeId!, locals.user!.id, body.data.comment) }));
};
