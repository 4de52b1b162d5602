/**
 * The mixer family's balance (mixer, deaerator, open feedwater heater).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { BalanceFamilyKind } from '../../kinds';
import { assemble, resolvePorts, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError } from '../errors';
import { checkEnv, requirePorts, type PortBalanceInput } from './common';

/** Mixer, deaerator or open feedwater heater. */
export interface MixerInput extends PortBalanceInput {
  kind?: BalanceFamilyKind<'mixer'>;
}

/**
 * Mixer / deaerator / open feedwater heater. Inlets have role 'hot' or 'cold', or none: then an inlet
 * whose specific flow exergy exceeds the outlet's is hot. Outlets: one 'outlet' (role 'outlet' or none)
 * and any number of 'vent' outlets (loss).
 *   F = sum_hot mDot_i psi_i - (mDot_out - sum_cold mDot_j) psi_out     (exergy decrease of the hot streams)
 *   P = sum_cold mDot_j (psi_out - psi_j)                               (exergy increase of the cold streams)
 *   L = sum_vent mDot psi_vent
 * The hot streams' share of the outlet is mDot_out - sum_cold, so F - P - L is the balance's D exactly
 * even when measured flows do not close the mass balance.
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (mixing; open feedwater heaters)
 */
export function mixerBalance(input: MixerInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'mixer';
  requirePorts(kind, input.ports, 2, 1);
  for (const p of input.ports) {
    const ok = p.direction === 'in' ? [undefined, 'hot', 'cold'] : [undefined, 'outlet', 'vent'];
    if (!ok.includes(p.role)) throw new BalanceInputError('INVALID_MODEL', p.name, `role '${p.role}' does not apply to a ${kind} ${p.direction === 'in' ? 'inlet' : 'outlet'} (use ${ok.slice(1).join(' or ')})`);
  }
  let nMain = 0;
  let iMain = -1;
  for (let i = 0; i < input.ports.length; i++) if (input.ports[i].direction === 'out' && input.ports[i].role !== 'vent') (nMain++, (iMain = i));
  if (nMain !== 1) throw new BalanceInputError(nMain ? 'INVALID_MODEL' : 'MISSING_INPUT', 'outlet', `a ${kind} needs exactly one main outlet (others are role 'vent'), got ${nMain}`);
  const res = resolvePorts(input.ports, input.env, { work_W: 0 });
  const out = res.ports[iMain];
  const psiOut = out.state.psi;
  const terms: UnitTerm[] = [];
  let coldMass = 0;
  const flags: string[] = [];
  for (const p of res.ports) {
    if (p.direction !== 'in') continue;
    const hot = p.role === 'hot' || (p.role === undefined && p.state.psi > psiOut);
    if (hot) terms.push({ label: p.name, role: 'fuel', exergy_W: p.mDot * p.state.psi });
    else {
      coldMass += p.mDot;
      terms.push({ label: p.name, role: 'product', exergy_W: -p.mDot * p.state.psi });
    }
  }
  terms.push({ label: `${out.name} (hot streams' share)`, role: 'fuel', exergy_W: -(out.mDot - coldMass) * psiOut });
  terms.push({ label: `${out.name} (cold streams' share)`, role: 'product', exergy_W: coldMass * psiOut });
  for (const p of res.ports) if (p.direction === 'out' && p !== out) terms.push({ label: p.name, role: 'loss', exergy_W: p.mDot * p.state.psi });
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [], heats: [], terms, hasProduct: true, flags });
}
