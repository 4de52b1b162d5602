import { describe, expect, it } from 'vitest';
import { NormallyIdleSchema, type NormallyIdle } from '~/lib/plant/idle';
import { FIRST_WINDOW, idleDeclaration, idleFormState, tickDay } from '~/lib/plant/idle-form';

describe('the normally-idle form', () => {
  it('starts undeclared on the weekend row with the default hours', () => {
    const s = idleFormState(null);
    expect(s).toEqual({ on: false, always: true, windows: [FIRST_WINDOW], waitFor: [], hours: '3' });
    expect(idleDeclaration(s, null)).toBeNull();
  });

  it('self-consistency: a stored declaration comes back unchanged through the form', () => {
    const stored: NormallyIdle = { when: [{ days: ['mon', 'fri'], from: '22:00', to: '06:00' }, { from: '00:00', to: '24:00' }], whileRunning: ['ST 2'], hours: 3 };
    const s = idleFormState(stored);
    expect(s.windows[1]?.days).toHaveLength(7);
    const sent = idleDeclaration(s, stored);
    expect(sent).toEqual({ when: [{ days: ['mon', 'fri'], from: '22:00', to: '06:00' }, { from: '00:00', to: '24:00' }], whileRunning: ['ST 2'], hours: 3 });
    expect(NormallyIdleSchema.safeParse(sent).success).toBe(true);
  });

  it('leaves the default hours out of a new declaration, and sends other hours', () => {
    const s = { ...idleFormState(null), on: true };
    expect(idleDeclaration(s, null)).toEqual({ when: 'always' });
    expect(idleDeclaration({ ...s, always: false, hours: '6' }, null)).toEqual({ when: [{ days: ['sat', 'sun'], from: '00:00', to: '24:00' }], hours: 6 });
  });

  it('ticks days in week order and unticks them', () => {
    expect(tickDay(['sun', 'mon'], 'wed', true)).toEqual(['mon', 'wed', 'sun']);
    expect(tickDay(['mon', 'wed'], 'mon', false)).toEqual(['wed']);
  });
});
