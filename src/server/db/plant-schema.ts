import { sql } from 'drizzle-orm';
import { doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import type { EnergyPrice, FuelDefinition, Fluid } from '~/lib/plant/model';
import type { UnitKind } from '~/lib/kinds';
import type { LinkQuantity, ParamValue, PortRole, PortStream } from '~/lib/plant/kinds';
import type { UncertaintyMode } from '~/lib/plant/uncertainty';
import type { NormallyIdle } from '~/lib/plant/idle';
import type { DisplayUnits } from '~/lib/units/display';
import { user } from './auth-schema';
import { tags } from './ingest-schema';
import { idColumn, siteIdColumn, unitIdColumn } from './columns';

/**
 * A plant: its clock, its atmosphere and its dead state. p_atm_Pa turns gauge readings absolute; when
 * only the elevation is given it comes from the standard atmosphere (src/lib/plant/atmosphere.ts).
 * Dead state: fixed T0_K and p0_Pa, or T0 hourly from an ambient-temperature tag with T0_K as fallback.
 */
export const sites = pgTable('sites', {
  id: idColumn(),
  name: text('name').notNull().unique(),
  timeZone: text('time_zone').notNull().default('UTC'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  elevation_m: doublePrecision('elevation_m'),
  p_atm_Pa: doublePrecision('p_atm_pa').notNull().default(101325),
  T0_K: doublePrecision('t0_k').notNull().default(298.15),
  p0_Pa: doublePrecision('p0_pa').notNull().default(101325),
  t0TagId: uuid('t0_tag_id').references((): AnyPgColumn => tags.id, { onDelete: 'set null' }),
  /** Engineering unit of the ambient-temperature tag ('degC'). */
  t0TagUnit: text('t0_tag_unit'),
  currency: text('currency').notNull().default('EUR'),
  /** Prices of purchased fuels (per MWh LHV) and electricity (per MWh), for the cost of destruction. */
  prices: jsonb('prices').$type<EnergyPrice[]>().notNull().default(sql`'[]'::jsonb`),
  /** Units the site's screens, mails and reports show numbers in (src/lib/units/display.ts); null: derived from its tags. */
  displayUnits: jsonb('display_units').$type<Partial<DisplayUnits>>(),
  /** Months of tag hours and unit hours kept (null: all); raw files stay in the store (src/server/db/partitions.ts). */
  retentionMonths: integer('retention_months'),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One piece of equipment of a kind of src/lib/kinds.ts (catalogue: src/lib/plant/kinds.ts); parameters in SI, keyed as there. */
export const plantUnits = pgTable(
  'plant_units',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    name: text('name').notNull(),
    kind: text('kind').$type<UnitKind>().notNull(),
    description: text('description'),
    parameters: jsonb('parameters').$type<Record<string, ParamValue>>().notNull().default(sql`'{}'::jsonb`),
    /** Boilers: the fuel definition. */
    fuel: jsonb('fuel').$type<FuelDefinition>(),
    /** Declared normally idle (src/lib/plant/idle.ts); null: not idle. */
    normallyIdle: jsonb('normally_idle').$type<NormallyIdle>(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('plant_units_site_name').on(t.siteId, t.name)],
);

/** An inlet or outlet of a unit (a stream with its fluid), or a heat boundary of a control volume. */
export const plantPorts = pgTable(
  'plant_ports',
  {
    id: idColumn(),
    unitId: unitIdColumn(),
    name: text('name').notNull(),
    /** The kind's port slot ('inlet', 'extraction' ...); role and stream are copied from it. */
    slot: text('slot').notNull(),
    role: text('role').$type<PortRole>().notNull(),
    stream: text('stream').$type<PortStream>().notNull().default('matter'),
    fluid: jsonb('fluid').$type<Fluid>(),
    boundaryT_K: doublePrecision('boundary_t_k'),
    /** Generic control volume: 'fuel' | 'product' | 'loss'. */
    account: text('account'),
    position: integer('position').notNull().default(0),
  },
  (t) => [uniqueIndex('plant_ports_unit_name').on(t.unitId, t.name)],
);

/**
 * A tag bound to a quantity at a port (portId set) or of the unit (portId null), versioned: a change
 * closes the current version (validTo) and starts a new one; [validFrom, validTo) half-open, validTo
 * null while current. Uncertainty: 'absolute' in engUnit, or 'relative' in percent of reading. Valid
 * range in engUnit.
 */
export const tagLinks = pgTable(
  'tag_links',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    unitId: unitIdColumn(),
    portId: uuid('port_id').references(() => plantPorts.id, { onDelete: 'cascade' }),
    tagId: uuid('tag_id')
      .notNull()
      .references(() => tags.id, { onDelete: 'cascade' }),
    quantity: text('quantity').$type<LinkQuantity>().notNull(),
    engUnit: text('eng_unit').notNull(),
    basis: text('basis').$type<'dry' | 'wet'>(),
    uncertaintyMode: text('uncertainty_mode').$type<UncertaintyMode>().notNull(),
    uncertainty: doublePrecision('uncertainty').notNull(),
    validMin: doublePrecision('valid_min'),
    validMax: doublePrecision('valid_max'),
    validFrom: timestamp('valid_from', { withTimezone: true }).notNull(),
    validTo: timestamp('valid_to', { withTimezone: true }),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('tag_links_site_time').on(t.siteId, t.validFrom),
    index('tag_links_unit').on(t.unitId, t.portId, t.quantity),
    index('tag_links_tag').on(t.tagId),
  ],
);
