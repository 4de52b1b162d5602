import { describe, expect, it } from 'vitest';
import { fitBaseline } from '~/lib/analytics/baseline';
import { FIT_TRUST, baselineTrust, fitTrust } from '~/lib/analytics/fit-trust';

/**
 * The trust of a baseline fit. The thresholds are common practice (src/lib/analytics/fit-trust.ts):
 * ten hours per coefficient and a day at least to accept, a week and a load spread of 5 % of the mean
 * to trust. Invented hours of a pump: destruction linear in load, a small wobble.
 */
function hours(n: number, loadOf: (i: number) => number) {
  const load = Array.from({ length: n }, (_, i) => loadOf(i));
  const T_amb_K = Array.from({ length: n }, (_, i) => 290 + 5 * Math.sin(i / 4));
  const y = load.map((l, i) => 1e5 + 5e3 * l + 200 * Math.sin(i * 1.7));
  return { load, T_amb_K, y };
}

describe('the trust of a baseline fit', () => {
  it('self-consistency: 49 hours fit almost perfectly (R² near 1) and are still not trusted: under a week', () => {
    const m = fitBaseline(hours(49, (i) => 5 + (i % 10)), { terms: ['load', 'T_amb'] });
    expect(m.stats.r2).toBeGreaterThan(0.99);
    const t = fitTrust(m);
    expect([t.acceptable, t.trusted, t.minHours]).toEqual([true, false, 30]);
    expect(t.warnings).toHaveLength(1);
    expect(t.warnings[0]).toMatch(/only 49 steady hours, less than a week \(168 h; common practice\)/);
  });

  it('self-consistency: below ten hours per coefficient it cannot be accepted; at the minimum it can', () => {
    // Six coefficients (quadratic in load and T_amb with the cross term): 60 hours at least.
    const terms = ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'] as const;
    expect(fitTrust(fitBaseline(hours(59, (i) => 5 + (i % 10)), { terms: [...terms] })).acceptable).toBe(false);
    const at = fitTrust(fitBaseline(hours(60, (i) => 5 + (i % 10)), { terms: [...terms] }));
    expect([at.acceptable, at.minHours]).toEqual([true, 60]);
    expect(FIT_TRUST.minHoursPerCoefficient * 6).toBe(60);
  });

  it('self-consistency: a week of hours over a wide load range is trusted; a load that hardly moves is not', () => {
    const wide = fitTrust(fitBaseline(hours(200, (i) => 5 + (i % 10)), { terms: ['load'] }));
    expect(wide).toMatchObject({ acceptable: true, trusted: true, warnings: [] });
    // Load 10 +- about 0.1: spread about 1 % of the mean.
    const narrow = fitTrust(fitBaseline(hours(200, (i) => 10 + 0.14 * Math.sin(i)), { terms: ['load'] }));
    expect(narrow.acceptable).toBe(true);
    expect(narrow.trusted).toBe(false);
    expect(narrow.loadCv!).toBeLessThan(0.05);
    expect(narrow.warnings[0]).toMatch(/load hardly varied .* under 5\.0 %; common practice/);
  });

  it('self-consistency: a baseline is as trusted as its weaker model', () => {
    const good = fitBaseline(hours(200, (i) => 5 + (i % 10)), { terms: ['load'] });
    const weak = fitBaseline(hours(20, (i) => 5 + (i % 10)), { terms: ['load'] });
    expect(baselineTrust(good, weak).acceptable).toBe(false);
    expect(baselineTrust(good, null).trusted).toBe(true);
  });
});
