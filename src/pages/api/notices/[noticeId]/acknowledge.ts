import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { AcknowledgeInput, acknowledgeNotice } from '~/server/services/notices';
import { parseBody } from '~/server/services/plant-http';

/** Marks an open notice as seen (with an optional comment). */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const body = await parseBody(request, AcknowledgeInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ notice: await acknowledgeNotice(params.noticeId!, locals.user!.id, body.data.comment) }));
};
