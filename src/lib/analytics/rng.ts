/**
 * A small deterministic pseudo-random generator for Monte Carlo propagation and tests: mulberry32
 * (a 32-bit multiply-xorshift generator) for uniforms, Box-Muller for standard normals.
 * Not for cryptography; chosen so that a seed reproduces a run exactly on every platform.
 *
 * @see G. E. P. Box and M. E. Muller, "A note on the generation of random normal deviates",
 *      Ann. Math. Statist. 29 (1958) 610-611.
 */
export interface Rng {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal N(0, 1). */
  normal(): number;
}

/**
 * Creates a seeded generator.
 * @param seed any integer; the same seed gives the same sequence
 */
export function createRng(seed: number): Rng {
  let a = seed >>> 0;
  let spare: number | null = null;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u1 = uniform();
    while (u1 <= 0) u1 = uniform(); // log(0) guard
    const u2 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    spare = r * Math.sin(2 * Math.PI * u2);
    return r * Math.cos(2 * Math.PI * u2);
  };
  return { uniform, normal };
}
