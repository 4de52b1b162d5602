import { NoticesFilter, NoticesPage } from '~/lib/api/notices';
import { PageQuery } from '~/lib/api/paging';
import { siteRead } from '~/server/endpoint';
import { noticesPage } from '~/server/services/site-api';

export const GET = siteRead(
  {
    query: PageQuery.extend(NoticesFilter.shape),
    answers: { 200: NoticesPage },
    doc: {
      summary: 'The site’s notices with their current figures',
      description:
        'Drift, running-while-idle and limit notices, newest first; `status` (open, acknowledged, closed, not-closed, all) and `unitId` filter. Paged by cursor.',
      group: 'Results',
    },
  },
  (siteId, { query: { limit, cursor, ...filter } }) => noticesPage(siteId, filter, { limit, cursor }),
);
