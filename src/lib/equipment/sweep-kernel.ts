/**
 * The headline figures of a unit's balance (F, P, L, D, efficiency) as a scalar function of the input
 * vector, for the uncertainty sweep (./uncertainty.ts). The sweep moves one input at a time around the
 * hour's point; the full balance (./model.ts, ./kinds.ts) builds port objects, terms and a control-volume
 * result for every move. This kernel instead keeps the hour's port states (from the full balance at the
 * point) and recomputes only what the moved input changes:
 * - a mass flow, a power, an efficiency, a heat: no property call (exergy flow = mDot psi, only the
 *   scaling changes), except a state that comes from the energy balance (its enthalpy moves with them);
 * - a pressure or temperature (or x, h, O2) at a port: that port's state once, from its fluid.
 * Flows, terms and D are summed in the same order as the full balance, so both give the same numbers to
 * rounding. Kinds and models it does not cover (mixers, several energy-balance states, motors) return
 * null from compileKernel and the sweep uses the full balance. The kernel shares the compiled unit's
 * prepared fluids, and so their memos: a flue gas's combustion at the point's O2 is worked out once.
 * The port layout, worked out once per kernel, is in ./sweep-kernel-ports.ts.
 * @see ./balance.ts resolvePorts and assemble, ./kinds.ts (the SPECO split per kind) for the definitions
 */
import { G_m_per_s2 } from '../thermo';
import type { UnitBalance } from './balance';
import type { BalanceKind as UnitKind } from '../kinds';
import { BalanceInputError } from './errors';
import type { Environment, Fluid, PortState } from './fluids';
import { COMPRESSORS, COVERED, TURBINES, kernelPorts, roleOf, type KPort, type Role } from './sweep-kernel-ports';
import type { PortSpec, UnitModel } from './model';
import { movedWaterPH, movedWaterPT, scratchState, type Mutable } from './sweep-states';


/** A compiled kernel: set the hour's point, then evaluate moved vectors. */
export interface SweepKernel {
  /** takes the point's states from the full balance at x; false when the kernel cannot take this hour */
  setPoint(x: ArrayLike<number>, balance: UnitBalance): boolean;
  /** F, P, L, D, efficiency at x into out[o..o+4] (NaN for no product / efficiency); throws as the full balance */
  evaluate(x: ArrayLike<number>, out: Float64Array, o: number): void;
}

function inRange(name: string, v: number, lo: number, hi: number): void {
  if (!(v >= lo && v <= hi)) throw new BalanceInputError('IMPOSSIBLE_INPUT', name, `= ${v} is outside ${lo}..${hi} (uncertainty sweep)`);
}

/**
 * The kernel of (kind, model) with the vector layout `names`, or null when the kind or model is not
 * covered (the sweep then moves the full balance).
 */
export function compileKernel(kind: UnitKind, model: UnitModel, names: readonly string[], fluids?: ReadonlyMap<string, Fluid>): SweepKernel | null {
  if (!COVERED.has(kind)) return null;
  const ports = kernelPorts(kind, model, names, fluids);
  if (!ports || ports.length === 0) return null;
  let nEnergyStates = 0;
  for (const p of ports) if (p.mode === 'energy-balance') nEnergyStates++;
  if (nEnergyStates > 1) return null;
  return new Kernel(kind, model, names, ports);
}

class Kernel implements SweepKernel {
  private readonly n: number;
  private readonly flows: Float64Array;
  private readonly states: (PortState | null)[];
  private readonly iPower: number;
  private readonly iEta: number;
  private readonly electric: boolean;
  private readonly chemical: boolean;
  private readonly powers: { i: number; role: Role; out: boolean }[];
  private readonly heats: { iQ: number; iT: number; role: Role; into: boolean }[];
  private readonly flue: number;
  private readonly fuel: number;
  private readonly refuseBelowT0: boolean;
  /** the kind's family, read once (every move asks) */
  private readonly turbine: boolean;
  private readonly compressor: boolean;
  private env: Environment = { T0_K: NaN, p0_Pa: NaN };
  /** the energy-balance state of the last move, by (p, h) */
  private ebKey = [NaN, NaN];
  private ebState: PortState | null = null;

