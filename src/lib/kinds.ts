/**
 * The one list of kind names: the unit kinds of the plant model (what a model file and the database
 * store for a unit) and the balance kinds of the equipment library (which exergy balance runs), with
 * the one table that relates them; and the same pair for fluids: the fluid kinds a port of the plant
 * model carries and the fluid kinds the equipment library prepares. Every other module takes the
 * names from here.
 *
 * The two lists differ by design, not by accident: a balance is a computation that several kinds of
 * equipment share, and the equipment library keeps a few names of its own (an expander is a turbine,
 * a deaerator a mixer ...). The names themselves are stored (model files, the database, the reference
 * fixture of the balances and the hour's audit trail the API answers with), so they stay as they are;
 * where a unit kind runs a balance of another name, BALANCE_KINDS_OF_UNIT_KIND says so.
 */
import { isOneOf } from './one-of';

/** Kinds of unit of the plant model, in the order of docs/domain.md section 3 (stored names). */
export const UNIT_KINDS = [
  'turbine',
  'compressor',
  'pump',
  'fan',
  'heat-exchanger',
  'boiler',
  'let-down-valve',
  'mixer',
  'condenser',
  'motor-generator',
  'control-volume',
] as const;
export type UnitKind = (typeof UNIT_KINDS)[number];

export function isUnitKind(k: unknown): k is UnitKind {
  return isOneOf(UNIT_KINDS, k);
}

/** What a unit kind is called on the screens (the catalogue's label, the words catalogue's word). */
export const UNIT_KIND_LABELS: Readonly<Record<UnitKind, string>> = {
  turbine: 'Turbine / expander',
  compressor: 'Compressor',
  pump: 'Pump',
  fan: 'Fan',
  'heat-exchanger': 'Heat exchanger',
  boiler: 'Boiler / steam generator',
  'let-down-valve': 'Let-down valve',
  mixer: 'Mixer / deaerator',
  condenser: 'Condenser / cooler',
  'motor-generator': 'Motor / generator',
  'control-volume': 'Generic control volume',
};

/** A stored unit kind's label; the stored text itself when it is no kind of the list (an old or foreign name). */
export function unitKindLabel(kind: string): string {
  return isUnitKind(kind) ? UNIT_KIND_LABELS[kind] : kind;
}

/** Kinds of exergy balance of the equipment library (src/lib/equipment): one balance function per family. */
export const BALANCE_KINDS = [
  'turbine',
  'expander',
  'compressor',
  'pump',
  'fan',
  'heat-exchanger',
  'boiler',
  'valve',
  'mixer',
  'deaerator',
  'open-feedwater-heater',
  'condenser',
  'cooler',
  'motor',
  'generator',
  'generic',
] as const;
export type BalanceKind = (typeof BALANCE_KINDS)[number];

export function isBalanceKind(k: unknown): k is BalanceKind {
  return isOneOf(BALANCE_KINDS, k);
}

/**
 * The families of balance kinds: the kinds of one family run the same balance function and differ
 * only in their labels and defaults (an expander is balanced as a turbine, a pump as a compressor).
 */
export const BALANCE_FAMILIES = {
  turbine: ['turbine', 'expander'],
  compressor: ['compressor', 'pump', 'fan'],
  'heat-exchanger': ['heat-exchanger'],
  boiler: ['boiler'],
  valve: ['valve'],
  mixer: ['mixer', 'deaerator', 'open-feedwater-heater'],
  condenser: ['condenser', 'cooler'],
  machine: ['motor', 'generator'],
  generic: ['generic'],
} as const satisfies Record<string, readonly BalanceKind[]>;
export type BalanceFamily = keyof typeof BALANCE_FAMILIES;
/** The balance kinds of one family ('turbine' | 'expander' for the turbine family). */
export type BalanceFamilyKind<F extends BalanceFamily> = (typeof BALANCE_FAMILIES)[F][number];

/** The family of a balance kind. */
export function balanceFamilyOf(kind: BalanceKind): BalanceFamily {
  for (const f of Object.keys(BALANCE_FAMILIES) as BalanceFamily[]) {
    if ((BALANCE_FAMILIES[f] as readonly BalanceKind[]).includes(kind)) return f;
  }
  throw new Error(`Balance kind '${String(kind)}' has no family. Kinds: ${BALANCE_KINDS.join(', ')}.`);
}

