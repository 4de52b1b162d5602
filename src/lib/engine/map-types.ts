/**
 * The shapes of a unit mapped to the equipment library for one hour (./map.ts builds them, the
 * per-kind mappers of ./map-kinds.ts and the port planners of ./map-plan.ts and ./map-port.ts fill
 * them). Kept apart so those modules import these types without importing each other in a loop.
 */
import type { UnitModel } from '../equipment';
import type { BalanceKind } from '../kinds';
import type { LinkQuantity } from '../plant/kinds';
import type { EngineLink, EngineReason } from './types';

/** Where a vector entry comes from. */
export type InputSource =
  | { kind: 'tag'; tag: string; linkId: string; quantity: LinkQuantity; engUnit: string; reading: number; note?: string }
  | { kind: 'parameter'; key: string }
  | { kind: 'site'; what: string }
  | { kind: 'copy'; of: string; note: string };

/** One entry of the input vector: SI value, standard uncertainty in SI, and its source. */
export interface InputEntry {
  name: string;
  value: number;
  u: number;
  source: InputSource;
}

/** How a port's state and flow were decided, for the audit trail. */
export interface PortPlan {
  name: string;
  slot: string;
  direction: 'in' | 'out';
  fluid: string;
  state: string;
  flow: string;
}

/** The unit mapped to the equipment library for one hour. */
export interface MappedUnit {
  balanceKind: BalanceKind;
  model: UnitModel;
  /** entries by name (the vector order is inputNames(balanceKind, model)) */
  entries: Map<string, InputEntry>;
  ports: PortPlan[];
  /** the load measure: value in SI (NaN when a reading is missing), its unit and tags */
  load: { value: number; unit: 'W' | 'kg/s'; label: string; tags: string[] };
  /** the minimum load in the load's unit */
  minLoad: number;
  /** links whose data decide the hour's state (the unit's own) */
  keyLinks: EngineLink[];
  /** problems that stop the balance (missing links, a unit that does not convert ...) */
  problems: EngineReason[];
  notes: string[];
  /** the kind balances mass, and no flow of the group closes it by construction */
  massCheck: { groups: string[] } | null;
  /** the entries whose sum is the load (./hour-plan.ts) */
  loadNames: string[];
  /** the choices this hour's readings made (./hour-plan.ts): a port's state from the energy balance or from p and T */
  decisions: WetDecision[];
}


/**
 * A choice of the port planner that this hour's readings make: a port that may take its state from the
 * energy balance does so when its temperature is missing or within the saturation tolerance of Tsat(p).
 */
export interface WetDecision {
  /** the entry of the port's pressure */
  pName: string;
  /** the temperature link */
  TL: EngineLink;
  /** the port carries water (Tsat(p) is looked at) */
  water: boolean;
  /** whether the state came from the energy balance */
  fromEnergy: boolean;
}
