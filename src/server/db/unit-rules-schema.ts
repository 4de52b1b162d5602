// Per-unit limits of the unit rules (src/server/services/unit-rules.ts); energy leads edit them.
import { doublePrecision, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { user } from './auth-schema';
import { unitIdColumn } from './columns';

/**
 * A unit's limits: a cost of destruction per day above which, or an exergy efficiency below which,
 * an hour crosses; more than `hours` consecutive crossing hours open a limit notice. Either limit may
 * be unset. The normally-idle declaration lives with the unit (plant_units.normally_idle).
 */
export const unitLimits = pgTable('unit_limits', {
  unitId: unitIdColumn().primaryKey(),
  /** [currency of the site per day] */
  maxCost_per_day: doublePrecision('max_cost_per_day'),
  /** [-] */
  minEfficiency: doublePrecision('min_efficiency'),
  hours: integer('hours').notNull().default(3),
  updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
