/**
 * CUSUM average run lengths by the Brook & Evans (1972) Markov chain (src/lib/analytics/arl.ts), for
 * independent normal observations, against a published table and an independent numpy computation.
 */
import { describe, it } from 'vitest';
import reference from '../fixtures/cusum-arl-reference.json';
import { expectClose } from '../support/expect-close';
import { cusumArl, cusumArlTwoSided } from '~/lib/analytics/arl';

/**
 * From memory: D. C. Montgomery, Introduction to Statistical Quality Control, 6th ed. (2009), Table 9.3
 * "ARL performance of the tabular CUSUM with k = 1/2 and h = 4 or h = 5", after D. M. Hawkins,
 * "Cumulative sum control charting: an underutilized SPC tool", Quality Engineering 5 (1993) 463-477.
 * Printed to three significant figures; two-sided scheme (in control: half the one-sided ARL).
 */
const TABLE_9_3 = 'from memory: Montgomery ISQC 6th ed. Table 9.3 (Hawkins 1993)';
const PUBLISHED: { h: number; shift: number; arl: number }[] = [
  { h: 4, shift: 0, arl: 168 },
  { h: 4, shift: 0.5, arl: 26.6 },
  { h: 4, shift: 1, arl: 8.38 },
  { h: 4, shift: 2, arl: 3.34 },
  { h: 4, shift: 3, arl: 2.19 },
  { h: 5, shift: 0, arl: 465 },
  { h: 5, shift: 0.5, arl: 38.0 },
  { h: 5, shift: 1, arl: 10.4 },
  { h: 5, shift: 2, arl: 4.01 },
  { h: 5, shift: 3, arl: 2.57 },
];

describe('CUSUM ARL, independent observations', () => {
  for (const p of PUBLISHED) {
    it(`${TABLE_9_3}: k = 0.5, h = ${p.h}, shift ${p.shift} sigma: ARL ${p.arl}`, () => {
      // three significant figures: within half a unit of the last printed digit
      const halfUnit = 0.5 * 10 ** (Math.floor(Math.log10(p.arl)) - 2);
      expectClose(cusumArlTwoSided(0.5, p.h, p.shift), p.arl, { atol: halfUnit, rtol: 0 });
    });
  }

  it('numpy reference (scripts/cusum-arl-reference.py, finer chain): one- and two-sided ARLs, k = 0.5 and 0.25, h = 4 to 8', () => {
    for (const c of reference.cases) {
      const label = `k = ${c.k}, h = ${c.h}, shift ${c.delta}`;
      expectClose(cusumArl(c.k, c.h, c.delta), c.oneSided, { rtol: 2e-5, label });
      expectClose(cusumArlTwoSided(c.k, c.h, c.delta), c.twoSided, { rtol: 2e-5, label });
    }
  });

  it('the product defaults (k = 0.5, h = 8): two-sided in-control ARL at least 8,760 hours (numpy reference: 9,483)', () => {
    const arl0 = cusumArlTwoSided(0.5, 8, 0);
    expectClose(arl0, reference.cases.find((c) => c.k === 0.5 && c.h === 8 && c.delta === 0)!.twoSided, { rtol: 2e-5 });
    if (!(arl0 >= 8760)) throw new Error(`ARL0 ${arl0} < 8760`);
  });
});
