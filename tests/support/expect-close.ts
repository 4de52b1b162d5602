import { expect } from 'vitest';

/**
 * Asserts that `actual` is within a relative tolerance of `expected` (or an absolute one for values
 * near zero). The tolerance is written at the call whenever the default does not fit the printed
 * digits of the source.
 */
export function expectClose(
  actual: number,
  expected: number,
  { rtol = 1e-9, atol = 0, label = '' }: { rtol?: number; atol?: number; label?: string } = {},
): void {
  const tol = Math.max(atol, rtol * Math.abs(expected));
  const diff = Math.abs(actual - expected);
  if (!(diff <= tol)) {
    expect.fail(
      `${label ? label + ': ' : ''}expected ${expected} within ${tol.toExponential(2)} ` +
        `(rtol ${rtol}, atol ${atol}), got ${actual} (off by ${diff.toExponential(3)}, rel ${(diff / Math.abs(expected || 1)).toExponential(2)})`,
    );
  }
}
