import { z } from 'zod';
import { isId } from '~/server/access';
import { endpoint, requireSite } from '~/server/endpoint';
import { NoticeSettingsInput, noticeSettingsFor, setNoticeSettings } from '~/server/services/notices';

/** A malformed id answers 404 from the service, as for an id nobody has. */
const Query = z.object({ siteId: z.string('Say which site: ?siteId=...').max(100) });

/** A site's notice settings (?siteId=): the multiple of cost per day that sends an escalation mail. */
export const GET = endpoint({ query: Query }, async ({ locals }, { query }) => {
  // The site is named in the query, not the path, so the guard's site check does not see it.
  if (isId(query.siteId)) requireSite(locals, query.siteId);
  return Response.json({ settings: await noticeSettingsFor(query.siteId) });
});

/** Energy leads (and admins) change it. */
export const PUT = endpoint({ query: Query, body: NoticeSettingsInput }, async ({ locals }, { query, body }) => {
  if (isId(query.siteId)) requireSite(locals, query.siteId);
  return Response.json({ settings: await setNoticeSettings(query.siteId, body, locals.user!.id) });
});
