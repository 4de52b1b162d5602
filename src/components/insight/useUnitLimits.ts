/**
 * The data of a unit's limits form (UnitLimitsForm.tsx): the saved limits, the fields as typed, the
 * message under the form, and saving (useUnitSetting.ts). Shaping in src/lib/views/unit-limits.ts.
 */
import { limitsBody, limitsFields, type UnitLimits, type UnitLimitsFields } from '~/lib/views/unit-limits';
import { useUnitSetting } from './useUnitSetting';

export function useUnitLimits(unitId: string) {
  const { value: limits, ...rest } = useUnitSetting<UnitLimits, UnitLimitsFields>({
    url: `/api/units/${unitId}/limits`,
    key: 'limits',
    empty: { cost: '', eff: '', hours: '3' },
    toFields: limitsFields,
    toBody: limitsBody,
    saved: 'Saved. The unit’s hours are checked against the limits.',
  });
  return { limits, ...rest };
}
