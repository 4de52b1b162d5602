/**
 * The terms a unit kind's ports are declared in: what a port carries (fluid kinds) and what a tag
 * link can measure (link quantities), each with its words and its quantity of src/lib/units.
 */
import type { Quantity } from '../units/quantities';

/** What a port carries: the one list of fluid kinds and their labels live in src/lib/kinds.ts. */
export { FLUID_KINDS, FLUID_LABELS, isFluidKind, type FluidKind } from '../kinds';

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