  constructor(
    private readonly kind: UnitKind,
    model: UnitModel,
    names: readonly string[],
    private readonly ports: KPort[],
  ) {
    this.n = ports.length;
    this.turbine = TURBINES.has(kind);
    this.compressor = COMPRESSORS.has(kind);
    this.flows = new Float64Array(this.n);
    this.states = new Array(this.n).fill(null);
    this.iPower = names.indexOf('power_W');
    this.iEta = names.indexOf(TURBINES.has(kind) ? 'generatorEfficiency' : 'motorEfficiency');
    this.electric = model.powerMeasured === 'electric';
    this.chemical = kind === 'boiler' || (kind === 'generic' && model.chemical === true);
    this.powers = kind === 'generic' ? (model.powers ?? []).map((w) => ({ i: names.indexOf(`${w.name}.power_W`), role: roleOf('generic', { role: w.role } as PortSpec), out: w.direction === 'out' })) : [];
    this.heats = kind === 'generic' ? (model.heats ?? []).map((q) => ({ iQ: names.indexOf(`${q.name}.Q_W`), iT: names.indexOf(`${q.name}.Tb_K`), role: roleOf('generic', { role: q.role } as PortSpec), into: q.direction === 'in' })) : [];
    this.flue = kind === 'boiler' ? ports.findIndex((p) => p.fluid.family === 'flue-gas') : -1;
    this.fuel = kind === 'boiler' ? ports.findIndex((p) => p.specRole === 'fuel' && p.flow === 'measured') : -1;
    this.refuseBelowT0 = kind === 'heat-exchanger' && (model.belowDeadState ?? 'refuse') === 'refuse';
  }

  setPoint(x: ArrayLike<number>, balance: UnitBalance): boolean {
    if (this.kind === 'boiler' && (this.flue < 0 || this.fuel < 0)) return false;
    this.env = { T0_K: x[0]!, p0_Pa: x[1]! };
    for (const p of this.ports) {
      const r = balance.ports[p.name];
      if (!r && !(this.kind === 'boiler' && p.name === 'air')) return false;
      p.p0 = p.iP >= 0 ? x[p.iP]! : NaN;
      p.v0 = p.iV >= 0 ? x[p.iV]! : p.mode === 'sat' ? p.fixedX : 0;
      p.o0 = p.iO2 >= 0 ? x[p.iO2]! : 0;
      p.st0 = p.mode === 'energy-balance' ? null : r ? r.state : p.fluid.state({ p_Pa: this.env.p0_Pa, T_K: this.env.T0_K }, this.env);
    }
    this.ebKey[0] = NaN;
    return true;
  }

  /** The state of port k at x: the point's unless one of its state inputs moved. */
  private stateAt(p: KPort, x: ArrayLike<number>): PortState | null {
    if (p.mode === 'energy-balance' || p.mode === 'ambient') return p.st0;
    const pp = x[p.iP]!;
    const v = p.iV >= 0 ? x[p.iV]! : p.mode === 'sat' ? p.fixedX : 0;
    const o = p.iO2 >= 0 ? x[p.iO2]! : 0;
    if (pp === p.p0 && v === p.v0 && o === p.o0) return p.st0;
    if (p.mode === 'pT' && p.fluid.family === 'water') return movedWaterPT((p.scratch ??= scratchState(p.V, p.z)), p.fluid, this.env, pp, v);
    const m = p.m;
    m.p_Pa = pp;
    if (p.mode === 'pT') m.T_K = v;
    else if (p.mode === 'ph') m.h_J_per_kg = v;
    else m.x = v;
    if (p.iO2 >= 0) m.O2_fraction = o;
    return p.fluid.state(m, this.env);
  }

  evaluate(x: ArrayLike<number>, out: Float64Array, o: number): void {
    const { ports, n, flows, states } = this;
    if (x[0] !== this.env.T0_K || x[1] !== this.env.p0_Pa) throw new BalanceInputError('INVALID_MODEL', 'T0_K', 'the sweep kernel keeps the dead state of its point');
    this.xs = x;
    this.heatsQ = this.heats.length ? this.heat(x) : 0;
    let unknown = -1;
    for (let k = 0; k < n; k++) {
      const st = (states[k] = this.stateAt(ports[k]!, x));
      if (st === null) unknown = k;
    }
    const W = this.work(x);
    this.fillFlows(x, W);
    if (unknown >= 0) states[unknown] = this.energyState(unknown, this.residual(W));
    if (this.refuseBelowT0) {
      for (let k = 0; k < n; k++) if (states[k]!.T < this.env.T0_K) throw new BalanceInputError('BELOW_DEAD_STATE', ports[k]!.name, 'below T0 (uncertainty sweep)');
    }
    this.split(x, W, out, o);
  }

