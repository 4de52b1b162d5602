/**
 * Building blocks of the unit-kind catalogue (./kind-catalogue.ts): measurements, port slots, fluid
 * groups and the parameters several kinds share, each declared once.
 */
import { UNIT_KIND_LABELS } from '../kinds';
import type { FluidKind } from '../kinds';
import type { LinkQuantity } from './port-terms';
import type { KindSpec, MeasurementSpec, NumberParam, ParamSpec, PortRole, PortSlot } from './kind-spec';

const FLOW: readonly LinkQuantity[] = ['massFlow', 'volumeFlow', 'standardVolumeFlow'];
/** A measurement of a port (p, T, flow): required unless said, with an optional note. */
const measurement =
  (key: string, label: string, anyOf: readonly LinkQuantity[]) =>
  (need: MeasurementSpec['need'] = 'required', note?: string): MeasurementSpec => ({
    key,
    label,
    anyOf,
    need,
    ...(note ? { note } : {}),
  });
export const p = measurement('p', 'pressure', ['pressure']);
export const T = measurement('T', 'temperature', ['temperature']);
export const flow = measurement('flow', 'flow', FLOW);
export const x = (): MeasurementSpec => ({
  key: 'x',
  label: 'vapour fraction',
  anyOf: ['vapourFraction'],
  need: 'optional',
  onlyFor: ['water'],
  note: 'wet steam: p and T do not fix the state',
});
export const O2 = (need: MeasurementSpec['need']): MeasurementSpec => ({
  key: 'O2',
  label: 'O2 in the flue gas',
  anyOf: ['o2Fraction'],
  need,
  onlyFor: ['flue-gas'],
});

export function slot(
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
export function heatSlot(s: string, label: string, role: PortRole): PortSlot {
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

export const STEAM_OR_GAS: readonly FluidKind[] = ['water', 'air', 'flue-gas', 'gas-mixture', 'fuel-gas'];
export const GASES: readonly FluidKind[] = ['air', 'flue-gas', 'gas-mixture', 'fuel-gas'];
export const LIQUIDS: readonly FluidKind[] = ['water', 'liquid'];
export const ANY_STREAM: readonly FluidKind[] = ['water', 'air', 'flue-gas', 'fuel-gas', 'gas-mixture', 'liquid'];

const COMMON_PRACTICE = 'common practice (Help: the method in short, the state of an hour)';

/** Steady-state test parameters every kind has (docs/domain.md section 6, common practice). */
export function steadyParams(massBalance: boolean): ParamSpec[] {
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

export const minLoadPower = (label = 'Minimum load (power)'): NumberParam => ({
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
export const minLoadFlow = (label = 'Minimum load (mass flow)'): NumberParam => ({
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
export const ratedPower = (): NumberParam => ({
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

export function machine(kind: 'compressor' | 'pump' | 'fan', fluids: readonly FluidKind[]): KindSpec {
  return {
    kind,
    label: UNIT_KIND_LABELS[kind],
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
