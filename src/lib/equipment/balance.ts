/**
 * Shared machinery of the unit balances: ports as given to a balance, resolution of flows and states
 * that come from the mass or energy balance (./resolve.ts), and assembly of the SPECO result (fuel, product, loss,
 * destruction) through the property core's `controlVolumeBalance`, which supplies the destruction from
 * the exergy balance and, independently, the entropy generation from the entropy balance.
 *
 * Sign conventions as in docs/domain.md s.2: heat into the volume and work out of it positive.
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO fuel/product definitions).
 */
import type { BalanceKind } from '../kinds';
import { controlVolumeBalance, type BalanceStream } from '../thermo';
import type { Environment, PortState } from './fluids';

export { resolvePorts, stateOfPort, type Resolution, type ResolveOptions } from './resolve';
export type { BalancePort, PortFlowInput, PortStateInput, ResolvedPort } from './ports';
import type { BalancePort, ResolvedPort } from './ports';

/** Role of a balance term in the SPECO split. */
export type TermRole = 'fuel' | 'product' | 'loss';

/**
 * One term of the fuel/product/loss split: `exergy_W` is its contribution to the total of its role
 * [W] (F = sum of fuel terms, P = sum of product terms, L = sum of loss terms); a term may be negative
 * (an outlet stream's exergy subtracted from the fuel, an inlet's from the product).
 */
export interface UnitTerm {
  label: string;
  role: TermRole;
  exergy_W: number;
}

/** Result of one unit balance. SI: W, W/K, kg/s; ratios [-]. */
export interface UnitBalance {
  kind: BalanceKind;
  /** fuel exergy F [W] */
  fuel_W: number;
  /** product exergy P [W]; null for dissipative units (valve, condenser) */
  product_W: number | null;
  /** exergy loss L [W] (stack gas, cooling water, vents) */
  loss_W: number;
  /** exergy destruction D [W] from the exergy balance; F = P + L + D */
  destruction_W: number;
  /** exergy efficiency P / F [-]; null when there is no product or F <= 0 */
  efficiency: number | null;
  /** entropy generation from the entropy balance [W/K], independent of D */
  entropyGeneration_W_per_K: number;
  /** D - T0 Sgen [W]: zero (Gouy-Stodola) when mass and energy close; non-zero flags suspect data */
  gouyStodolaResidual_W: number;
  /** sum in - sum out of mass [kg/s] */
  massResidual_kg_per_s: number;
  /** first-law residual: Q - W + sum_in m e - sum_out m e [W] (unmeasured heat loss, bad data) */
  energyResidual_W: number;
  /** energyResidual_W in percent of the energy throughput (see assemble) [%] */
  energyClosure_pct: number;
  /** the fuel/product/loss terms */
  terms: UnitTerm[];
  /** companions: isentropicEfficiency, energyEfficiency, expansionEfficiency of wet outlets, ... [-] or SI */
  extras: Record<string, number>;
  /** conditions the caller should look at: near-saturation:<port>, below-dead-state:<port>, ... */
  flags: string[];
  /** resolved ports: flow [kg/s] and state, including flows and states from the mass or energy balance */
  ports: Record<string, { direction: 'in' | 'out'; mDot_kg_per_s: number; state: PortState }>;
}

/** A power flow of the balance: out of the volume positive [W]. */
export interface PowerFlow {
  label: string;
  power_W: number;
}

/** A heat flow of the balance: into the volume positive [W], at boundary temperature Tb [K]. */
export interface HeatFlow {
  label: string;
  Q_W: number;
  Tb_K: number;
}

export interface AssembleInput {
  kind: BalanceKind;
  env: Environment;
  ports: ResolvedPort[];
  /** use physical + chemical exergy of streams (reacting units); else physical only */
  chemical: boolean;
  powers: PowerFlow[];
  heats: HeatFlow[];
  terms: UnitTerm[];
  /** false for dissipative units: product_W is null */
  hasProduct: boolean;
  /** energy throughput beyond the streams' h - h0 and power/heat in (fuel LHV) [W] */
  extraThroughput_W?: number;
  extras?: Record<string, number>;
  flags?: string[];
  /** the uncertainty sweep: F, P, L, D and efficiency only (no port records; flags as given) */
  lean?: boolean;
}

