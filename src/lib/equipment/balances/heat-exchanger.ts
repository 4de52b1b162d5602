/**
 * The heat exchanger's balance (both streams above the dead state).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import { assemble, resolvePorts, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError } from '../errors';
import { checkEnv, requirePorts, requireSides, roleGroup, streamTerm, type PortBalanceInput } from './common';
import { upTo } from '../../format';

/** Heat exchanger: ports with role 'hot' or 'cold'. */
export interface HeatExchangerInput extends PortBalanceInput {
  /**
   * Streams below T0: the fuel/product definitions of hot-side decrease / cold-side increase do not
   * hold there. 'refuse' (default) throws BalanceInputError('BELOW_DEAD_STATE'); 'flag' computes with
   * the above-T0 definitions and adds the flag 'below-dead-state-definitions'.
   */
  belowDeadState?: 'refuse' | 'flag';
}

/**
 * Heat exchanger (both streams above T0): F = exergy decrease of the hot side, P = exergy increase of
 * the cold side. One flow per side may come from the mass balance, one flow of the unit from the
 * energy balance.
 * @throws BalanceInputError('BELOW_DEAD_STATE') for a stream below T0 unless belowDeadState is 'flag'
 * @see docs/domain.md s.3; Lazzaretto & Tsatsaronis (2006), heat exchangers above T0
 */
export function heatExchangerBalance(input: HeatExchangerInput): UnitBalance {
  checkEnv(input.env);
  requirePorts('heat exchanger', input.ports, 2, 2);
  for (const p of input.ports) {
    if (p.role !== 'hot' && p.role !== 'cold') throw new BalanceInputError('INVALID_MODEL', p.name, `a heat-exchanger port needs role 'hot' or 'cold', got '${p.role}'`);
  }
  requireSides(input.ports, 'hot', 'cold', true);
  const res = resolvePorts(input.ports, input.env, { work_W: 0, defaultGroup: roleGroup });
  const flags: string[] = [];
  for (const p of res.ports) {
    if (p.state.T < input.env.T0_K) {
      if ((input.belowDeadState ?? 'refuse') === 'refuse') {
        throw new BalanceInputError(
          'BELOW_DEAD_STATE',
          p.name,
          `T = ${upTo(p.state.T, 2)} K is below T0 = ${upTo(input.env.T0_K, 2)} K; hot-side decrease / cold-side increase is not the fuel/product split there (set belowDeadState: 'flag' to compute anyway)`,
        );
      }
      if (!flags.includes('below-dead-state-definitions')) flags.push('below-dead-state-definitions');
    }
  }
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role === 'hot' ? 'fuel' : 'product', false));
  let dutyHot = 0;
  let dutyCold = 0;
  for (const p of res.ports) {
    const sgn = p.direction === 'in' ? 1 : -1;
    if (p.role === 'hot') dutyHot += sgn * p.mDot * p.state.h;
    else dutyCold -= sgn * p.mDot * p.state.h;
  }
  return assemble({
    lean: input.companions === false,
    kind: 'heat-exchanger',
    env: input.env,
    ports: res.ports,
    chemical: false,
    powers: [],
    heats: [],
    terms,
    hasProduct: true,
    extras: { hotDuty_W: dutyHot, coldDuty_W: dutyCold },
    flags,
  });
}
