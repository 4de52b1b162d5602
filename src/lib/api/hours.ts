/** Answers of the hours under /api/v1: unit hours (JSON; CSV is text/csv), one unit hour, tag hours. */
import { z } from 'zod';
import { HOUR_STATES } from '../hour-states';
import { Currency, Id, Instant, Num } from './common';

export const UnitHourRowSchema = z.object({
  hourStart: Instant,
  state: z.enum(HOUR_STATES),
  reasons: z.array(z.object({ code: z.string(), message: z.string(), tag: z.string().optional() })).describe('Most severe first.'),
  load: Num,
  loadUnit: z.string().nullable(),
  T0_K: Num,
  p0_Pa: Num,
  fuel_W: Num,
  product_W: Num,
  loss_W: Num,
  destruction_W: Num,
  efficiency: Num,
  efficiency_U: Num,
  destruction_U_W: Num,
  closure_pct: Num,
  entropyGeneration_W_per_K: Num,
  destructionCost_per_h: Num,
  modelVersion: z.string(),
  inputsHash: z.string(),
  computedAt: Instant,
});

const UnitRef = z.object({ id: Id, name: z.string(), kind: z.string(), siteId: Id, currency: Currency });

export const UnitHoursAnswer = z.object({
  unit: UnitRef.extend({ siteName: z.string(), timeZone: z.string() }),
  from: Instant,
  to: Instant,
  hours: z.array(UnitHourRowSchema),
});
export type UnitHoursAnswer = z.infer<typeof UnitHoursAnswer>;

export const UnitHourAnswer = z.object({
  unit: UnitRef,
  hour: UnitHourRowSchema.extend({
    detail: z.record(z.string(), z.unknown()).nullable().describe('The audit trail, rebuilt from the stored tag hours (the same figures the hour\u2019s page shows).'),
    rebuilt: z.object({ modelVersion: z.string().nullable(), inputsHash: z.string().nullable(), matches: z.boolean(), ms: z.number() }),
  }),
});
export type UnitHourAnswer = z.infer<typeof UnitHourAnswer>;

export const TagHoursAnswer = z.object({
  tag: z.object({ id: Id, name: z.string(), unitHint: z.string().nullable(), kind: z.string() }),
  hours: z.array(
    z.object({
      hourStart: Instant,
      mean: Num,
      min: Num,
      max: Num,
      std: Num,
      first: Num,
      last: Num,
      samples: z.number().int(),
      coveredFraction: z.number(),
      nonNumeric: z.number().int(),
      outOfRange: z.number().int(),
      flatline: z.boolean(),
      flags: z.array(z.string()),
      uploadIds: z.array(Id),
    }),
  ),
});
export type TagHoursAnswer = z.infer<typeof TagHoursAnswer>;
