/**
 * The turbine family's balance (turbine, expander).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { BalanceFamilyKind } from '../../kinds';
import { assemble, resolvePorts, type ResolvedPort, type UnitBalance } from '../balance';
import { BalanceInputError, requireInput } from '../errors';
import { checkEnv, powerFlag, requirePorts, termsOf, type PortBalanceInput } from './common';

/** Turbine or expander. */
export interface TurbineInput extends PortBalanceInput {
  /** measured power [W]: shaft power, or electric power at the generator terminals (see powerMeasured) */
  power_W: number;
  /** 'shaft' (default) or 'electric'; electric power is turned into shaft power as W / generatorEfficiency */
  powerMeasured?: 'shaft' | 'electric';
  /** generator efficiency [-], 0..1, needed when powerMeasured is 'electric' */
  generatorEfficiency?: number;
  kind?: BalanceFamilyKind<'turbine'>;
}

/**
 * Turbine / expander: F = sum_in mDot psi - sum_out mDot psi (extractions included), P = shaft power
 * (W, or W_el / eta_gen), companion isentropic efficiency (single inlet):
 *   eta_s = sum_j mDot_j (h_in - h_j) / sum_j mDot_j (h_in - h_s,j),   h_s,j = h(p_j, s_in).
 * Wet outlets take their state from the energy balance (`measured: { fromEnergyBalance, p_Pa }`):
 * h_out = h_in - W_shaft / mDot for one outlet; for several, the common-expansion-line assumption of
 * resolvePorts (extras.expansionEfficiency).
 * @throws BalanceInputError for missing ports, a generator efficiency outside (0, 1], or unsolvable outlets
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (turbine exergetic efficiency)
 */
export function turbineBalance(input: TurbineInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'turbine';
  requirePorts(kind, input.ports, 1, 1);
  powerFlag('power_W', input.power_W);
  let shaft = input.power_W;
  if ((input.powerMeasured ?? 'shaft') === 'electric') {
    const eta = input.generatorEfficiency;
    if (eta === undefined) throw new BalanceInputError('MISSING_INPUT', 'generatorEfficiency', 'electric power needs the generator efficiency to give shaft power');
    requireInput('generatorEfficiency', eta, 1e-6, 1, '[-]');
    shaft = input.power_W / eta;
  }
  const res = resolvePorts(input.ports, input.env, { work_W: shaft });
  const terms = termsOf(res.ports, 'fuel', false);
  terms.push({ label: 'shaft power', role: 'product', exergy_W: shaft });
  const extras: Record<string, number> = { shaftPower_W: shaft };
  let inlet: ResolvedPort | null = null;
  let nIn = 0;
  for (const p of res.ports) if (p.direction === 'in') (inlet = p), nIn++;
  if (nIn === 1 && input.companions !== false && input.isentropic !== false) {
    const hin = inlet!.state.h;
    const sin = inlet!.state.s;
    let actual = 0;
    let ideal = 0;
    for (const p of res.ports) {
      if (p.direction !== 'out') continue;
      actual += p.mDot * (hin - p.state.h);
      ideal += p.mDot * (hin - p.fluid.hIsentropic(p.state.p, sin));
    }
    extras.isentropicEfficiency = ideal > 0 ? actual / ideal : NaN;
  }
  if (Number.isFinite(res.commonExpansionEfficiency)) extras.expansionEfficiency = res.commonExpansionEfficiency;
  return assemble({
    lean: input.companions === false,
    kind,
    env: input.env,
    ports: res.ports,
    chemical: false,
    powers: [{ label: 'shaft power', power_W: shaft }],
    heats: [],
    terms,
    hasProduct: true,
    extras,
  });
}
