import { PageQuery } from '~/lib/api/paging';
import { UploadsFilter, UploadsPage } from '~/lib/api/uploads';
import { siteRead } from '~/server/endpoint';
import { uploadsPage } from '~/server/services/site-api';

export const GET = siteRead(
  {
    query: PageQuery.extend(UploadsFilter.shape),
    answers: { 200: UploadsPage },
    doc: {
      summary: 'The site’s uploads with their reports',
      description: 'Newest first, each with its state, progress and report (`summary`); `status` filters. Paged by cursor.',
      group: 'Files',
    },
  },
  (siteId, { query: { limit, cursor, ...filter } }) => uploadsPage(siteId, filter, { limit, cursor }),
);
