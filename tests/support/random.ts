/**
 * Random cases of the randomised tests, from fast-check: each test runs a property with a fixed seed
 * (the same cases every run; a failure shrinks to a small case and prints its seed and path).
 */
import fc from 'fast-check';

/**
 * A number in [0, 1), uniform (2^30 steps; fast-check's bias towards the ends is turned off, so
 * cases spread over the whole range as the checks of every region need).
 */
export const unit = fc.noBias(fc.integer({ min: 0, max: 2 ** 30 - 1 })).map((i) => i / 2 ** 30);

/** Numbers in [0, 1) handed out one by one, for cases that need a varying count of them. */
export class Draws {
  private i = 0;
  constructor(readonly values: readonly number[]) {}
  /** The next number (the list starts over when used up). */
  next = (): number => this.values[this.i++ % this.values.length]!;
  toString(): string {
    return `Draws(${JSON.stringify(this.values)})`;
  }
}

/** n numbers in [0, 1) as Draws. */
export const draws = (n: number) => fc.array(unit, { minLength: n, maxLength: n }).map((v) => new Draws(v));

/** A property's run settings: a fixed seed and the number of cases. */
export const runs = (seed: number, numRuns: number) => ({ seed, numRuns });
