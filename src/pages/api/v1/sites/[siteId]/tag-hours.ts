import { z } from 'zod';
import { TagHoursAnswer } from '~/lib/api/hours';
import { siteRead } from '~/server/endpoint';
import { tagHoursOf } from '~/server/services/tag-hours';

const Query = z.object({
  tag: z.string('Name the tag: ?tag=NAME').min(1, 'Name the tag: ?tag=NAME').max(200),
  from: z.iso.datetime({ offset: true }),
  to: z.iso.datetime({ offset: true }),
});

export const GET = siteRead(
  {
    query: Query,
    answers: { 200: TagHoursAnswer },
    doc: { summary: 'A tag’s hourly statistics', description: 'Hours starting in [from, to), at most 400 days.', group: 'Hours' },
  },
  (siteId, { query }) => tagHoursOf(siteId, query.tag, new Date(query.from), new Date(query.to)),
);
