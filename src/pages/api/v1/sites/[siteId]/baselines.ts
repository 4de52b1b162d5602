import { BaselinesPage } from '~/lib/api/baselines';
import { PageQuery } from '~/lib/api/paging';
import { siteRead } from '~/server/endpoint';
import { baselinesPage } from '~/server/services/site-api';

export const GET = siteRead(
  {
    query: PageQuery,
    answers: { 200: BaselinesPage },
    doc: {
      summary: 'The active baseline of each unit',
      description:
        'Each unit by name with its active baseline (null while none is accepted): the fits of efficiency and destruction with their statistics and the ASHRAE Guideline 14 check. Paged by cursor.',
      group: 'Results',
    },
  },
  (siteId, { query }) => baselinesPage(siteId, query),
);
