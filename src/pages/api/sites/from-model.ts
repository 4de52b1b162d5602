import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { createSiteFromModel } from '~/server/services/plant-model';

/** Creates a new site from a plant model file (docs/plant-model.md); all or nothing, checked by the service. */
export const POST = endpoint({ body: z.unknown() }, async (_ctx, { body }) => Response.json(await createSiteFromModel(body), { status: 201 }));
