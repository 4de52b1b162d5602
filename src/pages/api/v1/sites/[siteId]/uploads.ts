import { PageQuery } from '~/lib/api/paging';
import { UploadsFilter, UploadsPage } from '~/lib/api/uploads';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { uploadsPage } from '~/server/services/site-api';

export const GET = endpoint(
  {
    query: PageQuery.extend(UploadsFilter.shape),
    answers: { 200: UploadsPage },
    doc: {
      summary: 'The site’s uploads with their reports',
      description: 'Newest first, each with its state, progress and report (`summary`); `status` filters. Paged by cursor.',
      group: 'Files',
    },
  },
  async ({ locals }, { params, query }) => {
    requireSite(locals, params.siteId!);
    const { limit, cursor, ...filter } = query;
    return answer(UploadsPage, await uploadsPage(params.siteId!, filter, { limit, cursor }));
  },
);
