/**
 * Typed errors of the unit layer. Every message names the unit text as given, the quantity it was
 * meant for, and what to do (closest known spellings, or the context value that is missing).
 */
export type UnitErrorCode =
  | 'UNKNOWN_UNIT'
  | 'UNKNOWN_QUANTITY'
  | 'WRONG_QUANTITY'
  | 'MISSING_CONTEXT'
  | 'INVALID_ARGUMENT';

export class UnitError extends Error {
  readonly code: UnitErrorCode;
  readonly unit: string;
  readonly quantity: string;
  readonly suggestions: readonly string[];
  constructor(code: UnitErrorCode, unit: string, quantity: string, message: string, suggestions: readonly string[] = []) {
    super(message);
    this.name = 'UnitError';
    this.code = code;
    this.unit = unit;
    this.quantity = quantity;
    this.suggestions = suggestions;
  }
}
