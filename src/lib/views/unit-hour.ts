/**
 * A unit's hours as the unit hours API answers them (GET /api/v1/units/:unitId/hours and
 * /hours/:hour, src/server/services/engine-results.ts): one definition for the server and the
 * islands that show them (src/components/units). Types only. Powers in W, efficiency [-].
 */
import type { UnitHourResult } from '../engine/types';
import type { HourState } from '../hour-states';
import type { DisplayUnits } from '../units/display';

/** The unit whose hours are shown, with its site's clock and currency. */
export interface UnitInfo {
  id: string;
  name: string;
  kind: string;
  siteName: string;
  timeZone: string;
  currency: string;
  /** The site's display units and atmosphere (src/lib/units/display.ts); SI defaults when absent. */
  display?: { units: DisplayUnits; p_atm_Pa: number };
}

/** The figures of a unit hour as the engine computes them (src/lib/engine/types.ts). */
type EngineFigures = Pick<
  UnitHourResult,
  'fuel_W' | 'product_W' | 'loss_W' | 'destruction_W' | 'efficiency' | 'efficiency_U' | 'destruction_U_W' | 'closure_pct' | 'destructionCost_per_h' | 'modelVersion' | 'inputsHash'
>;

/** One unit hour without its audit trail; instants as ISO strings. */
export interface UnitHourView extends EngineFigures {
  hourStart: string;
  state: HourState;
  reasons: { code: string; message: string; tag?: string }[];
  load: number | null;
  loadUnit: string | null;
  T0_K: number | null;
  p0_Pa?: number | null;
  entropyGeneration_W_per_K?: number | null;
  computedAt: string;
}

/** One unit hour with its audit trail, rebuilt on demand. */
export interface UnitHourDetailView extends UnitHourView {
  detail: HourAudit | null;
  /** matches: the same model version and inputs hash as the stored hour. */
  rebuilt?: { matches: boolean; inputsHash: string | null; ms: number };
}

/** The audit trail of one hour as the hour API answers it (src/lib/engine/compute.ts builds it). */
export interface HourAudit {
  engine: string;
  kind: string;
  balanceKind: string | null;
  deadState: { T0_K: number; p0_Pa: number; source: string; tag?: string };
  load: { value: number | null; unit: string; label: string; tags: string[]; minLoad: number } | null;
  plan: { name: string; slot: string; direction: string; fluid: string; state: string; flow: string }[];
  inputs: { name: string; value: number | null; u: number; source: { kind: string; tag?: string; engUnit?: string; reading?: number; key?: string; what?: string; note?: string; of?: string } }[];
  ports: {
    name: string;
    direction: string;
    mDot_kg_per_s: number;
    p_Pa: number;
    T_K: number;
    h_J_per_kg: number;
    s_J_per_kgK: number;
    x: number | null;
    phase: string;
    psi_J_per_kg: number;
    eCh_J_per_kg: number | null;
    exergy_W: number;
    flags: string[];
  }[];
  terms: { label: string; role: string; exergy_W: number }[];
  balance: null | {
    fuel_W: number;
    product_W: number | null;
    loss_W: number;
    destruction_W: number;
    efficiency: number | null;
    entropyGeneration_W_per_K: number | null;
    T0Sgen_W: number | null;
    gouyStodolaResidual_W: number | null;
    massResidual_kg_per_s: number;
    massClosureShare: number | null;
    energyResidual_W: number;
    energyClosure_pct: number;
    extras: Record<string, number | null>;
    flags: string[];
  };
  balanceError: { code: string; input: string; message: string } | null;
  uncertainty: null | {
    k: number;
    method: string;
    efficiency: { u: number | null; U: number | null } | null;
    destruction_W: { u: number | null; U: number | null };
    contributors: { input: string; tag?: string; u_SI: number; share_efficiency: number | null; share_destruction: number | null }[];
    unavailable: string[];
  };
  tagHours: {
    tag: string;
    port?: string | null;
    quantity?: string;
    engUnit?: string;
    role?: string;
    uncertainty?: { mode: string; value: number };
    validMin?: number | null;
    validMax?: number | null;
    validFromMs?: number;
    validToMs?: number | null;
    hour: null | { mean: number | null; min: number | null; max: number | null; samples: number; coveredFraction: number; nonNumeric: number; outOfRange: number; flatline: boolean };
  }[];
  cost: null | { cF_per_MWh: number; basis: string; currency: string };
  notes: string[];
}
