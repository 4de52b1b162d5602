import { SiteAnswer } from '~/lib/api/sites';
import { siteRead } from '~/server/endpoint';
import { siteAnswer } from '~/server/services/site-api';

export const GET = siteRead(
  {
    answers: { 200: SiteAnswer },
    doc: {
      summary: 'The site and its settings',
      description: 'The settings have the names and shape of the plant model file’s `site` (deadState, p_atm_Pa, prices ...).',
      group: 'Site',
    },
  },
  (siteId) => siteAnswer(siteId),
);
