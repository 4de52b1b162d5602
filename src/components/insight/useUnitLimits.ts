/**
 * The data of a unit's limits form (UnitLimitsForm.tsx): the saved limits, the fields as typed, the
 * message under the form, and saving. Shaping in src/lib/views/unit-limits.ts.
 */
import { useEffect, useState } from 'react';
import { call, messageOf, type Message } from '~/components/api';
import { limitsBody, limitsFields, type UnitLimits, type UnitLimitsFields } from '~/lib/views/unit-limits';

export function useUnitLimits(unitId: string) {
  const [limits, setLimits] = useState<UnitLimits | null>(null);
  const [fields, setFields] = useState<UnitLimitsFields>({ cost: '', eff: '', hours: '3' });
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  const show = (l: UnitLimits) => {
    setLimits(l);
    setFields(limitsFields(l));
  };

  useEffect(() => {
    call<{ limits: UnitLimits }>(`/api/units/${unitId}/limits`)
      .then(({ limits }) => show(limits))
      .catch((e) => setMessage(messageOf(e)));
  }, [unitId]);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    try {
      const out = await call<{ limits: UnitLimits }>(`/api/units/${unitId}/limits`, 'PUT', limitsBody(fields));
      show(out.limits);
      setMessage({ ok: true, text: 'Saved. The unit’s hours are checked against the limits.' });
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  const setField = (k: keyof UnitLimitsFields) => (v: string) => setFields((f) => ({ ...f, [k]: v }));
  return { limits, fields, setField, message, busy, save };
}
