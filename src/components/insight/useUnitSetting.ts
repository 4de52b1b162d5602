/**
 * One unit setting edited in a form (the limits of UnitLimitsForm.tsx, the drift check's k and h of
 * DriftSettingsForm.tsx): load it from `url`, hold the fields as typed, save them with PUT, and the
 * message under the form. The answer carries the setting under `key` ({ limits } or { settings }).
 */
import { useEffect, useState } from 'react';
import { call, messageOf, type Message } from '~/components/api';

export interface UnitSettingSpec<T, F> {
  url: string;
  key: string;
  /** The fields before the setting has come. */
  empty: F;
  toFields: (value: T) => F;
  toBody: (fields: F) => unknown;
  /** The message after a save. */
  saved: string;
}

export function useUnitSetting<T, F>({ url, key, empty, toFields, toBody, saved }: UnitSettingSpec<T, F>) {
  const [value, setValue] = useState<T | null>(null);
  const [fields, setFields] = useState<F>(empty);
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  const show = (v: T) => {
    setValue(v);
    setFields(toFields(v));
  };

  useEffect(() => {
    let live = true;
    setValue(null);
    call<Record<string, T>>(url)
      .then((out) => live && show(out[key]!))
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [url]);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    try {
      const out = await call<Record<string, T>>(url, 'PUT', toBody(fields));
      show(out[key]!);
      setMessage({ ok: true, text: saved });
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  const setField = (k: keyof F) => (v: string) => setFields((f) => ({ ...f, [k]: v }));
  return { value, fields, setField, message, busy, save };
}
