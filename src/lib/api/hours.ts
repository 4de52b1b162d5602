/**
 * What the hours endpoints of /api/v1 answer (tag hours, a unit's hours, one unit hour opened up): one
 * zod schema each, which types the endpoint's answer and is the OpenAPI document's description of it
 * (src/server/openapi.ts), so the two cannot drift. Pure shapes: no server imports.
 */
import { z } from 'zod';
import { HOUR_STATES } from '~/lib/hour-states';

const Instant = z.iso.datetime({ offset: true }).meta({ description: 'An instant, ISO 8601 in UTC (Z).' });
const num = z.number().nullable();

/** One tag hour: the statistics of its samples and what the reader noticed. */
export const TagHour = z.object({
  hourStart: Instant,
  mean: num,
  min: num,
  max: num,
  std: num,
  first: num,
  last: num,
  samples: z.number().int(),
  coveredFraction: z.number().meta({ description: 'Share of the hour the samples cover, 0..1.' }),
  nonNumeric: z.number().int(),
  outOfRange: z.number().int(),
  flatline: z.boolean().meta({ description: 'The value stayed frozen longer than the frozen-value limit.' }),
  flags: z.array(z.string()).meta({ description: 'What the reader noticed (duplicate-times, bad-quality, combined-files ...).' }),
  uploadIds: z.array(z.uuid()).meta({ description: 'Uploads whose samples fall in the hour, newest first.' }),
});

export const TagHoursAnswer = z
  .object({
    tag: z.object({ id: z.uuid(), name: z.string(), unitHint: z.string().nullable(), kind: z.string() }),
    hours: z.array(TagHour),
  })
  .meta({ id: 'TagHours' });
export type TagHoursAnswer = z.infer<typeof TagHoursAnswer>;

/** Why an hour has its state, most severe first. */
export const HourReason = z.object({ code: z.string(), message: z.string(), tag: z.string().optional() });

/** One unit hour without its detail; units are in the field names (SI). */
export const UnitHour = z
  .object({
    hourStart: Instant,
    state: z.enum(HOUR_STATES),
    reasons: z.array(HourReason),
    load: num,
    loadUnit: z.string().nullable(),
    T0_K: num,
    p0_Pa: num,
    fuel_W: num,
    product_W: num,
    loss_W: num,
    destruction_W: num,
    efficiency: num,
    efficiency_U: num.meta({ description: 'Expanded (k = 2) uncertainty of the efficiency.' }),
    destruction_U_W: num.meta({ description: 'Expanded (k = 2) uncertainty of the destruction.' }),
    closure_pct: num.meta({ description: 'First-law closure residual, % of energy throughput.' }),
    entropyGeneration_W_per_K: num,
    destructionCost_per_h: num.meta({ description: "Cost of the hour's destruction, in the site's currency per hour." }),
    modelVersion: z.string(),
    inputsHash: z.string(),
    computedAt: Instant,
  })
  .meta({ id: 'UnitHour' });
export type UnitHour = z.infer<typeof UnitHour>;

const UnitRef = z.object({ id: z.uuid(), name: z.string(), kind: z.string(), siteId: z.uuid(), currency: z.string() });

export const UnitHoursAnswer = z
  .object({
    unit: UnitRef.extend({ siteName: z.string(), timeZone: z.string() }),
    from: Instant,
    to: Instant,
    hours: z.array(UnitHour),
  })
  .meta({ id: 'UnitHours' });
export type UnitHoursAnswer = z.infer<typeof UnitHoursAnswer>;

export const UnitHourDetailAnswer = z
  .object({
    unit: UnitRef,
    hour: UnitHour.extend({
      detail: z.record(z.string(), z.unknown()).nullable().meta({ description: 'The audit trail: port states, terms and checks, rebuilt from the stored tag hours.' }),
      rebuilt: z.object({
        modelVersion: z.string().nullable(),
        inputsHash: z.string().nullable(),
        matches: z.boolean().meta({ description: 'The rebuilt hour has the stored model version and inputs hash.' }),
        ms: z.number(),
      }),
    }),
  })
  .meta({ id: 'UnitHourDetail' });
export type UnitHourDetailAnswer = z.infer<typeof UnitHourDetailAnswer>;
