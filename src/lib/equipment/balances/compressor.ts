/**
 * The compressor family's balance (compressor, pump, fan).
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { BalanceFamilyKind } from '../../kinds';
import { assemble, resolvePorts, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError, requireInput } from '../errors';
import { checkEnv, powerFlag, requirePorts, streamTerm, type PortBalanceInput } from './common';

/** Compressor, pump or fan. */
export interface CompressorInput extends PortBalanceInput {
  /** measured power [W]: shaft, or electric input to the driving motor (see powerMeasured) */
  power_W: number;
  /** 'shaft' (default) or 'electric'; electric power becomes shaft power as W * motorEfficiency */
  powerMeasured?: 'shaft' | 'electric';
  /** motor efficiency [-], 0..1, needed when powerMeasured is 'electric' */
  motorEfficiency?: number;
  kind?: BalanceFamilyKind<'compressor'>;
}

/**
 * Compressor / pump / fan: F = shaft power, P = sum_out mDot psi - sum_in mDot psi; companion
 * isentropic efficiency (one inlet, one outlet) eta_s = (h_s - h_in) / (h_out - h_in), h_s = h(p_out, s_in).
 * @throws BalanceInputError for missing ports or a motor efficiency outside (0, 1]
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3
 */
export function compressorBalance(input: CompressorInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'compressor';
  requirePorts(kind, input.ports, 1, 1);
  powerFlag('power_W', input.power_W);
  let shaft = input.power_W;
  if ((input.powerMeasured ?? 'shaft') === 'electric') {
    const eta = input.motorEfficiency;
    if (eta === undefined) throw new BalanceInputError('MISSING_INPUT', 'motorEfficiency', 'electric power needs the motor efficiency to give shaft power');
    requireInput('motorEfficiency', eta, 1e-6, 1, '[-]');
    shaft = input.power_W * eta;
  }
  const res = resolvePorts(input.ports, input.env, { work_W: -shaft });
  const terms: UnitTerm[] = [{ label: 'shaft power', role: 'fuel', exergy_W: shaft }];
  for (const p of res.ports) terms.push(streamTerm(p, 'product', false));
  const extras: Record<string, number> = { shaftPower_W: shaft };
  if (res.ports.length === 2 && input.companions !== false && input.isentropic !== false) {
    const inP = res.ports[0].direction === 'in' ? res.ports[0] : res.ports[1];
    const outP = inP === res.ports[0] ? res.ports[1] : res.ports[0];
    const a = inP.state;
    const b = outP.state;
    const hs = outP.fluid.hIsentropic(b.p, a.s);
    extras.isentropicEfficiency = b.h !== a.h ? (hs - a.h) / (b.h - a.h) : NaN;
  }
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [{ label: 'shaft power', power_W: -shaft }], heats: [], terms, hasProduct: true, extras });
}
