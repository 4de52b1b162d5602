/**
 * A unit's limits as the limits form shows and sends them (src/lib/views/unit-limits.ts): efficiency
 * in % to one decimal on screen and as a fraction on the wire, a comma read as the decimal mark, an
 * empty field for no limit.
 */
import { expect, it } from 'vitest';
import { limitsBody, limitsFields, typedNumber, type UnitLimits } from '~/lib/views/unit-limits';

const saved = (o: Partial<UnitLimits>): UnitLimits => ({ maxCost_per_day: null, minEfficiency: null, hours: 3, currency: 'EUR', normallyIdle: null, updatedAt: null, ...o });

it('reads typed numbers', () => {
  expect(typedNumber('')).toBeNull();
  expect(typedNumber('   ')).toBeNull();
  expect(typedNumber('12,5')).toBe(12.5);
  expect(typedNumber(' 40 ')).toBe(40);
  expect(typedNumber('abc')).toBeNaN();
});

it('shows saved limits in the fields', () => {
  expect(limitsFields(saved({}))).toEqual({ cost: '', eff: '', hours: '3' });
  expect(limitsFields(saved({ maxCost_per_day: 1250.5, minEfficiency: 0.6149, hours: 6 }))).toEqual({ cost: '1250.5', eff: '61.5', hours: '6' });
  expect(limitsFields(saved({ minEfficiency: 0.8 }))).toMatchObject({ eff: '80' });
});

it('sends the efficiency as a fraction and empty fields as no limit', () => {
  expect(limitsBody({ cost: '', eff: '', hours: '3' })).toEqual({ maxCost_per_day: null, minEfficiency: null, hours: 3 });
  const b = limitsBody({ cost: '1200', eff: '61,5', hours: '4' });
  expect(b.maxCost_per_day).toBe(1200);
  expect(b.minEfficiency).toBeCloseTo(0.615, 12);
  expect(b.hours).toBe(4);
  // What the form shows, it sends back unchanged.
  const back = limitsBody(limitsFields(saved({ maxCost_per_day: 99, minEfficiency: 0.725, hours: 5 })));
  expect(back.maxCost_per_day).toBe(99);
  expect(back.minEfficiency).toBeCloseTo(0.725, 12);
  expect(back.hours).toBe(5);
});
