import { endpoint } from '~/server/endpoint';
import { PreferencesInput, noticePreferencesFor, setNoticePreferences } from '~/server/services/notices';

/** The signed-in person's notice settings (the daily digest of notices not yet closed). */
export const GET = endpoint({}, async ({ locals }) => Response.json({ preferences: await noticePreferencesFor(locals.user!.id) }));

export const PUT = endpoint({ body: PreferencesInput }, async ({ locals }, { body }) => Response.json({ preferences: await setNoticePreferences(locals.user!.id, body) }));
