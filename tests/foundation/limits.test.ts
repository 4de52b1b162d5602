import { expect, it } from 'vitest';
import { PortModelSchema, UnitModelSchema } from '~/lib/plant/model';
import { TagLimitsSchema } from '~/lib/plant/tag-limits';
import { LinkInput } from '~/server/services/plant-links';
import { PortInput, SiteInput, UnitCreateInput, UnitUpdateInput } from '~/server/services/plant';
import { InviteInput } from '~/server/services/users';
import { NewTokenInput } from '~/server/services/tokens';
import { AcknowledgeInput, CloseInput } from '~/server/services/notices';

const HUGE = 'x'.repeat(2_000_000);

/**
 * Every stored text has a cap: for each schema a valid value is accepted, and the same value with
 * one text field made 2,000,000 characters long is refused.
 */
it('refuses a 2,000,000-character value in every stored text field', () => {
  const U = '00000000-0000-4000-8000-000000000000';
  type Schema = { safeParse: (v: unknown) => { success: boolean } };
  const cases: [string, Schema, Record<string, unknown>, (v: Record<string, unknown>) => Record<string, unknown>][] = [
    ['person name', InviteInput, { name: 'A', email: 'a@example.test', role: 'operator' }, (v) => ({ ...v, name: HUGE })],
    ['person e-mail', InviteInput, { name: 'A', email: 'a@example.test', role: 'operator' }, (v) => ({ ...v, email: `${HUGE}@example.test` })],
    ['site name', SiteInput, { name: 'S', timeZone: 'UTC' }, (v) => ({ ...v, name: HUGE })],
    ['site time zone', SiteInput, { name: 'S', timeZone: 'UTC' }, (v) => ({ ...v, timeZone: HUGE })],
    ['site T0 tag', SiteInput, { name: 'S', timeZone: 'UTC', T0Tag: { tag: 'TT', unit: 'degC' } }, (v) => ({ ...v, T0Tag: { tag: HUGE, unit: 'degC' } })],
    ['site T0 unit', SiteInput, { name: 'S', timeZone: 'UTC', T0Tag: { tag: 'TT', unit: 'degC' } }, (v) => ({ ...v, T0Tag: { tag: 'TT', unit: HUGE } })],
    ['site display locale', SiteInput, { name: 'S', timeZone: 'UTC', displayUnits: { locale: 'en-GB' } }, (v) => ({ ...v, displayUnits: { locale: HUGE } })],
    ['unit name', UnitCreateInput, { name: 'P', kind: 'pump' }, (v) => ({ ...v, name: HUGE })],
    ['unit description', UnitCreateInput, { name: 'P', kind: 'pump', description: 'd' }, (v) => ({ ...v, description: HUGE })],
    ['unit parameter value', UnitCreateInput, { name: 'P', kind: 'pump', parameters: { note: 'n' } }, (v) => ({ ...v, parameters: { note: HUGE } })],
    ['unit parameter name', UnitCreateInput, { name: 'P', kind: 'pump', parameters: { note: 1 } }, (v) => ({ ...v, parameters: { [HUGE]: 1 } })],
    ['unit rename', UnitUpdateInput, { name: 'Q' }, () => ({ name: HUGE })],
    ['unit parameter update', UnitUpdateInput, { parameters: { note: 'n' } }, () => ({ parameters: { note: HUGE } })],
    ['port name', PortInput, { name: 'in', slot: 'inlet' }, (v) => ({ ...v, name: HUGE })],
    ['port slot', PortInput, { name: 'in', slot: 'inlet' }, (v) => ({ ...v, slot: HUGE })],
    ['link tag', LinkInput, { unitId: U, quantity: 'power', tag: 'JT-1', unit: 'kW' }, (v) => ({ ...v, tag: HUGE })],
    ['link unit', LinkInput, { unitId: U, quantity: 'power', tag: 'JT-1', unit: 'kW' }, (v) => ({ ...v, unit: HUGE })],
    ['model unit parameter', UnitModelSchema, { name: 'P', kind: 'pump', parameters: { note: 'n' } }, (v) => ({ ...v, parameters: { note: HUGE } })],
    ['model port slot', PortModelSchema, { name: 'in', slot: 'inlet' }, (v) => ({ ...v, slot: HUGE })],
    ['model tag limits name', TagLimitsSchema, { name: 'TG1_MW', frozenLimit_s: 7200 }, (v) => ({ ...v, name: HUGE })],
    ['token name', NewTokenInput, { name: 'nightly', role: 'operator' }, (v) => ({ ...v, name: HUGE })],
    ['notice acknowledgement', AcknowledgeInput, { comment: 'seen' }, () => ({ comment: HUGE })],
    ['notice closing comment', CloseInput, { comment: 'fixed' }, () => ({ comment: HUGE })],
  ];
  const validRefused = cases.filter(([, schema, valid]) => !schema.safeParse(valid).success).map(([what]) => what);
  expect(validRefused).toEqual([]);
  const hugeAccepted = cases.filter(([, schema, valid, huge]) => schema.safeParse(huge(valid)).success).map(([what]) => what);
  expect(hugeAccepted).toEqual([]);
});
