/**
 * What every unit balance shares: the common input, the dead-state and port-count checks, and the
 * stream terms of the fuel/product/loss split (the balances of ./turbine.ts ... ./generic.ts use them).
 */
import { exergyInto, type BalancePort, type ResolvedPort, type TermRole, type UnitTerm } from '../balance';
import { BalanceInputError, requireInput } from '../errors';
import type { Environment } from '../fluids';

/** Common input of the port-based balances. */
export interface PortBalanceInput {
  /** dead state: T0_K [K], p0_Pa [Pa] */
  env: Environment;
  ports: BalancePort[];
  /** false skips companion figures (isentropic efficiency ...) that F, P, L, D do not need; default true */
  companions?: boolean;
  /**
   * false skips the isentropic companions (an h(p, s) call per outlet: turbines, compressors) and keeps
   * everything else (port records, flags): a caller that reads only the figures and checks; default true
   */
  isentropic?: boolean;
}

export function roleGroup(p: BalancePort): string {
  return p.role ?? 'main';
}

export function termsOf(ports: ResolvedPort[], role: TermRole, chemical: boolean): UnitTerm[] {
  const out: UnitTerm[] = new Array(ports.length);
  for (let i = 0; i < ports.length; i++) out[i] = streamTerm(ports[i], role, chemical);
  return out;
}

/** How many ports a kind takes, in words: "2", "1 to 3" or "at least 1". */
export function portCount(min: number, max: number): string {
  if (max === min) return String(min);
  return Number.isFinite(max) ? `${min} to ${max}` : `at least ${min}`;
}

/**
 * Checks the dead state: T0 200..400 K, p0 50..120 kPa (the property core's range).
 * @throws BalanceInputError('IMPOSSIBLE_INPUT') naming T0_K or p0_Pa
 */
export function checkEnv(env: Environment): void {
  requireInput('T0_K', env?.T0_K, 200, 400, 'K', 'dead-state temperature');
  requireInput('p0_Pa', env?.p0_Pa, 5e4, 1.2e5, 'Pa', 'dead-state pressure');
}

export function countDir(ports: BalancePort[], dir: 'in' | 'out'): number {
  let n = 0;
  for (const p of ports) if (p.direction === dir) n++;
  return n;
}

export function requirePorts(kind: string, ports: BalancePort[], minIn: number, minOut: number, maxIn = Infinity, maxOut = Infinity): void {
  if (!Array.isArray(ports)) throw new BalanceInputError('MISSING_INPUT', 'ports', `a ${kind} needs its ports`);
  const ni = countDir(ports, 'in');
  const no = countDir(ports, 'out');
  if (ni < minIn || ni > maxIn) {
    throw new BalanceInputError(ni < minIn ? 'MISSING_INPUT' : 'INVALID_MODEL', 'ports', `a ${kind} needs ${portCount(minIn, maxIn)} inlet port(s), got ${ni}`);
  }
  if (no < minOut || no > maxOut) {
    throw new BalanceInputError(no < minOut ? 'MISSING_INPUT' : 'INVALID_MODEL', 'ports', `a ${kind} needs ${portCount(minOut, maxOut)} outlet port(s), got ${no}`);
  }
}

/**
 * Checks that side a (always) and side b (when required, else when present) have an inlet and an
 * outlet; returns whether side b is present.
 */
export function requireSides(ports: BalancePort[], a: string, b: string, bRequired: boolean): boolean {
  let aIn = 0;
  let aOut = 0;
  let bIn = 0;
  let bOut = 0;
  for (const p of ports) {
    if (p.role === a) p.direction === 'in' ? aIn++ : aOut++;
    else if (p.role === b) p.direction === 'in' ? bIn++ : bOut++;
  }
  if (aIn < 1 || aOut < 1) throw new BalanceInputError('MISSING_INPUT', a, `the ${a} side needs an inlet and an outlet`);
  const hasB = bIn + bOut > 0;
  if ((bRequired || hasB) && (bIn < 1 || bOut < 1)) throw new BalanceInputError('MISSING_INPUT', b, `the ${b} side needs an inlet and an outlet`);
  return hasB;
}

export function streamTerm(p: ResolvedPort, role: TermRole, chemical: boolean): UnitTerm {
  const into = exergyInto(p, chemical);
  return { label: p.name, role, exergy_W: role === 'fuel' ? into : -into };
}

export function powerFlag(name: string, value: number): void {
  requireInput(name, value, -1e12, 1e12, 'W', 'power');
}
