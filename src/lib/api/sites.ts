/** Answers of the site and its units under /api/v1 (GET /api/v1/sites/{siteId}, .../units). */
import { z } from 'zod';
import { LinkModelSchema, PortModelSchema, SiteModelSchema, UnitModelSchema } from '../plant/model';
import { pageOf } from './paging';
import { Id, Instant } from './common';

/** The site: its id and its settings in the names and shape of the plant model file's `site`. */
export const SiteAnswer = z.object({
  id: Id,
  settings: SiteModelSchema.describe('The site settings exactly as the plant model file writes them (its site part; the format is described at /help/model-file).'),
  createdAt: Instant,
  updatedAt: Instant,
});
export type SiteAnswer = z.infer<typeof SiteAnswer>;

const StatusItem = z.object({ code: z.string(), port: z.string().optional(), message: z.string() }).loose();

/** A unit as the model file writes it, with the ids of the unit, its ports and its current link versions, and its completeness. */
export const UnitItem = UnitModelSchema.omit({ ports: true, links: true }).extend({
  id: Id,
  ports: z.array(PortModelSchema.extend({ id: Id })),
  links: z.array(LinkModelSchema.extend({ id: Id })).describe('The link versions holding now.'),
  status: z.object({ complete: z.boolean(), missing: z.array(StatusItem), conflicts: z.array(StatusItem) }),
});
export type UnitItem = z.infer<typeof UnitItem>;

export const UnitsPage = pageOf(UnitItem);
export type UnitsPage = z.infer<typeof UnitsPage>;
