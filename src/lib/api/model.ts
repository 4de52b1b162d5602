/**
 * What the plant-model endpoints of /api/v1 answer: the model file (the schema the PUT checks it
 * with, src/lib/plant/model.ts) and the PUT's outcome. Pure shapes: no server imports.
 */
import { z } from 'zod';
import { PlantModelSchema } from '~/lib/plant/model';

/** The site's plant model file (docs/plant-model.md), as GET answers it and PUT takes it. */
export const ModelFile = PlantModelSchema.meta({ id: 'PlantModel', description: 'A plant model file (docs/plant-model.md).' });
export type ModelFile = z.infer<typeof ModelFile>;

/** A span of hours queued for computing again after the change. */
export const RecomputeSpan = z.object({
  siteId: z.uuid(),
  fromMs: z.number().int().meta({ description: 'Start, epoch milliseconds.' }),
  toMs: z.number().int().meta({ description: 'End (exclusive), epoch milliseconds.' }),
  unitIds: z.array(z.uuid()).optional(),
});

export const ModelReplaced = z
  .object({
    siteId: z.uuid(),
    units: z.number().int().meta({ description: 'How many units the model now has.' }),
    recompute: z.array(RecomputeSpan).meta({ description: 'The spans of hours queued for computing again.' }),
  })
  .meta({ id: 'ModelReplaced' });
export type ModelReplaced = z.infer<typeof ModelReplaced>;
