import { useEffect, useState } from 'react';
import { call, messageOf, type Message } from '~/components/api';
import { dayEndIso, dayOf, dayStartIso } from './looks';
import type { BaselineSummary, BaselineTerm } from './types';
import type { HourSpan } from '~/lib/views/baseline-fit-text';

/** The unit of the builder: enough to name it and read its days. */
interface UnitRef {
  id: string;
  timeZone: string;
}

/**
 * A unit's baseline versions and hour span (GET /api/units/{unitId}/baselines, read again when the
 * unit changes; the reference period opens on the span, or on `initialFrom` for the unit the page was
 * opened for), and fitting a new version (POST to the same address).
 */
export function useBaselineFit(unit: UnitRef | null, initialUnitId: string | null, initialFrom: string | null) {
  const [span, setSpan] = useState<HourSpan | null>(null);
  const [versions, setVersions] = useState<BaselineSummary[] | null>(null);
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);
  const [fitted, setFitted] = useState<string | null>(null);

  useEffect(() => {
    if (!unit) return;
    let live = true;
    setSpan(null);
    setVersions(null);
    setFitted(null);
    call<{ versions: BaselineSummary[]; span: HourSpan }>(`/api/units/${unit.id}/baselines`)
      .then((d) => {
        if (!live) return;
        setSpan(d.span);
        setVersions(d.versions);
        if (d.span.first && d.span.last) {
          // A notice closed as 'the new normal' links here with the day the new reference period starts.
          setFrom(initialFrom && unit.id === initialUnitId ? initialFrom : dayOf(d.span.first, unit.timeZone));
          setTo(dayOf(d.span.last, unit.timeZone));
        }
      })
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [unit?.id]);

  async function fit(terms: BaselineTerm[]) {
    if (!unit) return;
    setMessage(null);
    const periodFrom = dayStartIso(from, unit.timeZone);
    const periodTo = dayEndIso(to, unit.timeZone);
    if (!periodFrom || !periodTo) return setMessage({ ok: false, text: 'Give the first and the last day of the reference period (yyyy-mm-dd).' });
    if (!terms.length) return setMessage({ ok: false, text: 'Choose at least one term.' });
    setBusy(true);
    try {
      const { baseline } = await call<{ baseline: BaselineSummary }>(`/api/units/${unit.id}/baselines`, 'POST', { periodFrom, periodTo, terms });
      setFitted(baseline.id);
      setVersions((v) => [baseline, ...(v ?? [])]);
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  return { span, versions, from, setFrom, to, setTo, message, busy, fitted, fit };
}
