import { describe, expect, it } from 'vitest';
import { pickRange, shiftDay, stepPeriod, type PeriodSteps } from '~/lib/views/period-step';

/** Calendar facts (Gregorian calendar): 2024 is a leap year, so 28 Feb 2024 + 2 days is 1 Mar 2024. */
describe('the period picker moves', () => {
  const week: PeriodSteps = { firstDay: '2024-03-04', lastDay: '2024-03-10', prevAnchor: '2024-02-26', nextAnchor: '2024-03-11', hours: 168 };

  it('Gregorian calendar: local dates move by whole days across month and leap-day ends', () => {
    expect(shiftDay('2024-02-28', 2)).toBe('2024-03-01');
    expect(shiftDay('2023-02-28', 1)).toBe('2023-03-01');
    expect(shiftDay('2024-01-03', -7)).toBe('2023-12-27');
  });

  it('self-consistency: a named range steps to the anchors the server answered', () => {
    expect(stepPeriod({ range: 'week', anchor: '2024-03-04' }, week, -1)).toEqual({ range: 'week', anchor: '2024-02-26' });
    expect(stepPeriod({ range: 'week' }, week, 1)).toEqual({ range: 'week', anchor: '2024-03-11' });
    expect(stepPeriod({ range: 'week' }, null, 1)).toBeNull();
  });

  it('self-consistency: a custom period moves by its own length; 23 h (a spring-forward day) rounds to one day', () => {
    const custom = { range: 'custom' as const, from: '2024-03-04', to: '2024-03-10' };
    expect(stepPeriod(custom, week, 1)).toEqual({ range: 'custom', from: '2024-03-11', to: '2024-03-17' });
    expect(stepPeriod(custom, week, -1)).toEqual({ range: 'custom', from: '2024-02-26', to: '2024-03-03' });
    const day = { ...week, firstDay: '2024-03-31', lastDay: '2024-03-31', hours: 23 };
    expect(stepPeriod(custom, day, 1)).toEqual({ range: 'custom', from: '2024-04-01', to: '2024-04-01' });
  });

  it('self-consistency: picking a range keeps the form dates for custom and anchors the others', () => {
    expect(pickRange('custom', { range: 'week' }, week, '2024-01-01', '2024-01-05')).toEqual({ range: 'custom', from: '2024-01-01', to: '2024-01-05' });
    expect(pickRange('custom', { range: 'week' }, week, '', '')).toEqual({ range: 'custom', from: '2024-03-04', to: '2024-03-10' });
    expect(pickRange('month', { range: 'custom', from: '2024-05-02', to: '2024-05-09' }, week, '', '')).toEqual({ range: 'month', anchor: '2024-05-02' });
    expect(pickRange('day', { range: 'week', anchor: '2024-03-06' }, week, '', '')).toEqual({ range: 'day', anchor: '2024-03-06' });
    expect(pickRange('year', { range: 'week' }, week, '', '')).toEqual({ range: 'year', anchor: '2024-03-04' });
  });
});
