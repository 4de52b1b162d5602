import { LedgerAnswerSchema } from '~/lib/api/ledger';
import { PeriodQuery } from '~/lib/views/period';
import { siteRead } from '~/server/endpoint';
import { siteLedger } from '~/server/services/views';

export const GET = siteRead(
  {
    query: PeriodQuery,
    answers: { 200: LedgerAnswerSchema },
    doc: {
      summary: 'The loss ledger of a period',
      description:
        'The units ranked by the cost of their destruction over a period of the site’s clock: `range` day, week (default), month or year around `anchor` (a local date, default today on site), or `range=custom&from=yyyy-MM-dd&to=yyyy-MM-dd` (local days, both included).',
      group: 'Results',
    },
  },
  (siteId, { query }) => siteLedger(siteId, query),
);
