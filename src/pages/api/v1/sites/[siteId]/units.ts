import { PageQuery } from '~/lib/api/paging';
import { UnitsPage } from '~/lib/api/sites';
import { siteRead } from '~/server/endpoint';
import { unitsPage } from '~/server/services/site-api';

export const GET = siteRead(
  {
    query: PageQuery,
    answers: { 200: UnitsPage },
    doc: {
      summary: 'The site’s units',
      description:
        'By name, each as the plant model file writes it plus the ids of the unit, its ports and its current link versions, and what it lacks (status). Paged by cursor.',
      group: 'Site',
    },
  },
  (siteId, { query }) => unitsPage(siteId, query),
);
