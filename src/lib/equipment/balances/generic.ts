/**
 * The generic control volume's balance: every term's role designated by the user.
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import { assemble, resolvePorts, type HeatFlow, type PowerFlow, type TermRole, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError, requireInput } from '../errors';
import { checkEnv, powerFlag, streamTerm, type PortBalanceInput } from './common';

/** A power of a generic control volume: out of the volume positive [W]. */
export interface GenericPower extends PowerFlow {
  role: TermRole;
}

/** A heat of a generic control volume: into the volume positive [W] at Tb [K]. */
export interface GenericHeat extends HeatFlow {
  role: TermRole;
}

/** Generic control volume: every port, power and heat has role 'fuel', 'product' or 'loss'. */
export interface GenericInput extends PortBalanceInput {
  powers?: GenericPower[];
  heats?: GenericHeat[];
  /** include the streams' chemical exergy (reacting volumes); default false */
  chemical?: boolean;
}

/**
 * Generic control volume: any ports, heat flows with their boundary temperature, and powers. The user
 * designates each term: a 'fuel' term adds the exergy it brings into the volume to F; a 'product' or
 * 'loss' term adds the exergy it takes out of the volume to P or L. D comes from the exergy balance and
 * equals F - P - L. P is null when no term is a product.
 * @throws BalanceInputError for a term without a role
 * @see docs/domain.md s.2, s.3; Lazzaretto & Tsatsaronis (2006)
 */
export function genericBalance(input: GenericInput): UnitBalance {
  checkEnv(input.env);
  const powers = input.powers ?? [];
  const heats = input.heats ?? [];
  const roles: TermRole[] = ['fuel', 'product', 'loss'];
  for (const p of input.ports) if (!roles.includes(p.role as TermRole)) throw new BalanceInputError('INVALID_MODEL', p.name, `a generic port needs role fuel, product or loss, got '${p.role}'`);
  for (const w of powers) {
    if (!roles.includes(w.role)) throw new BalanceInputError('INVALID_MODEL', w.label, `a generic power needs role fuel, product or loss, got '${w.role}'`);
    powerFlag(`${w.label}.power_W`, w.power_W);
  }
  for (const q of heats) {
    if (!roles.includes(q.role)) throw new BalanceInputError('INVALID_MODEL', q.label, `a generic heat needs role fuel, product or loss, got '${q.role}'`);
    requireInput(`${q.label}.Tb_K`, q.Tb_K, 1, 1e5, 'K', 'boundary temperature');
  }
  if (input.ports.length + powers.length + heats.length === 0) throw new BalanceInputError('MISSING_INPUT', 'ports', 'a generic control volume needs at least one term');
  const chemical = input.chemical ?? false;
  let W = 0;
  for (const w of powers) W += w.power_W;
  let Q = 0;
  for (const q of heats) Q += q.Q_W;
  const res = resolvePorts(input.ports, input.env, { work_W: W, heat_W: Q });
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role as TermRole, chemical));
  const T0 = input.env.T0_K;
  for (const w of powers) terms.push({ label: w.label, role: w.role, exergy_W: w.role === 'fuel' ? -w.power_W : w.power_W });
  for (const q of heats) {
    const x = (1 - T0 / q.Tb_K) * q.Q_W;
    terms.push({ label: q.label, role: q.role, exergy_W: q.role === 'fuel' ? x : -x });
  }
  let hasProduct = false;
  for (const t of terms) if (t.role === 'product') hasProduct = true;
  return assemble({ lean: input.companions === false, kind: 'generic', env: input.env, ports: res.ports, chemical, powers, heats, terms, hasProduct });
}
