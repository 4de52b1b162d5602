import { NoticesFilter, NoticesPage } from '~/lib/api/notices';
import { PageQuery } from '~/lib/api/paging';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { noticesPage } from '~/server/services/site-api';

export const GET = endpoint(
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
  async ({ locals }, { params, query }) => {
    requireSite(locals, params.siteId!);
    const { limit, cursor, ...filter } = query;
    return answer(NoticesPage, await noticesPage(params.siteId!, filter, { limit, cursor }));
  },
);
