/** Answers of the plant model under /api/v1 (GET and PUT /api/v1/sites/{siteId}/model) and of POST /api/sites/from-model. */
import { z } from 'zod';
import { PlantModelSchema } from '../plant/model';
import { Id } from './common';

/** GET: the model file itself (docs/plant-model.md). */
export const ModelFileAnswer = PlantModelSchema;

const Ids = z.array(Id);

/** What a model write did, by id (answered by the PUT and by creating a site from a file). */
export const ModelChangesSchema = z.object({
  created: z
    .object({ units: Ids, ports: Ids, links: Ids, tags: Ids })
    .describe('Rows the file added (a link version is never edited: a changed link is a new version).'),
  changed: z
    .object({ units: Ids, ports: Ids, tags: Ids })
    .describe('Units whose description, parameters, fuel or idle declaration changed; ports whose fluid, boundary, account or order changed; tags whose limits (the file’s tags[]) changed.'),
  removed: z
    .object({ units: Ids, ports: Ids, links: Ids })
    .describe('Rows the file no longer has (a unit is keyed by name and kind: a renamed unit is removed and created).'),
  renamed: z
    .array(z.object({ what: z.literal('site'), id: Id, from: z.string(), to: z.string(), message: z.string() }))
    .describe('Renames the file made: the site is renamed when the file names it otherwise.'),
  unitIds: z
    .record(z.string(), z.object({ id: Id, ports: z.record(z.string(), Id) }))
    .describe('Every unit of the model by name: its id (for the hours endpoints) and its ports’ ids by name.'),
});

const Recompute = z.object({ siteId: Id, fromMs: z.number(), toMs: z.number(), unitIds: z.array(Id).optional() });

export const ModelPutAnswer = ModelChangesSchema.extend({
  siteId: Id,
  units: z.number().int().describe('Units in the model.'),
  recompute: z.array(Recompute).describe('The hour spans queued for computing again because of the change.'),
});
export type ModelPutAnswer = z.infer<typeof ModelPutAnswer>;

export const SiteFromModelAnswer = ModelChangesSchema.extend({ siteId: Id, units: z.number().int() });
export type SiteFromModelAnswer = z.infer<typeof SiteFromModelAnswer>;
