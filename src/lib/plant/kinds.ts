/**
 * The catalogue of unit kinds: for each kind of equipment, its ports, the measurements it needs
 * (required or optional, at a port or of the unit) and its parameters with SI units and defaults.
 *
 * Pure data plus lookups. The admin screens, the completeness check (./status.ts), the model file
 * (./model.ts) and the hourly engine all read this one table, so a kind is declared once.
 *
 * Fuel, product and loss per kind follow the SPECO convention (docs/domain.md section 3):
 * Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 * Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289.
 */
import type { Quantity } from '../units/quantities';

/** Kinds of unit, in the order of docs/domain.md section 3. */
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
  return typeof k === 'string' && (UNIT_KINDS as readonly string[]).includes(k);
}

/**
 * What a port carries (see ./fluids.ts for the full descriptions):
 * water (water and steam, IAPWS-IF97), air (dry air), flue-gas (composition from a boiler's fuel and
 * the measured O2), fuel (the unit's own fuel definition), fuel-gas (a combustible gas by mole
 * fractions), gas-mixture (any ideal-gas mixture by mole fractions), liquid (incompressible, cp and density).
 */
export const FLUID_KINDS = ['water', 'air', 'flue-gas', 'fuel', 'fuel-gas', 'gas-mixture', 'liquid'] as const;
export type FluidKind = (typeof FLUID_KINDS)[number];

export const FLUID_LABELS: Record<FluidKind, string> = {
  water: 'water / steam',
  air: 'air',
  'flue-gas': 'flue gas',
  fuel: "the unit's fuel",
  'fuel-gas': 'fuel gas (composition)',
  'gas-mixture': 'gas mixture (composition)',
  liquid: 'incompressible liquid',
};

/**
 * What a tag link can measure, each with the engineering-unit quantity its unit must belong to
 * (src/lib/units). O2 needs a dry/wet basis; power at a unit is split into in and out where a kind
 * has both (motor-generator, control volume).
 */
export const LINK_QUANTITIES = {
  pressure: { quantity: 'pressure', label: 'pressure' },
  temperature: { quantity: 'temperature', label: 'temperature' },
  massFlow: { quantity: 'massFlow', label: 'mass flow' },
  volumeFlow: { quantity: 'volumeFlow', label: 'volume flow (actual)' },
  standardVolumeFlow: { quantity: 'standardVolumeFlow', label: 'volume flow at reference conditions' },
  o2Fraction: { quantity: 'fraction', label: 'O2 fraction', needsBasis: true },
  vapourFraction: { quantity: 'fraction', label: 'vapour fraction' },
  heatFlow: { quantity: 'heatFlow', label: 'heat flow' },
  power: { quantity: 'power', label: 'power' },
  powerIn: { quantity: 'power', label: 'power in' },
  powerOut: { quantity: 'power', label: 'power out' },
} as const satisfies Record<string, { quantity: Quantity; label: string; needsBasis?: boolean }>;
export type LinkQuantity = keyof typeof LINK_QUANTITIES;
export const LINK_QUANTITY_NAMES = Object.keys(LINK_QUANTITIES) as LinkQuantity[];

export function isLinkQuantity(q: unknown): q is LinkQuantity {
  return typeof q === 'string' && Object.prototype.hasOwnProperty.call(LINK_QUANTITIES, q);
}

/** The engineering-unit quantity (src/lib/units) a link quantity is converted as. */
export function unitsQuantityOf(q: LinkQuantity): Quantity {
  return LINK_QUANTITIES[q].quantity;
}

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

// ---- building blocks -------------------------------------------------------------------------

