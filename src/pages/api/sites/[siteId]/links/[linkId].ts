import { z } from 'zod';
import { InstantText, endpoint } from '~/server/endpoint';
import { endLink } from '~/server/services/plant-links';

/** Ends a link at ?at= (default now): the tag no longer measures this quantity from then on. */
export const DELETE = endpoint({ query: z.object({ at: InstantText.optional() }) }, async (_ctx, { params, query }) =>
  Response.json(await endLink(params.siteId!, params.linkId!, query.at ?? new Date())),
);
