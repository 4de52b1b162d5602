import { describe, expect, it } from 'vitest';
import { counted, nonZeroParts, plural } from '~/lib/counts';
import { THIN_SPACE } from '~/lib/format';

describe('count sentences (self-consistency: English grammar of number)', () => {
  it('reads naturally at 0, at 1 and above', () => {
    expect(counted(0, 'drift notice', 'drift notices')).toBe('no drift notices');
    expect(counted(1, 'drift notice', 'drift notices')).toBe('1 drift notice');
    expect(counted(2, 'drift notice', 'drift notices')).toBe('2 drift notices');
    expect(counted(12345, 'file', 'files')).toBe(`12${THIN_SPACE}345 files`); // grouped as every number (src/lib/format.ts, SI Brochure 5.4.4)
  });

  it('takes its own words for none', () => {
    expect(counted(0, 'hour', 'hours', 'not one hour')).toBe('not one hour');
  });

  it('names the singular only for exactly one', () => {
    expect(plural(1, 'row', 'rows')).toBe('row');
    expect(plural(0, 'row', 'rows')).toBe('rows');
    expect(plural(2, 'row', 'rows')).toBe('rows');
  });

  it('leaves out the parts that are zero', () => {
    expect(nonZeroParts([[2, 'link missing', 'links missing'], [0, 'conflict', 'conflicts']])).toBe('2 links missing');
    expect(nonZeroParts([[1, 'link missing', 'links missing'], [1, 'conflict', 'conflicts']])).toBe('1 link missing, 1 conflict');
    expect(nonZeroParts([[0, 'a', 'as']])).toBe('');
  });
});
