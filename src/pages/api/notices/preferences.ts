import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { PreferencesInput, noticePreferencesFor, setNoticePreferences } from '~/server/services/notices';
import { parseBody } from '~/server/services/plant-http';

/** The signed-in person's notice settings (the daily digest of notices not yet closed). */
export const GET: APIRoute = async ({ locals }) => answer(async () => Response.json({ preferences: await noticePreferencesFor(locals.user!.id) }));

export const PUT: APIRoute = async ({ request, locals }) => {
  const body = await parseBody(request, PreferencesInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ preferences: await setNoticePreferences(locals.user!.id, body.data) }));
};
