import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { answer } from '~/server/http';
import { NoticeSettingsInput, noticeSettingsFor, setNoticeSettings } from '~/server/services/notices';
import { parseBody } from '~/server/services/plant-http';

/** A site's notice settings (?siteId=): the multiple of cost per day that sends an escalation mail. */
export const GET: APIRoute = async ({ url }) => {
  const siteId = url.searchParams.get('siteId');
  if (!siteId) return apiError('VALIDATION_FAILED', 'Say which site: ?siteId=...');
  return answer(async () => Response.json({ settings: await noticeSettingsFor(siteId) }));
};

/** Energy leads (and admins) change it. */
export const PUT: APIRoute = async ({ url, request, locals }) => {
  const siteId = url.searchParams.get('siteId');
  if (!siteId) return apiError('VALIDATION_FAILED', 'Say which site: ?siteId=...');
  const body = await parseBody(request, NoticeSettingsInput);
  if (!body.ok) return body.response;
  return answer(async () => Response.json({ settings: await setNoticeSettings(siteId, body.data, locals.user!.id) }));
};