  /** Net power out of the volume [W] (shaft for turbines, minus shaft for compressors, generic sum). */
  private work(x: ArrayLike<number>): number {
    if (this.turbine || this.compressor) {
      const P = x[this.iPower]!;
      inRange('power_W', P, -1e12, 1e12);
      let shaft = P;
      if (this.electric) {
        const eta = x[this.iEta]!;
        inRange('efficiency', eta, 1e-6, 1);
        shaft = this.turbine ? P / eta : P * eta;
      }
      return this.turbine ? shaft : -shaft;
    }
    let W = 0;
    for (const w of this.powers) {
      inRange('power_W', x[w.i]!, -1e12, 1e12);
      W += w.out ? x[w.i]! : -x[w.i]!;
    }
    return W;
  }

  private heat(x: ArrayLike<number>): number {
    let Q = 0;
    for (const q of this.heats) {
      inRange('Tb_K', x[q.iT]!, 1, 1e5);
      Q += q.into ? x[q.iQ]! : -x[q.iQ]!;
    }
    return Q;
  }

  /** Flows as resolvePorts fills them; an energy-balance flow solved from the residual (linear in it). */
  private fillFlows(x: ArrayLike<number>, W: number): void {
    const { ports, n, flows } = this;
    let eb = -1;
    for (let k = 0; k < n; k++) {
      const p = ports[k]!;
      // the entry's name only when it fails (a template string per move costs an allocation)
      if (p.flow === 'measured' && !(x[p.iM]! >= 0 && x[p.iM]! <= 1e6)) inRange(`${p.name}.mDot_kg_per_s`, x[p.iM]!, 0, 1e6);
      else if (p.flow === 'energy-balance') eb = k;
    }
    if (eb >= 0) {
      this.flowsAt(x, 0);
      const r0 = this.residual(W);
      this.flowsAt(x, 1);
      const r1 = this.residual(W) - r0;
      if (!(Math.abs(r1) > 0)) throw new BalanceInputError('UNSOLVABLE', ports[eb]!.name, 'the energy balance does not depend on this flow');
      const u = -r0 / r1;
      if (!(u >= 0)) throw new BalanceInputError('IMPOSSIBLE_INPUT', ports[eb]!.name, 'negative flow from the energy balance (uncertainty sweep)');
      this.flowsAt(x, u);
    } else this.flowsAt(x, 0);
    for (let k = 0; k < n; k++) if (!(flows[k]! >= 0 && flows[k]! <= 1e6)) throw new BalanceInputError('IMPOSSIBLE_INPUT', ports[k]!.name, 'negative flow from the mass balance (uncertainty sweep)');
  }

  private flowsAt(x: ArrayLike<number>, u: number): void {
    const { ports, n, flows } = this;
    let air = 0;
    let flue = 0;
    if (this.flue >= 0) {
      const O2 = x[ports[this.flue]!.iO2]!;
      const comb = ports[this.flue]!.fluid.withO2(O2).combustion!;
      const mf = x[ports[this.fuel]!.iM]!;
      air = mf * comb.air_kg_per_kgFuel;
      flue = mf * comb.flue_kg_per_kgFuel;
    }
    for (let k = 0; k < n; k++) {
      const p = ports[k]!;
      flows[k] = p.flow === 'measured' ? x[p.iM]! : p.flow === 'energy-balance' ? u : p.flow === 'fuel-ratio' ? (k === this.flue ? flue : air) : 0;
    }
    for (let j = 0; j < n; j++) {
      if (ports[j]!.mb !== j) continue;
      let net = 0;
      for (let i = 0; i < n; i++) if (i !== j && ports[i]!.group === ports[j]!.group) net += ports[i]!.sign === 1 ? flows[i]! : -flows[i]!;
      flows[j] = ports[j]!.sign === -1 ? net : -net;
    }
  }

