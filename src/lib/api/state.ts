/** The answer of GET /api/v1/sites/{siteId}/state: SiteProcessingState of src/server/services/site-state.ts. */
import { z } from 'zod';
import { Id, Instant } from './common';

const Work = z.object({
  waiting: z.number().int().describe('Jobs not yet started (created, or waiting to retry).'),
  active: z.number().int().describe('Jobs a worker holds now.'),
});

export const SiteStateAnswer = z.object({
  siteId: Id,
  settled: z
    .boolean()
    .describe(
      'True when no file is waiting or being read and no computing or drift check is waiting or running: the figures are final for what the site was sent.',
    ),
  files: z.object({
    waiting: z.number().int().describe('Browser uploads whose bytes have not arrived, and files queued for reading.'),
    reading: z.number().int().describe('Files a worker is reading now.'),
    needsReview: z.number().int().describe('Files stopped for a person’s answer (a layout question); not counted against settled.'),
  }),
  compute: Work.describe('Unit hours waiting to be computed or being computed.'),
  driftCheck: Work.describe('Drift checks and the idle and limit rules of units.'),
  latestComputedHour: Instant.nullable().describe('The newest hour any unit of the site has a computed balance for.'),
  latestTagHour: Instant.nullable().describe('The newest hour any tag of the site has statistics for.'),
  asOf: Instant,
});
export type SiteStateAnswer = z.infer<typeof SiteStateAnswer>;
