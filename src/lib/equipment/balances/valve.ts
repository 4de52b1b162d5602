/**
 * The let-down valve's balance (dissipative: no product).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import { assemble, resolvePorts, type UnitBalance } from '../balance';
import { checkEnv, requirePorts, termsOf, type PortBalanceInput } from './common';

/**
 * Let-down / throttling valve: F = mDot (psi_in - psi_out), no product, D = F (dissipative: no
 * efficiency). The outlet state may come from the energy balance (isenthalpic: h_out = h_in).
 * @throws BalanceInputError unless there is one inlet and one outlet
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (throttling)
 */
export function valveBalance(input: PortBalanceInput): UnitBalance {
  checkEnv(input.env);
  requirePorts('valve', input.ports, 1, 1, 1, 1);
  const res = resolvePorts(input.ports, input.env, { work_W: 0 });
  const terms = termsOf(res.ports, 'fuel', false);
  return assemble({ lean: input.companions === false, kind: 'valve', env: input.env, ports: res.ports, chemical: false, powers: [], heats: [], terms, hasProduct: false });
}
