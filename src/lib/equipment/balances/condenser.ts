/**
 * The condenser family's balance (condenser, cooler; dissipative: no product).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { BalanceFamilyKind } from '../../kinds';
import { G_m_per_s2 } from '../../thermo';
import { assemble, resolvePorts, type HeatFlow, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError } from '../errors';
import { checkEnv, requirePorts, requireSides, roleGroup, streamTerm, type PortBalanceInput } from './common';

/** Condenser or cooler: ports with role 'process' and, optionally, 'cooling'. */
export interface CondenserInput extends PortBalanceInput {
  kind?: BalanceFamilyKind<'condenser'>;
}

/**
 * Condenser / cooler: F = exergy decrease of the process stream, no product.
 * With cooling-side ports (flow measured or from the energy balance): L = exergy increase of the
 * cooling medium, D = F - L. Without them the heat is taken as rejected to the environment at T0
 * (a heat term at Tb = T0 closing the energy balance, zero exergy): D = F, L = 0 and the flag
 * 'loss-not-separated'. A wet process inlet may take its state from the energy balance (cooling-water
 * heat balance) or from x or h.
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (dissipative components)
 */
export function condenserBalance(input: CondenserInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'condenser';
  requirePorts(kind, input.ports, 1, 1);
  for (const p of input.ports) {
    if (p.role !== 'process' && p.role !== 'cooling') throw new BalanceInputError('INVALID_MODEL', p.name, `a ${kind} port needs role 'process' or 'cooling', got '${p.role}'`);
  }
  const hasCooling = requireSides(input.ports, 'process', 'cooling', false);
  const heats: HeatFlow[] = [];
  const flags: string[] = [];
  const res = resolvePorts(input.ports, input.env, { work_W: 0, defaultGroup: roleGroup });
  if (!hasCooling) {
    let q = 0;
    for (const p of res.ports) q += (p.direction === 'in' ? 1 : -1) * p.mDot * (p.state.h + 0.5 * p.state.velocity_m_per_s ** 2 + G_m_per_s2 * p.state.elevation_m);
    heats.push({ label: 'heat rejected at T0', Q_W: -q, Tb_K: input.env.T0_K });
    flags.push('loss-not-separated');
  }
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role === 'process' ? 'fuel' : 'loss', false));
  let duty = 0;
  for (const p of res.ports) if (p.role === 'process') duty += (p.direction === 'in' ? 1 : -1) * p.mDot * p.state.h;
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [], heats, terms, hasProduct: false, extras: { duty_W: duty }, flags });
}
