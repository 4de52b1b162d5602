import { z } from 'zod';
import { InstantText, endpoint } from '~/server/endpoint';
import { LinkInput, linksForRange, linksValidAt, setLink } from '~/server/services/plant-links';

const Query = z.object({ at: InstantText.optional(), from: InstantText.optional(), to: InstantText.optional() });

/** Links holding at ?at= (default now), or every version overlapping ?from=&to=. */
export const GET = endpoint({ query: Query }, async (_ctx, { params, query }) => {
  if (query.from && query.to) return Response.json({ links: await linksForRange(params.siteId!, query.from, query.to) });
  return Response.json({ links: await linksValidAt(params.siteId!, query.at ?? new Date()) });
});

/** Links a tag or changes a link: a new version from validFrom (the holding one is closed there). */
export const POST = endpoint({ body: LinkInput }, async ({ locals }, { params, body }) =>
  Response.json(await setLink(params.siteId!, body, locals.user?.id ?? null), { status: 201 }),
);