  /** Q - W + sum_in m e - sum_out m e over the ports whose state is known [W] (balance.ts energyResidualOf). */
  private residual(W: number): number {
    let r = this.heatsQ - W;
    for (let k = 0; k < this.n; k++) {
      const st = this.states[k];
      if (st) r += this.ports[k]!.sign * this.flows[k]! * (st.h + 0.5 * st.velocity_m_per_s * st.velocity_m_per_s + G_m_per_s2 * st.elevation_m);
    }
    return r;
  }
  private heatsQ = 0;

  private energyState(j: number, r: number): PortState {
    const p = this.ports[j]!;
    const pp = this.xs![p.iP]!;
    if (!(pp >= 1 && pp <= 1e8)) inRange(`${p.name}.p_Pa`, pp, 1, 1e8);
    if (!(this.flows[j]! > 0)) throw new BalanceInputError('UNSOLVABLE', p.name, 'a state from the energy balance needs a flow > 0');
    const e = (p.sign === -1 ? r : -r) / this.flows[j]!;
    const h = e - 0.5 * p.V * p.V - G_m_per_s2 * p.z;
    if (this.ebState && this.ebKey[0] === pp && this.ebKey[1] === h) return this.ebState;
    const st = p.fluid.family === 'water' ? movedWaterPH((this.ebScratch ??= scratchState(p.V, p.z)), p.fluid, this.env, pp, h) : p.fluid.statePH(pp, h, this.env, p.V, p.z);
    this.ebKey[0] = pp;
    this.ebKey[1] = h;
    return (this.ebState = st);
  }

  private ebScratch: Mutable<PortState> | undefined;
  private xs: ArrayLike<number> | null = null;

  /** F, P, L in the order of the kind's terms; D as controlVolumeBalance sums it; efficiency. */
  private split(x: ArrayLike<number>, W: number, out: Float64Array, o: number): void {
    const { ports, n, flows, states, kind } = this;
    let F = 0;
    let P = 0;
    let L = 0;
    let dIn = 0;
    let dOut = 0;
    const T0 = this.env.T0_K;
    if (this.compressor) F += -W;
    for (let k = 0; k < n; k++) {
      const st = states[k]!;
      const ex = this.chemical ? st.psi + (st.eCh ?? 0) : st.psi;
      const into = ports[k]!.sign * flows[k]! * ex;
      if (ports[k]!.role === 0) F += into;
      else if (ports[k]!.role === 1) P += -into;
      else L += -into;
      if (into >= 0) dIn += into;
      else dOut -= into;
    }
    let hasProduct = kind !== 'valve' && kind !== 'condenser' && kind !== 'cooler';
    if (this.turbine) P += W;
    if (kind === 'generic') {
      hasProduct = ports.some((p) => p.role === 1);
      for (const w of this.powers) {
        const pw = w.out ? x[w.i]! : -x[w.i]!;
        const t = w.role === 0 ? -pw : pw;
        if (w.role === 0) F += t;
        else if (w.role === 1) (P += t), (hasProduct = true);
        else L += t;
      }
      for (const q of this.heats) {
        const Q = q.into ? x[q.iQ]! : -x[q.iQ]!;
        const xq = (1 - T0 / x[q.iT]!) * Q;
        const t = q.role === 0 ? xq : -xq;
        if (q.role === 0) F += t;
        else if (q.role === 1) (P += t), (hasProduct = true);
        else L += t;
        if (xq >= 0) dIn += xq;
        else dOut -= xq;
      }
      for (const w of this.powers) {
        const e = -(w.out ? x[w.i]! : -x[w.i]!);
        if (e >= 0) dIn += e;
        else dOut -= e;
      }
    } else if (W !== 0 || this.turbine || this.compressor) {
      if (-W >= 0) dIn += -W;
      else dOut -= -W;
    }
    out[o] = F;
    out[o + 1] = hasProduct ? P : NaN;
    out[o + 2] = L;
    out[o + 3] = dIn - dOut;
    out[o + 4] = hasProduct && F > 0 ? P / F : NaN;
  }
}
