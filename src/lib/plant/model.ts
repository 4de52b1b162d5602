/**
 * The plant model file: one JSON document with a site, its units, their ports and their versioned tag
 * links, so a plant is kept under version control and set up in one step. Documented in
 * docs/plant-model.md. Pure: the schema (zod) plus the checks a schema cannot express, every problem
 * reported with its JSON path ('$.units[2].links[0].unit').
 *
 * Values are SI with the unit in the key (T0_K, p_atm_Pa, cp_J_per_kgK); a link's own figures (valid
 * range, absolute uncertainty) are in the link's engineering unit, as the historian exports them.
 */
import { jsonPath } from '~/lib/zod-words';
import { z } from 'zod';
import { canConvert } from '../units/convert';
import { ELEVATION_MAX_m, ELEVATION_MIN_m } from './atmosphere';
import { NormallyIdleSchema } from './idle';
import { TagLimitsSchema, checkTagLimits } from './tag-limits';
import { humanErrorMap, humanIssues } from '../zod-words';
import { LINK_QUANTITY_NAMES, UNIT_KINDS, kindSpec, type LinkQuantity } from './kinds';

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

/** One problem in a model file (or a single edit), with where it is. */
export interface ModelIssue {
  /** JSON path: '$', '$.site.timeZone', '$.units[2].links[0].unit'. */
  readonly path: string;
  readonly message: string;
}


export { isTimeZone, checkComposition, checkParameter, checkPort, checkLink, linkKey, linkInterval, type LinkTarget } from './model-checks';
import { isTimeZone, checkComposition, checkParameter, checkPort, checkLink, linkKey, linkInterval, type LinkTarget } from './model-checks';

/** Problems of one unit: parameters, fuel, ports and links (paths under `at`). */
export function checkUnit(unit: UnitModel, at: readonly PropertyKey[], ctx: { boilers: ReadonlySet<string>; priceNames: ReadonlySet<string> }): ModelIssue[] {
  const out: ModelIssue[] = [];
  const spec = kindSpec(unit.kind);
  for (const [key, value] of Object.entries(unit.parameters)) out.push(...checkParameter(unit.kind, key, value, [...at, 'parameters', key]));
  if (unit.fuel) {
    if (!spec.needsFuel) out.push({ path: jsonPath([...at, 'fuel']), message: `A ${unit.kind} has no fuel definition; only a boiler does.` });
    if (unit.fuel.by === 'composition') out.push(...checkComposition(unit.fuel.moleFractions, [...at, 'fuel', 'moleFractions']));
    if (unit.fuel.by === 'ultimate') {
      const sum = Object.values(unit.fuel.ultimate).reduce<number>((a, b) => a + (b ?? 0), 0);
      if (Math.abs(sum - 1) > COMPOSITION_SUM_TOLERANCE) {
        out.push({ path: jsonPath([...at, 'fuel', 'ultimate']), message: `Mass fractions sum to ${Number(sum.toPrecision(6))}; they must sum to 1 (moisture and ash included).` });
      }
    }
    if (unit.fuel.price !== undefined && !ctx.priceNames.has(unit.fuel.price)) {
      out.push({ path: jsonPath([...at, 'fuel', 'price']), message: `No price named '${unit.fuel.price}' in the site's prices.` });
    }
  }
  const ports = new Map<string, PortModel>();
  const perSlot = new Map<string, number>();
  unit.ports.forEach((port, i) => {
    const pAt = [...at, 'ports', i];
    if (ports.has(port.name)) out.push({ path: jsonPath([...pAt, 'name']), message: `Port name '${port.name}' is used twice in unit '${unit.name}'.` });
    ports.set(port.name, port);
    out.push(...checkPort(unit.kind, port, pAt, ctx));
    const n = (perSlot.get(port.slot) ?? 0) + 1;
    perSlot.set(port.slot, n);
    const slot = spec.ports.find((s) => s.slot === port.slot);
    if (slot && slot.max !== null && n > slot.max) {
      out.push({ path: jsonPath([...pAt, 'slot']), message: `A ${unit.kind} has at most ${slot.max} '${port.slot}' port${slot.max === 1 ? '' : 's'}.` });
    }
  });
  const versions = new Map<string, { i: number; from: number; to: number }[]>();
  unit.links.forEach((link, i) => {
    const lAt = [...at, 'links', i];
    let target: LinkTarget = { kind: unit.kind, slot: null, fluid: null };
    if (link.port !== undefined) {
      const port = ports.get(link.port);
      if (!port) {
        out.push({ path: jsonPath([...lAt, 'port']), message: `Unit '${unit.name}' has no port '${link.port}'.` });
        return;
      }
      target = { kind: unit.kind, slot: port.slot, fluid: port.fluid?.kind ?? null };
    }
    out.push(...checkLink(target, link, lAt));
    const [from, to] = linkInterval(link);
    const key = linkKey(link);
    const list = versions.get(key) ?? [];
    for (const v of list) {
      if (from < v.to && v.from < to) {
        out.push({
          path: jsonPath([...lAt, 'validFrom']),
          message: `This ${link.quantity} link${link.port ? ` at '${link.port}'` : ''} overlaps in time with links[${v.i}]; versions of one link follow each other.`,
        });
        break;
      }
    }
    list.push({ i, from, to });
    versions.set(key, list);
  });
  return out;
}

