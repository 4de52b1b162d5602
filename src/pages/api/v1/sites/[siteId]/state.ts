import { SiteStateAnswer } from '~/lib/api/state';
import { siteRead } from '~/server/endpoint';
import { getSite } from '~/server/services/plant';
import { siteProcessingState } from '~/server/services/site-state';

export const GET = siteRead(
  {
    answers: { 200: SiteStateAnswer },
    doc: {
      summary: 'Whether the site’s figures are final',
      description:
        'What is still on its way from the files the site was sent to its figures: files waiting or being read, unit hours waiting to be computed, drift checks pending, and the latest computed hour. `settled: true` means the figures of everything sent so far are final.',
      group: 'Files',
    },
  },
  async (siteId) => {
    await getSite(siteId);
    return siteProcessingState(siteId);
  },
);