/**
 * The balance kinds a plant unit kind runs (src/lib/engine/map-kinds.ts picks one per unit). Where
 * the names differ it is by design: a let-down valve runs the valve balance, a control volume the
 * generic one, and a motor-generator the motor or the generator balance by its parameter `mode`.
 */
export const BALANCE_KINDS_OF_UNIT_KIND = {
  turbine: ['turbine'],
  compressor: ['compressor'],
  pump: ['pump'],
  fan: ['fan'],
  'heat-exchanger': ['heat-exchanger'],
  boiler: ['boiler'],
  'let-down-valve': ['valve'],
  mixer: ['mixer'],
  condenser: ['condenser'],
  'motor-generator': ['motor', 'generator'],
  'control-volume': ['generic'],
} as const satisfies Record<UnitKind, readonly BalanceKind[]>;

/** The balance kinds a unit of this kind may run, by the table above. */
export function balanceKindsOf<K extends UnitKind>(kind: K): (typeof BALANCE_KINDS_OF_UNIT_KIND)[K] {
  return BALANCE_KINDS_OF_UNIT_KIND[kind];
}

/**
 * What a port of the plant model carries (stored names: the model file's `fluid.kind` and the
 * database keep them; src/lib/plant/model-schema.ts accepts exactly these):
 * water (water and steam, IAPWS-IF97), air (dry air), flue-gas (composition from a boiler's fuel and
 * the measured O2), fuel (the unit's own fuel definition), fuel-gas (a combustible gas by mole
 * fractions), gas-mixture (any ideal-gas mixture by mole fractions), liquid (incompressible, cp and density).
 */
export const FLUID_KINDS = ['water', 'air', 'flue-gas', 'fuel', 'fuel-gas', 'gas-mixture', 'liquid'] as const;
export type FluidKind = (typeof FLUID_KINDS)[number];

export function isFluidKind(k: unknown): k is FluidKind {
  return isOneOf(FLUID_KINDS, k);
}

/** What a fluid kind is called on the screens, in the help and in the words catalogue. */
export const FLUID_LABELS: Readonly<Record<FluidKind, string>> = {
  water: 'water / steam',
  air: 'air',
  'flue-gas': 'flue gas',
  fuel: "the unit's fuel",
  'fuel-gas': 'fuel gas (composition)',
  'gas-mixture': 'gas mixture (composition)',
  liquid: 'incompressible liquid',
};

/** The short word of a fluid kind in the engine's port plans of an hour ("how each port was known"). */
export const FLUID_SHORT_LABELS: Readonly<Record<FluidKind, string>> = {
  water: 'water / steam',
  air: 'air',
  'flue-gas': 'flue gas',
  fuel: 'fuel',
  'fuel-gas': 'fuel gas',
  'gas-mixture': 'gas mixture',
  liquid: 'liquid',
};

/**
 * Kinds of fluid the equipment library prepares (`FluidSpec.kind` of src/lib/equipment/fluids):
 * plain data for the property core. They differ from the plant's by design: 'gas' is any ideal-gas
 * mixture by mole or mass fractions (the plant's gas-mixture), and 'fuel' carries the fuel itself
 * (the plant's fuel names the unit's fuel definition). FLUID_SPEC_KINDS_OF_FLUID_KIND relates them.
 */
export const FLUID_SPEC_KINDS = ['water', 'gas', 'air', 'fuel-gas', 'fuel', 'flue-gas', 'liquid'] as const;
export type FluidSpecKind = (typeof FLUID_SPEC_KINDS)[number];

/**
 * The equipment fluid kinds a plant fluid kind is prepared as (src/lib/engine/map-port.ts): a unit's
 * fuel defined by composition is a fuel gas, by heating value or ultimate analysis a fuel.
 */
export const FLUID_SPEC_KINDS_OF_FLUID_KIND = {
  water: ['water'],
  air: ['air'],
  'flue-gas': ['flue-gas'],
  fuel: ['fuel-gas', 'fuel'],
  'fuel-gas': ['fuel-gas'],
  'gas-mixture': ['gas'],
  liquid: ['liquid'],
} as const satisfies Record<FluidKind, readonly FluidSpecKind[]>;

/** The families a prepared equipment fluid belongs to (`Fluid.family`): how its state is computed. */
export const FLUID_FAMILIES = ['water', 'gas', 'liquid', 'condensed-fuel', 'flue-gas'] as const;
export type FluidFamily = (typeof FLUID_FAMILIES)[number];
