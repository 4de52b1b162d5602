import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { NoticeSettingsInput, noticeSettingsFor, setNoticeSettings } from '~/server/services/notices';

/** A malformed id answers 404 from the service, as for an id nobody has. */
const Query = z.object({ siteId: z.string('Say which site: ?siteId=...').max(100) });

/** A site's notice settings (?siteId=): the multiple of cost per day that sends an escalation mail. */
export const GET = endpoint({ query: Query }, async (_ctx, { query }) => Response.json({ settings: await noticeSettingsFor(query.siteId) }));

/** Energy leads (and admins) change it. */
export const PUT = endpoint({ query: Query, body: NoticeSettingsInput }, async ({ locals }, { query, body }) =>
  Response.json({ settings: await setNoticeSettings(query.siteId, body, locals.user!.id) }),
);