const FLOW: readonly LinkQuantity[] = ['massFlow', 'volumeFlow', 'standardVolumeFlow'];
const p = (need: MeasurementSpec['need'] = 'required', note?: string): MeasurementSpec => ({
  key: 'p',
  label: 'pressure',
  anyOf: ['pressure'],
  need,
  ...(note ? { note } : {}),
});
const T = (need: MeasurementSpec['need'] = 'required', note?: string): MeasurementSpec => ({
  key: 'T',
  label: 'temperature',
  anyOf: ['temperature'],
  need,
  ...(note ? { note } : {}),
});
const flow = (need: MeasurementSpec['need'] = 'required', note?: string): MeasurementSpec => ({
  key: 'flow',
  label: 'flow',
  anyOf: FLOW,
  need,
  ...(note ? { note } : {}),
});
const x = (): MeasurementSpec => ({
  key: 'x',
  label: 'vapour fraction',
  anyOf: ['vapourFraction'],
  need: 'optional',
  onlyFor: ['water'],
  note: 'wet steam: p and T do not fix the state',
});
const O2 = (need: MeasurementSpec['need']): MeasurementSpec => ({
  key: 'O2',
  label: 'O2 in the flue gas',
  anyOf: ['o2Fraction'],
  need,
  onlyFor: ['flue-gas'],
});

function slot(
  s: string,
  label: string,
  role: PortRole,
  min: number,
  max: number | null,
  fluids: readonly FluidKind[],
  measurements: readonly MeasurementSpec[],
  note?: string,
): PortSlot {
  return { slot: s, label, role, stream: 'matter', min, max, fluids, measurements, ...(note ? { note } : {}) };
}
function heatSlot(s: string, label: string, role: PortRole): PortSlot {
  return {
    slot: s,
    label,
    role,
    stream: 'heat',
    min: 0,
    max: null,
    fluids: [],
    measurements: [
      { key: 'Q', label: 'heat flow', anyOf: ['heatFlow'], need: 'required' },
      T('optional', 'boundary temperature; or give the port a fixed boundary temperature'),
    ],
  };
}

const STEAM_OR_GAS: readonly FluidKind[] = ['water', 'air', 'flue-gas', 'gas-mixture', 'fuel-gas'];
const GASES: readonly FluidKind[] = ['air', 'flue-gas', 'gas-mixture', 'fuel-gas'];
const LIQUIDS: readonly FluidKind[] = ['water', 'liquid'];
const ANY_STREAM: readonly FluidKind[] = ['water', 'air', 'flue-gas', 'fuel-gas', 'gas-mixture', 'liquid'];

const COMMON_PRACTICE = 'common practice (Help: the method in short, the state of an hour)';

/** Steady-state test parameters every kind has (docs/domain.md section 6, common practice). */
function steadyParams(massBalance: boolean): ParamSpec[] {
  const out: ParamSpec[] = [
    {
      key: 'spreadLimit',
      label: 'Spread limit of key tags within the hour',
      type: 'number',
      quantity: 'fraction',
      displayUnit: '%',
      default: 0.05,
      required: false,
      min: 0,
      max: 1,
      source: COMMON_PRACTICE,
      note: '(max - min) / |mean| of each key tag; above it the hour is unsettled',
    },
    {
      key: 'minCoverage',
      label: 'Minimum share of the hour covered by samples',
      type: 'number',
      quantity: 'fraction',
      displayUnit: '%',
      default: 0.75,
      required: false,
      min: 0,
      max: 1,
      source: COMMON_PRACTICE,
    },
  ];
  if (massBalance) {
    out.push({
      key: 'massBalanceTolerance',
      label: 'Mass balance tolerance',
      type: 'number',
      quantity: 'fraction',
      displayUnit: '%',
      default: 0.03,
      required: false,
      min: 0,
      max: 1,
      source: COMMON_PRACTICE,
      note: '|in - out| / in; above it the hour is suspect',
    });
  }
  return out;
}

const minLoadPower = (label = 'Minimum load (power)'): NumberParam => ({
  key: 'minLoad_W',
  label,
  type: 'number',
  quantity: 'power',
  displayUnit: 'kW',
  default: 0,
  required: false,
  min: 0,
  note: 'below it the hour is idle',
});
const minLoadFlow = (label = 'Minimum load (mass flow)'): NumberParam => ({
  key: 'minLoad_kg_per_s',
  label,
  type: 'number',
  quantity: 'massFlow',
  displayUnit: 't/h',
  default: 0,
  required: false,
  min: 0,
  note: 'below it the hour is idle',
});
const ratedPower = (): NumberParam => ({
  key: 'ratedPower_W',
  label: 'Rated power',
  type: 'number',
  quantity: 'power',
  displayUnit: 'kW',
  required: false,
  min: 0,
  note: 'for reports; not needed to compute',
});
const driveParams = (): ParamSpec[] => [
  {
    key: 'powerBasis',
    label: 'Power measured at',
    type: 'choice',
    choices: ['electric', 'shaft'],
    default: 'electric',
    note: 'electric: the drive efficiency turns it into shaft power',
  },
  {
    key: 'driveEfficiency',
    label: 'Drive (motor) efficiency',
    type: 'number',
    quantity: 'fraction',
    displayUnit: '%',
    default: 0.95,
    required: false,
    min: 0.01,
    max: 1,
    source: 'common practice',
    note: 'used when power is measured as electric input',
  },
];

