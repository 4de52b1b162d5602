/**
 * What the plant screens and the API send to make or change a site, a unit or a port: one zod schema
 * each, run by the server (src/server/services/plant.ts) and by the islands' forms alike.
 */
import { z } from 'zod';
import { ELEVATION_MAX_m, ELEVATION_MIN_m } from './atmosphere';
import { NormallyIdleSchema } from './idle';
import { DisplayUnitsSchema } from '../units/display';
import { UNIT_KINDS } from '../kinds';
import { EnergyPriceSchema, FluidSchema, FuelDefinitionSchema, PRESSURE_ATM_MAX_Pa, PRESSURE_ATM_MIN_Pa, T0_MAX_K, T0_MIN_K, isTimeZone } from './model';

export const Currency = z.string().regex(/^[A-Z]{3}$/, 'A currency is a three-letter ISO 4217 code in capitals (EUR, USD, GBP).');

/** A site's settings as the screens and the API send them. */
export const SiteInput = z.strictObject({
  name: z.string().trim().min(1, 'Give the site a name.').max(120),
  timeZone: z.string().max(64).refine(isTimeZone, 'Not an IANA time zone (e.g. Europe/Berlin, America/Chicago, UTC).'),
  /** Elevation above sea level [m]; used for p_atm_Pa when that is not given. */
  elevation_m: z.number().finite().min(ELEVATION_MIN_m).max(ELEVATION_MAX_m).nullable().optional(),
  /** Atmospheric pressure [Pa] for gauge readings; from the elevation when left out. */
  p_atm_Pa: z.number().finite().min(PRESSURE_ATM_MIN_Pa, 'Give p_atm_Pa in Pa (e.g. 101325).').max(PRESSURE_ATM_MAX_Pa).nullable().optional(),
  T0_K: z.number().finite().min(T0_MIN_K).max(T0_MAX_K).default(298.15),
  p0_Pa: z.number().finite().min(PRESSURE_ATM_MIN_Pa).max(PRESSURE_ATM_MAX_Pa).default(101325),
  /** Ambient-temperature tag for an hourly T0 (T0_K is then the fallback); null for a fixed T0. */
  T0Tag: z.strictObject({ tag: z.string().trim().min(1).max(200), unit: z.string().min(1).max(40) }).nullable().optional(),
  currency: Currency.default('EUR'),
  prices: z.array(EnergyPriceSchema).default([]),
  /** Units the site's pages show numbers in; null: follow the units of its tags; left out: unchanged. */
  displayUnits: DisplayUnitsSchema.partial().nullable().optional(),
});
export type SiteInput = z.infer<typeof SiteInput>;

export const UnitCreateInput = z.strictObject({
  name: z.string().trim().min(1, 'Give the unit a name.').max(120),
  kind: z.enum(UNIT_KINDS),
  description: z.string().max(2000).optional(),
  parameters: z.record(z.string().max(80), z.union([z.number().finite(), z.string().max(200)])).optional(),
  fuel: FuelDefinitionSchema.optional(),
  /** Also add the kind's required ports, named after their slots. */
  withPorts: z.boolean().optional(),
});
export const UnitUpdateInput = z.strictObject({
  name: z.string().trim().min(1).max(120).optional(),
  description: z.string().max(2000).nullable().optional(),
  /** Values to set (SI); null resets a parameter to its default. */
  parameters: z.record(z.string().max(80), z.union([z.number().finite(), z.string().max(200), z.null()])).optional(),
  fuel: FuelDefinitionSchema.nullable().optional(),
  /** Declared normally idle; null: not idle. */
  normallyIdle: NormallyIdleSchema.nullable().optional(),
});
export const PortInput = z.strictObject({
  name: z.string().trim().min(1, 'Give the port a name.').max(120),
  slot: z.string().min(1).max(80),
  fluid: FluidSchema.nullable().optional(),
  boundaryT_K: z.number().finite().positive().nullable().optional(),
  account: z.enum(['fuel', 'product', 'loss']).nullable().optional(),
});
export const PortUpdateInput = PortInput.partial().omit({ slot: true });
