/**
 * The plant model file's shape: one JSON document with a site, its units, their ports and their
 * versioned tag links (zod schemas, their types and bounds). Documented in docs/plant-model.md. The
 * checks a schema cannot express are in ./model-checks.ts; the whole file's check, checkModel, and the
 * public face of both are in ./model.ts.
 *
 * Values are SI with the unit in the key (T0_K, p_atm_Pa, cp_J_per_kgK); a link's own figures (valid
 * range, absolute uncertainty) are in the link's engineering unit, as the historian exports them.
 */
import { z } from 'zod';
import { ELEVATION_MAX_m, ELEVATION_MIN_m } from './atmosphere';
import { NormallyIdleSchema } from './idle';
import { TagLimitsSchema } from './tag-limits';
import type { FluidKind } from '../kinds';
import { LINK_QUANTITY_NAMES, UNIT_KINDS, type LinkQuantity } from './kinds';

export const MODEL_FORMAT = 'lossline-plant-model';
export const MODEL_VERSION = 1;

/** The instant a link valid "from the start" begins at (validFrom left out of the file). */
export const BEGINNING_MS = 0;

/** Plausible dead-state and atmosphere bounds [K], [Pa]. */
export const T0_MIN_K = 223.15;
export const T0_MAX_K = 333.15;
export const PRESSURE_ATM_MIN_Pa = 2e4;
export const PRESSURE_ATM_MAX_Pa = 1.2e5;
/** A composition must sum to 1 within this [-] (it is scaled to exactly 1 when used). */
export const COMPOSITION_SUM_TOLERANCE = 1e-3;

const name = (what: string) =>
  z
    .string({ error: `Give the ${what} a name (text).` })
    .trim()
    .min(1, `Give the ${what} a name.`)
    .max(120, `The ${what} name is longer than 120 characters.`);
const finite = z.number({ error: 'Expected a number.' }).finite();
const positive = finite.positive('Must be greater than 0.');

export const CompositionSchema = z.record(z.string().max(40), finite.min(0, 'A fraction cannot be negative.').max(1, 'A fraction cannot exceed 1.'));
export type Composition = z.infer<typeof CompositionSchema>;

export const FluidSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('water') }),
  z.strictObject({ kind: z.literal('air') }),
  /** Flue gas: composition from a boiler's fuel and the O2 measured; fuelFrom names that boiler (default: this unit). */
  z.strictObject({ kind: z.literal('flue-gas'), fuelFrom: name('boiler').optional() }),
  z.strictObject({ kind: z.literal('fuel') }),
  z.strictObject({ kind: z.literal('fuel-gas'), moleFractions: CompositionSchema, label: z.string().max(120).optional() }),
  z.strictObject({ kind: z.literal('gas-mixture'), moleFractions: CompositionSchema, label: z.string().max(120).optional() }),
  z.strictObject({ kind: z.literal('liquid'), cp_J_per_kgK: positive, rho_kg_per_m3: positive, label: z.string().max(120).optional() }),
]);
export type Fluid = z.infer<typeof FluidSchema>;
/** The schema's fluid kinds are exactly the one list's (src/lib/kinds.ts FLUID_KINDS): a compile-time check; tests/plant/fluid-kinds.test.ts checks the values. */
type SameKinds<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
export const FLUID_SCHEMA_MATCHES_FLUID_KINDS: SameKinds<Fluid['kind'], FluidKind> = true;

export const FUEL_TYPES = ['natural-gas', 'light-fuel-oil', 'heavy-fuel-oil', 'bituminous-coal'] as const;

/** A boiler's fuel: by gas composition, by type and heating value, or by ultimate analysis and LHV. */
export const FuelDefinitionSchema = z.discriminatedUnion('by', [
  z.strictObject({ by: z.literal('composition'), moleFractions: CompositionSchema, price: z.string().max(120).optional() }),
  z.strictObject({ by: z.literal('heating-value'), fuelType: z.enum(FUEL_TYPES), LHV_J_per_kg: positive, price: z.string().optional() }),
  z.strictObject({
    by: z.literal('ultimate'),
    ultimate: z.strictObject({
      C: finite.min(0).max(1),
      H: finite.min(0).max(1),
      O: finite.min(0).max(1).optional(),
      N: finite.min(0).max(1).optional(),
      S: finite.min(0).max(1).optional(),
      moisture: finite.min(0).max(1).optional(),
      ash: finite.min(0).max(1).optional(),
    }),
    LHV_J_per_kg: positive,
    price: z.string().max(120).optional(),
  }),
]);
export type FuelDefinition = z.infer<typeof FuelDefinitionSchema>;

const currency = z
  .string({ error: 'Give a currency code (ISO 4217, e.g. EUR).' })
  .regex(/^[A-Z]{3}$/, 'A currency is a three-letter ISO 4217 code in capitals (EUR, USD, GBP).');

