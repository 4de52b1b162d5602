import { sql } from 'drizzle-orm';
import { doublePrecision, jsonb, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import type { EngineReason } from '~/lib/engine/types';

/** Hour states, in Lossline's words (src/lib/hour-states.ts). Only steady hours feed trends, baselines, drift. */
export { HOUR_STATES, type HourState } from '~/lib/hour-states';
import type { HourState } from '~/lib/hour-states';
import { unitIdColumn } from './columns';

/**
 * One unit's steady-state exergy balance for one local clock hour (hourStart = the UTC instant it
 * starts). Stored with the model version and a hash of every input, so the same inputs always give
 * the same row and a recompute rewrites only rows whose inputs changed. Powers in W, efficiency [-],
 * expanded uncertainties U (k = 2) in the same units, cost per hour in the site's currency.
 *
 * Only what pages, notices and reports query is stored. The hour opened up (port states, terms,
 * uncertainty contributors, tag hours used) is rebuilt on demand from the stored tag hours and the
 * link versions of the hour (src/server/services/engine-results.ts unitHourDetail); the inputs hash
 * proves the rebuilt hour is the stored one. Partitioned by month (migration scale-partitions).
 */
export const unitHours = pgTable(
  'unit_hours',
  {
    unitId: unitIdColumn(),
    hourStart: timestamp('hour_start', { withTimezone: true }).notNull(),
    state: text('state').$type<HourState>().notNull(),
    /** Why the hour has its state: [{ code, message, tag? }], most severe first. */
    reasons: jsonb('reasons').$type<EngineReason[]>().notNull().default(sql`'[]'::jsonb`),
    /** The unit's load measure for the hour (its kind decides: power, steam flow ...) [W or kg/s]. */
    load: doublePrecision('load'),
    loadUnit: text('load_unit'),
    /** Dead state of the hour. */
    T0_K: doublePrecision('t0_k'),
    p0_Pa: doublePrecision('p0_pa'),
    fuel_W: doublePrecision('fuel_w'),
    product_W: doublePrecision('product_w'),
    loss_W: doublePrecision('loss_w'),
    destruction_W: doublePrecision('destruction_w'),
    efficiency: doublePrecision('efficiency'),
    /** Expanded (k = 2) uncertainties. */
    efficiency_U: doublePrecision('efficiency_u'),
    destruction_U_W: doublePrecision('destruction_u_w'),
    /** First-law closure residual [% of energy throughput]. */
    closure_pct: doublePrecision('closure_pct'),
    entropyGeneration_W_per_K: doublePrecision('entropy_generation_w_per_k'),
    /** Cost of the hour's destruction [currency per hour]. */
    destructionCost_per_h: doublePrecision('destruction_cost_per_h'),
    modelVersion: text('model_version').notNull(),
    inputsHash: text('inputs_hash').notNull(),
    computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  // One index: the primary key (unit, hour). A second one on (unit, state, hour) cost about 60 bytes a
  // row and no query needs it (a unit's hours of a period are read by the key and filtered by state).
  (t) => [primaryKey({ columns: [t.unitId, t.hourStart] })],
);
