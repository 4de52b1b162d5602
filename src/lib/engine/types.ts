/**
 * What the hourly engine takes and gives, as plain data. Pure: the server reads the plant model and
 * the tag hours from the database and hands them over in these shapes.
 */
import type { HourState } from '../hour-states';
import type { EnergyPrice, Fluid as PlantFluid, FuelDefinition } from '../plant/model';
import type { LinkQuantity, ParamValue, UnitKind as PlantKind } from '../plant/kinds';
import type { LinkVersionFigures } from '../plant/link-version';
import type { UnitHourRow } from './compute';

/** A unit of the plant model (src/lib/plant), parameters in SI keyed as in the catalogue. */
export interface EngineUnit {
  id: string;
  name: string;
  kind: PlantKind;
  parameters: Readonly<Record<string, ParamValue>>;
  /** boilers: the fuel definition */
  fuel: FuelDefinition | null;
  ports: readonly EnginePort[];
}

export interface EnginePort {
  name: string;
  /** the kind's port slot ('inlet', 'exhaust' ...) */
  slot: string;
  fluid: PlantFluid | null;
  /** heat ports: fixed boundary temperature [K] */
  boundaryT_K: number | null;
  /** control volumes: 'fuel' | 'product' | 'loss' */
  account: string | null;
}

/** A tag link version (src/lib/plant/link-version.ts, instants in ms). */
export interface EngineLink extends LinkVersionFigures {
  id: string;
  validFromMs: number;
  /** null while current */
  validToMs: number | null;
  /** The tag's own limits in the steady-state test (the model file's tags[]); left out: the unit's parameters. */
  spreadLimit?: number;
  minCoverage?: number;
}

/** A tag's statistics for one hour, in the tag's engineering unit (src/server/db/ingest-schema.ts). */
export interface TagHour {
  mean: number | null;
  min: number | null;
  max: number | null;
  std: number | null;
  samples: number;
  coveredFraction: number;
  nonNumeric: number;
  outOfRange: number;
  flatline: boolean;
}

/** What of the site the engine needs. */
export interface EngineSite {
  /** atmospheric pressure for gauge readings [Pa] */
  p_atm_Pa: number;
  /** dead state: fixed, or the fallback when the ambient tag has no value [K], [Pa] */
  T0_K: number;
  p0_Pa: number;
  /** ambient-temperature tag for an hourly T0 */
  t0Tag: { name: string; engUnit: string } | null;
  currency: string;
  prices: readonly EnergyPrice[];
}

/** For a flue-gas port outside a boiler: the boiler it comes from (fuel and O2 link). */
export interface FlueGasSource {
  fuel: FuelDefinition | null;
  o2Link: EngineLink | null;
}

/** The unit cost of a unit's fuel exergy for one hour, and where it comes from. */
export interface CostBasis {
  /** [currency/J] */
  cF_per_J: number;
  /** in words, for the audit trail */
  basis: string;
}

/** Everything one unit hour needs. */
export interface UnitHourInput {
  unit: EngineUnit;
  /** the unit's link versions holding at the hour's start */
  links: readonly EngineLink[];
  /** tag hours of the hour by tag name (the unit's tags, the ambient tag, flue-gas source O2 tags) */
  tagHours: ReadonlyMap<string, TagHour>;
  site: EngineSite;
  hourStartMs: number;
  /** null: no price to cost the destruction with */
  cost: CostBasis | null;
  /** flue-gas ports outside a boiler, by the boiler's name */
  flueGasSources?: Readonly<Record<string, FlueGasSource>>;
}

export type EngineHourState = HourState;

/** A reason for an hour's state, most severe first when listed. */
export interface EngineReason {
  code: string;
  message: string;
  tag?: string;
}

/**
 * One unit hour as the engine computes it (the unit_hours row, src/server/db/results-schema.ts): the
 * public fields of the engine's row class (UnitHourRow, compute.ts), where they are declared once,
 * with `detail` (the audit trail, a getter there) as a plain field.
 */
export type UnitHourResult = { -readonly [K in keyof UnitHourRow]: UnitHourRow[K] };