/** Problems of a normally-idle declaration: the units it names must be other units of the site. */
export function checkNormallyIdle(unit: Pick<UnitModel, 'name' | 'normallyIdle'>, unitNames: ReadonlySet<string>, at: readonly PropertyKey[]): ModelIssue[] {
  const out: ModelIssue[] = [];
  unit.normallyIdle?.whileRunning?.forEach((n, j) => {
    if (n === unit.name) out.push({ path: jsonPath([...at, 'whileRunning', j]), message: 'A unit cannot be idle only while it runs itself; name another unit.' });
    else if (!unitNames.has(n)) out.push({ path: jsonPath([...at, 'whileRunning', j]), message: `No unit named '${n}' at this site.` });
  });
  return out;
}

export type ModelCheck = { ok: true; model: PlantModel; issues: [] } | { ok: false; issues: ModelIssue[] };

/**
 * Parses and checks a plant model file. Every problem is reported with its JSON path; the model is
 * returned only when there are none.
 */
export function checkModel(input: unknown): ModelCheck {
  const parsed = PlantModelSchema.safeParse(input, { error: humanErrorMap });
  if (!parsed.success) return { ok: false, issues: humanIssues(parsed.error, 'body') };
  const model = parsed.data;
  const issues: ModelIssue[] = [];
  if (!isTimeZone(model.site.timeZone)) {
    issues.push({ path: '$.site.timeZone', message: `'${model.site.timeZone}' is not an IANA time zone (e.g. Europe/Berlin, America/Chicago, UTC).` });
  }
  const priceNames = new Set<string>();
  model.site.prices.forEach((p, i) => {
    if (priceNames.has(p.name)) issues.push({ path: jsonPath(['site', 'prices', i, 'name']), message: `Price name '${p.name}' is used twice.` });
    priceNames.add(p.name);
  });
  if (model.site.deadState.T0Tag && !canConvert(model.site.deadState.T0Tag.unit, 'temperature')) {
    issues.push({ path: '$.site.deadState.T0Tag.unit', message: `'${model.site.deadState.T0Tag.unit}' is not a temperature unit.` });
  }
  const boilers = new Set(model.units.filter((u) => u.kind === 'boiler').map((u) => u.name));
  const names = new Set<string>();
  model.units.forEach((unit, i) => {
    if (names.has(unit.name)) issues.push({ path: jsonPath(['units', i, 'name']), message: `Unit name '${unit.name}' is used twice.` });
    names.add(unit.name);
    issues.push(...checkUnit(unit, ['units', i], { boilers, priceNames }));
  });
  const allNames = new Set(model.units.map((u) => u.name));
  model.units.forEach((unit, i) => issues.push(...checkNormallyIdle(unit, allNames, ['units', i, 'normallyIdle'])));
  issues.push(...checkTagLimits(model));
  return issues.length ? { ok: false, issues } : { ok: true, model, issues: [] };
}


export { jsonPath };
