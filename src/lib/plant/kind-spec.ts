/**
 * The shape of a unit kind's catalogue entry: its port slots, the measurements each slot and the
 * unit expect, and its parameters with SI units and defaults (entries in ./kind-catalogue.ts).
 */
import type { UnitKind } from '../kinds';
import type { Quantity } from '../units/quantities';
import type { FluidKind } from '../kinds';
import type { LinkQuantity } from './port-terms';

/** A measurement a kind expects: satisfied by a current link with any one of `anyOf`. */
export interface MeasurementSpec {
  /** Stable key within its port slot or unit ('p', 'T', 'flow', 'O2', 'W' ...). */
  readonly key: string;
  readonly label: string;
  readonly anyOf: readonly LinkQuantity[];
  readonly need: 'required' | 'optional';
  /** Only asked for when the port's fluid is one of these. */
  readonly onlyFor?: readonly FluidKind[];
  readonly note?: string;
}

export type PortRole = 'in' | 'out';
/** A port carries matter (a stream with a fluid) or heat (a heat flow across a boundary at Tb). */
export type PortStream = 'matter' | 'heat';

/** A kind of port of a unit kind, with how many a unit may have. */
export interface PortSlot {
  readonly slot: string;
  readonly label: string;
  readonly role: PortRole;
  readonly stream: PortStream;
  readonly min: number;
  /** null: any number. */
  readonly max: number | null;
  /** Fluids this slot accepts (empty for heat ports). */
  readonly fluids: readonly FluidKind[];
  readonly measurements: readonly MeasurementSpec[];
  readonly note?: string;
}

interface ParamBase {
  readonly key: string;
  readonly label: string;
  readonly note?: string;
  /** Where a default comes from: a published source, or 'common practice' (docs/domain.md section 6). */
  readonly source?: string;
}
/** A numeric parameter, stored in SI (the key carries the unit suffix, or none for ratios [-]). */
export interface NumberParam extends ParamBase {
  readonly type: 'number';
  /** Quantity of src/lib/units the value converts as (its SI unit is the stored unit). */
  readonly quantity: Quantity;
  /** Unit the screens show it in. */
  readonly displayUnit: string;
  /** Default in SI; absent: no default. */
  readonly default?: number;
  /** True: the unit cannot compute without it (and there is no default). */
  readonly required: boolean;
  readonly min?: number;
  readonly max?: number;
}
export interface ChoiceParam extends ParamBase {
  readonly type: 'choice';
  readonly choices: readonly string[];
  readonly default: string;
}
export type ParamSpec = NumberParam | ChoiceParam;
export type ParamValue = number | string;

/** Everything Lossline knows about one kind of unit. */
export interface KindSpec {
  readonly kind: UnitKind;
  readonly label: string;
  /** Fuel, product and notes of the SPECO split (docs/domain.md section 3). */
  readonly fuel: string;
  readonly product: string;
  readonly ports: readonly PortSlot[];
  readonly unitMeasurements: readonly MeasurementSpec[];
  readonly params: readonly ParamSpec[];
  /** The unit needs a fuel definition (boiler). */
  readonly needsFuel: boolean;
  /** At least this many ports in all (a control volume needs one). */
  readonly minPorts: number;
  /** The kind has a mass balance (the tolerance parameter applies). */
  readonly massBalance: boolean;
}
