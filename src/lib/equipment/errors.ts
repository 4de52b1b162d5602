/**
 * Typed errors of the equipment balances. A `BalanceInputError` means the unit's inputs cannot give a
 * balance at all (a missing port, an impossible flow, a definition that does not apply); its message
 * names the input and says what was expected, so the hourly engine can store it as the hour's reason.
 * Property-range failures of the property core keep their own type (`ThermoRangeError`).
 */
import { figures } from '../format';

/** Why a balance was refused. Codes are permanent: callers may store and match them. */
export type BalanceErrorCode =
  /** a port, power or parameter that the unit kind needs is absent */
  | 'MISSING_INPUT'
  /** a number is outside what is physically possible (negative flow, efficiency > 1, ...) */
  | 'IMPOSSIBLE_INPUT'
  /** the model is inconsistent (two unknowns where one is allowed, roles that do not fit the kind) */
  | 'INVALID_MODEL'
  /** a stream is below the dead-state temperature where the kind's fuel/product definition fails */
  | 'BELOW_DEAD_STATE'
  /** the energy balance cannot fix an unknown (zero coefficient, state outside the property range) */
  | 'UNSOLVABLE';

export class BalanceInputError extends Error {
  readonly code: BalanceErrorCode;
  /** the input (port name, parameter or vector entry) the message is about */
  readonly input: string;
  constructor(code: BalanceErrorCode, input: string, message: string) {
    super(`${input}: ${message}`);
    this.name = 'BalanceInputError';
    this.code = code;
    this.input = input;
  }
}

/** Throws BalanceInputError('IMPOSSIBLE_INPUT') unless lo <= value <= hi and value is finite. */
export function requireInput(input: string, value: number, lo: number, hi: number, unit: string, what = ''): void {
  if (!(value >= lo && value <= hi)) {
    throw new BalanceInputError(
      Number.isNaN(value) || value === undefined ? 'MISSING_INPUT' : 'IMPOSSIBLE_INPUT',
      input,
      `${what ? what + ' ' : ''}= ${figures(value, 6, { none: 'no value' })} is outside ${figures(lo, 6)}..${figures(hi, 6)} ${unit}`,
    );
  }
}
