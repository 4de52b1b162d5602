import { z } from 'zod';
import { SiteFromModelAnswer } from '~/lib/api/model';
import { answer } from '~/server/answer';
import { endpoint } from '~/server/endpoint';
import { createSiteFromModel } from '~/server/services/plant-model';

/** Creates a new site from a plant model file (docs/plant-model.md); all or nothing, checked by the service. */
export const POST = endpoint({ body: z.unknown(), answers: { 201: SiteFromModelAnswer } }, async (_ctx, { body }) =>
  answer(SiteFromModelAnswer, await createSiteFromModel(body), { status: 201 }),
);
