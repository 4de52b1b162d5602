/**
 * The fields of a unit hour are declared once, on the engine's row class (src/lib/engine/compute.ts),
 * and UnitHourResult is derived from them. This test pins what the database writer and the JSON
 * answers see of a row: every field set (none left undefined) and the own keys in declaration order.
 */
import { describe, expect, it } from 'vitest';
import { computeUnitHour, type UnitHourResult } from '~/lib/engine';
import { ALL_CASES } from './cases';
import { inputOf } from './support';

/** The figures of UnitHourResult in declaration order; `detail` is the class's getter. */
const FIGURES = [
  'state', 'reasons', 'load', 'loadUnit', 'T0_K', 'p0_Pa', 'fuel_W', 'product_W', 'loss_W', 'destruction_W',
  'efficiency', 'efficiency_U', 'destruction_U_W', 'closure_pct', 'entropyGeneration_W_per_K',
  'destructionCost_per_h', 'modelVersion', 'inputsHash',
] as const satisfies readonly (keyof UnitHourResult)[];

/** Fails the type check when UnitHourResult gains a field this list does not name. */
type Unlisted = Exclude<keyof UnitHourResult, (typeof FIGURES)[number] | 'detail'>;
const everyFieldListed: [Unlisted] extends [never] ? true : Unlisted = true;

describe('the engine row', () => {
  it.each(ALL_CASES())('$kind: every field of UnitHourResult is set, in order', (c) => {
    expect(everyFieldListed).toBe(true);
    const input = inputOf(c);
    // the first hour goes through the full mapping, the second through the plan it kept
    for (const row of [computeUnitHour(input), computeUnitHour(input)]) {
      expect(Object.keys(row)).toEqual([...FIGURES]);
      for (const name of FIGURES) expect(row[name], name).not.toBeUndefined();
      expect(Object.keys(row.detail).length).toBeGreaterThan(0);
    }
  });
});
