import { z } from 'zod';
import { TagHoursAnswer } from '~/lib/api/hours';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { tagHoursOf } from '~/server/services/tag-hours';

const Query = z.object({
  tag: z.string('Name the tag: ?tag=NAME').min(1, 'Name the tag: ?tag=NAME').max(200).meta({ description: 'The tag name as in the files.' }),
  from: z.iso.datetime({ offset: true }).meta({ description: 'First hour start (ISO 8601 with Z or an offset).' }),
  to: z.iso.datetime({ offset: true }).meta({ description: 'End, exclusive (ISO 8601 with Z or an offset); at most 400 days after from.' }),
});

export const GET = endpoint(
  {
    query: Query,
    answers: { 200: TagHoursAnswer },
    doc: {
      group: 'Hours',
      summary: "A tag's hours",
      description: "The hourly statistics of one tag with hour start in [from, to), oldest first, and the uploads each hour came from. 404 when the site has no tag of that name.",
    },
  },
  async ({ locals }, { params, query }) => {
    requireSite(locals, params.siteId!);
    return answer(TagHoursAnswer, await tagHoursOf(params.siteId!, query.tag, new Date(query.from), new Date(query.to)));
  },
);
