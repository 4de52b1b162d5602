import { describe, expect, it } from 'vitest';
import { at, cell, defined, entry } from './present';

describe('presence helpers of the tests', () => {
  it('at returns the item and refuses a missing one, a negative index (an indexOf that found nothing) included', () => {
    expect(at([10, 20, 30], 0)).toBe(10);
    expect(at(Float64Array.of(1.5, 2.5), 1)).toBe(2.5);
    expect(() => at([10, 20], [10, 20].indexOf(30), 'rows')).toThrow('rows: no item at index -1 (it has 2)');
    expect(at([0], 0)).toBe(0); // a falsy item is still present
    expect(() => at([10, 20], 2, 'rows')).toThrow('rows: no item at index 2 (it has 2)');
    expect(() => at([], -1)).toThrow('list: no item at index -1 (it has 0)');
    expect(() => at([1, 2], 0.5)).toThrow(/no item at index 0.5/);
  });

  it('cell reads a matrix and names the row of a missing column', () => {
    expect(cell([[1, 2], [3, 4]], 1, 0)).toBe(3);
    expect(() => cell([[1, 2]], 0, 5, 'sensitivity')).toThrow('sensitivity row 0: no item at index 5 (it has 2)');
    expect(() => cell([[1, 2]], 3, 0, 'sensitivity')).toThrow('sensitivity: no item at index 3 (it has 1)');
  });

  it('entry returns a key that is there and lists the keys when it is not', () => {
    const ports: Record<string, { mDot: number }> = { in: { mDot: 2 }, out: { mDot: 0 } };
    expect(entry(ports, 'out').mDot).toBe(0);
    expect(() => entry(ports, 'exhaust', 'ports')).toThrow('ports: no entry "exhaust" (it has "in", "out")');
    expect(() => entry({}, 'x')).toThrow('record: no entry "x" (it has none)');
  });

  it('defined passes null and falsy values through and refuses undefined', () => {
    expect(defined(null, 'time')).toBeNull();
    expect(defined('', 'text')).toBe('');
    expect(() => defined([1, 2].find((v) => v > 5), 'a value above 5')).toThrow('a value above 5: missing');
  });
});
