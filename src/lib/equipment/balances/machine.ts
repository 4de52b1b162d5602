/**
 * The machine family's balance (motor, generator): power in, power out, no ports.
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { BalanceFamilyKind } from '../../kinds';
import { assemble, type UnitBalance } from '../balance';
import { requireInput } from '../errors';
import type { Environment } from '../fluids';
import { checkEnv } from './common';

/** Motor or generator. */
export interface MachineInput {
  env: Environment;
  /** electric (motor) or shaft (generator) power in [W], > 0 */
  powerIn_W: number;
  /** shaft (motor) or electric (generator) power out [W], >= 0 */
  powerOut_W: number;
  kind?: BalanceFamilyKind<'machine'>;
}

/**
 * Motor / generator: F = power in, P = power out, efficiency = P / F, equal to the energy efficiency.
 * The losses leave as heat; the boundary is drawn where they reach the environment (Tb = T0), so they
 * carry no exergy and D = F - P (L = 0). An efficiency above 1 (meter error) is flagged, not refused.
 * @throws BalanceInputError for a non-positive power in or a negative power out
 * @see docs/domain.md s.3
 */
export function machineBalance(input: MachineInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'motor';
  requireInput('powerIn_W', input.powerIn_W, 1e-9, 1e12, 'W', 'power in');
  requireInput('powerOut_W', input.powerOut_W, 0, 1e12, 'W', 'power out');
  const loss = input.powerIn_W - input.powerOut_W;
  const inLabel = kind === 'motor' ? 'electric power in' : 'shaft power in';
  const outLabel = kind === 'motor' ? 'shaft power out' : 'electric power out';
  const flags = loss < 0 ? ['efficiency-above-one'] : [];
  return assemble({
    kind,
    env: input.env,
    ports: [],
    chemical: false,
    powers: [
      { label: inLabel, power_W: -input.powerIn_W },
      { label: outLabel, power_W: input.powerOut_W },
    ],
    heats: [{ label: 'losses to the environment at T0', Q_W: -loss, Tb_K: input.env.T0_K }],
    terms: [
      { label: inLabel, role: 'fuel', exergy_W: input.powerIn_W },
      { label: outLabel, role: 'product', exergy_W: input.powerOut_W },
    ],
    hasProduct: true,
    extras: { energyEfficiency: input.powerOut_W / input.powerIn_W },
    flags,
  });
}