/** Exergy per kg carried by a resolved stream in a balance [J/kg]. */
export function streamExergy(p: ResolvedPort, chemical: boolean): number {
  return chemical ? p.state.psi + (p.state.eCh ?? 0) : p.state.psi;
}

/**
 * Runs `controlVolumeBalance` on the resolved ports, powers and heats, sums the role terms, and
 * builds the result. D is the balance's destruction; F - P - L equals it whenever every signed term
 * of the balance is given to exactly one role (the kinds here do so).
 *
 * Energy throughput (denominator of energyClosure_pct): sum over inlets of mDot max(0, h - h0), plus
 * power and heat into the volume, plus extraThroughput_W (fuel mDot LHV for a boiler).
 */
export function assemble(a: AssembleInput): UnitBalance {
  const T0 = a.env.T0_K;
  const np = a.ports.length;
  const streams: BalanceStream[] = new Array(np);
  for (let i = 0; i < np; i++) {
    const p = a.ports[i];
    streams[i] = {
      mDot_kg_per_s: p.mDot,
      h_J_per_kg: p.state.h,
      s_J_per_kgK: p.state.s,
      psi_J_per_kg: streamExergy(p, a.chemical),
      direction: p.direction,
      label: p.name,
      velocity_m_per_s: p.state.velocity_m_per_s,
      elevation_m: p.state.elevation_m,
    };
  }
  const cv = controlVolumeBalance({ T0_K: T0, streams, heat: a.heats, power_W: a.powers });
  let F = 0;
  let P = 0;
  let L = 0;
  for (const t of a.terms) {
    if (t.role === 'fuel') F += t.exergy_W;
    else if (t.role === 'product') P += t.exergy_W;
    else L += t.exergy_W;
  }
  let throughput = a.extraThroughput_W ?? 0;
  for (const p of a.ports) if (p.direction === 'in') throughput += p.mDot * Math.max(0, p.state.h - p.state.h0);
  for (const w of a.powers) if (w.power_W < 0) throughput -= w.power_W;
  for (const q of a.heats) if (q.Q_W > 0) throughput += q.Q_W;
  const flags = a.flags ?? [];
  const ports: UnitBalance['ports'] = {};
  if (!a.lean) {
    for (const p of a.ports) {
      ports[p.name] = { direction: p.direction, mDot_kg_per_s: p.mDot, state: p.state };
      for (const f of p.state.flags) flags.push(`${f}:${p.name}`);
    }
  }
  const D = cv.exergyDestroyed_W;
  if (D < -1e-9 * Math.max(Math.abs(F), 1)) flags.push('negative-destruction');
  return {
    kind: a.kind,
    fuel_W: F,
    product_W: a.hasProduct ? P : null,
    loss_W: L,
    destruction_W: D,
    efficiency: a.hasProduct && F > 0 ? P / F : null,
    entropyGeneration_W_per_K: cv.entropyGeneration_W_per_K,
    gouyStodolaResidual_W: cv.gouyStodolaGap_W,
    massResidual_kg_per_s: cv.massResidual_kg_per_s,
    energyResidual_W: cv.energyResidual_W,
    energyClosure_pct: throughput > 0 ? (100 * cv.energyResidual_W) / throughput : 0,
    terms: a.terms,
    extras: a.extras ?? {},
    flags,
    ports,
  };
}

/** Signed exergy of a resolved stream as seen by the volume: into it positive [W]. */
export function exergyInto(p: ResolvedPort, chemical: boolean): number {
  return (p.direction === 'in' ? 1 : -1) * p.mDot * streamExergy(p, chemical);
}