/** The price of a purchased fuel (per MWh of LHV) or of electricity (per MWh), for the cost of destruction. */
export const EnergyPriceSchema = z.strictObject({
  name: name('price'),
  kind: z.enum(['fuel', 'electricity']),
  price_per_MWh: finite.min(0, 'A price cannot be negative.'),
  currency,
});
export type EnergyPrice = z.infer<typeof EnergyPriceSchema>;

export const SiteModelSchema = z.strictObject({
  name: name('site'),
  timeZone: z.string().min(1, 'Give an IANA time zone, e.g. Europe/Berlin.').max(64),
  elevation_m: finite.min(ELEVATION_MIN_m).max(ELEVATION_MAX_m).optional(),
  p_atm_Pa: finite.min(PRESSURE_ATM_MIN_Pa, 'Give p_atm_Pa in Pa (e.g. 101325), not kPa or bar.').max(PRESSURE_ATM_MAX_Pa).optional(),
  deadState: z.strictObject({
    T0_K: finite.min(T0_MIN_K).max(T0_MAX_K),
    p0_Pa: finite.min(PRESSURE_ATM_MIN_Pa).max(PRESSURE_ATM_MAX_Pa),
    /** T0 taken hourly from an ambient-temperature tag; T0_K is then the fallback. */
    T0Tag: z.strictObject({ tag: name('tag'), unit: z.string().min(1).max(40) }).optional(),
  }),
  currency,
  prices: z.array(EnergyPriceSchema).default([]),
});
export type SiteModel = z.infer<typeof SiteModelSchema>;

const isoInstant = z.iso.datetime({ offset: true, error: 'Give an ISO 8601 instant with a zone, e.g. 2024-01-01T00:00:00Z.' });

export const LinkModelSchema = z.strictObject({
  /** Port name; left out for a measurement of the unit itself (power). */
  port: z.string().min(1).max(120).optional(),
  quantity: z.enum(LINK_QUANTITY_NAMES as [LinkQuantity, ...LinkQuantity[]]),
  tag: name('tag'),
  /** Engineering unit of the tag as exported ('barg', 'degC', 't/h', 'Nm3/h', '% dry' ...). */
  unit: z.string().min(1, 'Give the engineering unit of the tag.').max(40),
  /** O2 only: the analyser's basis. */
  basis: z.enum(['dry', 'wet']).optional(),
  /** Standard uncertainty: absolute in the link's unit, or relative in percent of reading. Default per quantity. */
  uncertainty: z.strictObject({ mode: z.enum(['absolute', 'relative']), value: finite.min(0) }).optional(),
  /** Valid range in the link's unit; readings outside it are suspect. */
  validMin: finite.optional(),
  validMax: finite.optional(),
  /** First instant the link holds; left out: from the start. */
  validFrom: isoInstant.optional(),
  /** First instant it no longer holds; left out: still current. */
  validTo: isoInstant.optional(),
});
export type LinkModel = z.infer<typeof LinkModelSchema>;

export const PortModelSchema = z.strictObject({
  name: name('port'),
  /** The kind's port slot ('inlet', 'exhaust', 'extraction' ...): fixes role and measurements. */
  slot: z.string().min(1).max(80),
  fluid: FluidSchema.optional(),
  /** Heat ports: fixed boundary temperature [K] (or link a temperature tag). */
  boundaryT_K: positive.optional(),
  /** Generic control volume: what the port's exergy counts as. */
  account: z.enum(['fuel', 'product', 'loss']).optional(),
});
export type PortModel = z.infer<typeof PortModelSchema>;

export const UnitModelSchema = z.strictObject({
  name: name('unit'),
  kind: z.enum(UNIT_KINDS),
  description: z.string().max(2000).optional(),
  /** SI values keyed as in the catalogue (src/lib/plant/kinds.ts); left-out keys take their defaults. */
  parameters: z.record(z.string().max(80), z.union([finite, z.string().max(200)])).default({}),
  fuel: FuelDefinitionSchema.optional(),
  ports: z.array(PortModelSchema).default([]),
  links: z.array(LinkModelSchema).default([]),
  /** Declared normally idle (src/lib/plant/idle.ts); left out: not idle (files before this field). */
  normallyIdle: NormallyIdleSchema.optional(),
});
export type UnitModel = z.infer<typeof UnitModelSchema>;

export const PlantModelSchema = z.strictObject({
  format: z.literal(MODEL_FORMAT, { error: `This is not a plant model file: "format" must be "${MODEL_FORMAT}".` }),
  version: z.literal(MODEL_VERSION, { error: `This file's version is not one Lossline reads; version ${MODEL_VERSION} is.` }),
  site: SiteModelSchema,
  units: z.array(UnitModelSchema).default([]),
  /** Tags' own limits (src/lib/plant/tag-limits.ts); left out: every tag has the defaults (files before this field). */
  tags: z.array(TagLimitsSchema).optional(),
});
export type PlantModel = z.infer<typeof PlantModelSchema>;

export type { ModelIssue } from './model-issue';