function machine(kind: 'compressor' | 'pump' | 'fan', label: string, fluids: readonly FluidKind[]): KindSpec {
  return {
    kind,
    label,
    fuel: 'power W',
    product: 'mDot (psi_out - psi_in)',
    ports: [
      slot('inlet', 'Inlet', 'in', 1, 1, fluids, [p(), T(), flow()]),
      slot('outlet', 'Outlet', 'out', 1, 1, fluids, [p(), T(), flow('optional', 'by mass balance: equals the inlet flow')]),
    ],
    unitMeasurements: [{ key: 'W', label: 'power', anyOf: ['power'], need: 'required' }],
    params: [minLoadPower(), ratedPower(), ...driveParams(), ...steadyParams(true)],
    needsFuel: false,
    minPorts: 2,
    massBalance: true,
  };
}

// ---- the catalogue -----------------------------------------------------------------------------

const SPECS: Readonly<Record<UnitKind, KindSpec>> = {
  turbine: {
    kind: 'turbine',
    label: 'Turbine / expander',
    fuel: 'sum_in mDot psi - sum_out mDot psi (extractions included)',
    product: 'shaft or electric power W',
    ports: [
      slot('inlet', 'Inlet', 'in', 1, 1, STEAM_OR_GAS, [p(), T(), flow()]),
      slot('exhaust', 'Exhaust', 'out', 1, 1, STEAM_OR_GAS, [
        p(),
        T('optional', 'wet exhaust: enthalpy from the energy balance, never from p and T'),
        flow('optional', 'by mass balance: inlet minus extractions'),
        x(),
      ]),
      slot('extraction', 'Extraction', 'out', 0, null, STEAM_OR_GAS, [p(), T(), flow()]),
    ],
    unitMeasurements: [{ key: 'W', label: 'power', anyOf: ['power'], need: 'required', note: 'at the generator terminals or the shaft' }],
    params: [
      minLoadPower(),
      ratedPower(),
      {
        key: 'powerBasis',
        label: 'Power measured at',
        type: 'choice',
        choices: ['generator-terminals', 'shaft'],
        default: 'generator-terminals',
      },
      {
        key: 'generatorEfficiency',
        label: 'Generator efficiency',
        type: 'number',
        quantity: 'fraction',
        displayUnit: '%',
        default: 0.97,
        required: false,
        min: 0.5,
        max: 1,
        source: 'common practice',
        note: 'W_shaft = W_el / eta_gen',
      },
      {
        key: 'wetExhaustMethod',
        label: 'Wet exhaust enthalpy from',
        type: 'choice',
        choices: ['energy-balance', 'condenser-heat-balance'],
        default: 'energy-balance',
        note: 'energy-balance: h_out = h_in - W / (mDot eta_gen)',
      },
      ...steadyParams(true),
    ],
    needsFuel: false,
    minPorts: 2,
    massBalance: true,
  },
  compressor: machine('compressor', 'Compressor', GASES),
  pump: machine('pump', 'Pump', LIQUIDS),
  fan: machine('fan', 'Fan', GASES),
  'heat-exchanger': {
    kind: 'heat-exchanger',
    label: 'Heat exchanger',
    fuel: 'hot-side exergy decrease',
    product: 'cold-side exergy increase',
    ports: [
      slot('hotIn', 'Hot side in', 'in', 1, 1, ANY_STREAM, [p(), T(), flow(), x()]),
      slot('hotOut', 'Hot side out', 'out', 1, 1, ANY_STREAM, [p(), T(), flow('optional', 'equals the hot inlet flow'), x()]),
      slot('coldIn', 'Cold side in', 'in', 1, 1, ANY_STREAM, [p(), T(), flow(), x()]),
      slot('coldOut', 'Cold side out', 'out', 1, 1, ANY_STREAM, [p(), T(), flow('optional', 'equals the cold inlet flow'), x()]),
    ],
    unitMeasurements: [],
    params: [minLoadFlow('Minimum load (hot-side mass flow)'), ...steadyParams(true)],
    needsFuel: false,
    minPorts: 4,
    massBalance: true,
  },
  boiler: {
    kind: 'boiler',
    label: 'Boiler / steam generator',
    fuel: 'mDot_fuel e_ch,fuel (+ combustion-air exergy)',
    product: 'steam exergy out - feedwater exergy in (reheat included)',
    ports: [
      slot('feedwater', 'Feedwater', 'in', 1, 1, ['water'], [p(), T(), flow()]),
      slot('steam', 'Steam', 'out', 1, null, ['water'], [p(), T(), flow()]),
      slot('reheatIn', 'Reheat in', 'in', 0, 1, ['water'], [p(), T(), flow()]),
      slot('reheatOut', 'Reheat out', 'out', 0, 1, ['water'], [p(), T(), flow('optional', 'equals the reheat inlet flow')]),
      slot('blowdown', 'Blowdown', 'out', 0, 1, ['water'], [p('optional'), T('optional'), flow()]),
      slot('fuel', 'Fuel', 'in', 1, 1, ['fuel'], [flow(), T('optional'), p('optional')]),
      slot('air', 'Combustion air', 'in', 0, 1, ['air'], [T('optional'), p('optional')]),
      slot('flueGas', 'Flue gas (stack)', 'out', 1, 1, ['flue-gas'], [T(), O2('required'), p('optional')], 'L = stack-gas exergy'),
    ],
    unitMeasurements: [],
    params: [minLoadFlow('Minimum load (steam mass flow)'), ...steadyParams(true)],
    needsFuel: true,
    minPorts: 4,
    massBalance: true,
  },
  'let-down-valve': {
    kind: 'let-down-valve',
    label: 'Let-down valve',
    fuel: 'mDot (psi_in - psi_out)',
    product: 'none: dissipative, report D and its cost',
    ports: [
      slot('inlet', 'Inlet', 'in', 1, 1, ['water', 'air', 'gas-mixture', 'fuel-gas', 'flue-gas'], [p(), T(), flow()]),
      slot('outlet', 'Outlet', 'out', 1, 1, ['water', 'air', 'gas-mixture', 'fuel-gas', 'flue-gas'], [
        p(),
        T('optional', 'throttling keeps h: h_out = h_in'),
        flow('optional', 'equals the inlet flow'),
      ]),
    ],
    unitMeasurements: [],
    params: [minLoadFlow('Minimum load (mass flow)'), ...steadyParams(true)],
    needsFuel: false,
    minPorts: 2,
    massBalance: true,
  },
  mixer: {
    kind: 'mixer',
    label: 'Mixer / deaerator',
    fuel: 'exergy decrease of the hot streams',
    product: 'exergy increase of the cold stream',
    ports: [
      slot('inlet', 'Inlet', 'in', 2, null, ANY_STREAM, [p(), T(), flow(), x()]),
      slot('outlet', 'Outlet', 'out', 1, 1, ANY_STREAM, [p(), T(), flow('optional', 'by mass balance')]),
      slot('vent', 'Vent', 'out', 0, 1, ANY_STREAM, [p('optional'), T('optional'), flow('optional')]),
    ],
    unitMeasurements: [],
    params: [minLoadFlow('Minimum load (outlet mass flow)'), ...steadyParams(true)],
    needsFuel: false,
    minPorts: 3,
    massBalance: true,
  },
  condenser: {
    kind: 'condenser',
    label: 'Condenser / cooler',
    fuel: 'exergy decrease of the process stream',
    product: 'none: dissipative; D and L split when the coolant flow is measured',
    ports: [
      slot('processIn', 'Process in', 'in', 1, 1, ANY_STREAM, [p(), T('optional', 'wet steam: from the turbine'), flow(), x()]),
      slot('processOut', 'Process out', 'out', 1, 1, ANY_STREAM, [p(), T(), flow('optional', 'equals the process inlet flow')]),
      slot('coolantIn', 'Coolant in', 'in', 0, 1, LIQUIDS, [T(), flow('optional', 'splits D and L'), p('optional')]),
      slot('coolantOut', 'Coolant out', 'out', 0, 1, LIQUIDS, [T(), p('optional')]),
    ],
    unitMeasurements: [],
    params: [minLoadFlow('Minimum load (process mass flow)'), ...steadyParams(true)],
    needsFuel: false,
    minPorts: 2,
    massBalance: true,
  },
  'motor-generator': {
    kind: 'motor-generator',
    label: 'Motor / generator',
    fuel: 'electric or shaft power in',
    product: 'shaft or electric power out',
    ports: [],
    unitMeasurements: [
      { key: 'Win', label: 'power in', anyOf: ['powerIn'], need: 'required' },
      { key: 'Wout', label: 'power out', anyOf: ['powerOut'], need: 'required' },
    ],
    params: [
      { key: 'mode', label: 'Works as', type: 'choice', choices: ['motor', 'generator'], default: 'motor' },
      minLoadPower('Minimum load (power out)'),
      ratedPower(),
      ...steadyParams(false),
    ],
    needsFuel: false,
    minPorts: 0,
    massBalance: false,
  },
  'control-volume': {
    kind: 'control-volume',
    label: 'Generic control volume',
    fuel: 'user designates (each port: fuel, product or loss)',
    product: 'user designates',
    ports: [
      slot('inlet', 'Inlet', 'in', 0, null, ANY_STREAM, [p(), T(), flow(), x()]),
      slot('outlet', 'Outlet', 'out', 0, null, ANY_STREAM, [p(), T(), flow(), x()]),
      heatSlot('heatIn', 'Heat in', 'in'),
      heatSlot('heatOut', 'Heat out', 'out'),
    ],
    unitMeasurements: [
      { key: 'Win', label: 'power in', anyOf: ['powerIn'], need: 'optional' },
      { key: 'Wout', label: 'power out', anyOf: ['powerOut'], need: 'optional' },
    ],
    params: [
      {
        key: 'powerAccount',
        label: 'Power counts as',
        type: 'choice',
        choices: ['fuel', 'product'],
        default: 'fuel',
        note: 'power in is fuel and power out is product unless designated otherwise',
      },
      minLoadFlow('Minimum load (inlet mass flow)'),
      ...steadyParams(true),
    ],
    needsFuel: false,
    minPorts: 1,
    massBalance: true,
  },
};

