/**
 * Typed errors of the property core. Every message names the input, its value in SI base units and
 * the valid range, so a caller (or a person reading an hour's reasons) can see what went wrong.
 */
export class ThermoRangeError extends RangeError {
  readonly input: string;
  readonly value: number;
  readonly validRange: string;
  constructor(input: string, value: number, validRange: string, context = '') {
    super(`${context ? context + ': ' : ''}${input} = ${value} is outside the valid range ${validRange}`);
    this.name = 'ThermoRangeError';
    this.input = input;
    this.value = value;
    this.validRange = validRange;
  }
}

export class NoConvergenceError extends Error {
  readonly iterations: number;
  readonly residual: number;
  constructor(what: string, iterations: number, residual: number) {
    super(`${what} did not converge after ${iterations} iterations (residual ${residual.toExponential(3)})`);
    this.name = 'NoConvergenceError';
    this.iterations = iterations;
    this.residual = residual;
  }
}

/** Throws ThermoRangeError unless lo <= value <= hi (and value is finite). */
export function requireRange(input: string, value: number, lo: number, hi: number, unit: string, context = ''): void {
  if (!(value >= lo && value <= hi)) {
    throw new ThermoRangeError(input, value, `${lo}..${hi} ${unit}`, context);
  }
}
