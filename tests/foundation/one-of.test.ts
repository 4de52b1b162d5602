import { describe, expect, it } from 'vitest';
import { isOneOf } from '~/lib/one-of';
import { isUnitKind } from '~/lib/kinds';
import { isRole } from '~/lib/roles';
import { isHourState } from '~/lib/hour-states';

describe('isOneOf', () => {
  const LIST = ['steady', 'idle'] as const;
  it('admits the names of the list and nothing else', () => {
    expect(isOneOf(LIST, 'idle')).toBe(true);
    expect(isOneOf(LIST, 'Idle')).toBe(false);
    expect(isOneOf(LIST, '')).toBe(false);
    expect(isOneOf(LIST, 'length')).toBe(false);
  });
  it('refuses what is not a string', () => {
    for (const v of [undefined, null, 0, ['idle'], { idle: true }]) expect(isOneOf(LIST, v)).toBe(false);
  });
  it('is the guard behind the named ones', () => {
    expect([isUnitKind('turbine'), isUnitKind('mixer-x'), isRole('planner'), isRole('root'), isHourState('suspect'), isHourState(3)]).toEqual([true, false, true, false, true, false]);
  });
});