/** The catalogue entry of a kind. */
export function kindSpec(kind: UnitKind): KindSpec {
  const spec = SPECS[kind];
  if (!spec) throw new Error(`Unknown unit kind '${String(kind)}'. Kinds: ${UNIT_KINDS.join(', ')}.`);
  return spec;
}

/** The port slot of a kind, or undefined. */
export function portSlot(kind: UnitKind, slotName: string): PortSlot | undefined {
  return kindSpec(kind).ports.find((s) => s.slot === slotName);
}

/** The parameter spec of a kind, or undefined. */
export function paramSpec(kind: UnitKind, key: string): ParamSpec | undefined {
  return kindSpec(kind).params.find((s) => s.key === key);
}

/** Every parameter of a kind with its default, for a new unit (parameters without a default are left out). */
export function defaultParameters(kind: UnitKind): Record<string, ParamValue> {
  const out: Record<string, ParamValue> = {};
  for (const s of kindSpec(kind).params) if (s.default !== undefined) out[s.key] = s.default;
  return out;
}

/** The measurements a port of this slot may carry, given its fluid (onlyFor filters). */
export function measurementsFor(slotSpec: PortSlot, fluid: FluidKind | null): MeasurementSpec[] {
  return slotSpec.measurements.filter((m) => !m.onlyFor || (fluid !== null && m.onlyFor.includes(fluid)));
}

/** Link quantities a port of this slot (with this fluid) may take, or the unit itself when slotSpec is null. */
export function allowedQuantities(kind: UnitKind, slotSpec: PortSlot | null, fluid: FluidKind | null): LinkQuantity[] {
  const ms = slotSpec ? measurementsFor(slotSpec, fluid) : kindSpec(kind).unitMeasurements;
  return [...new Set(ms.flatMap((m) => m.anyOf))];
}
