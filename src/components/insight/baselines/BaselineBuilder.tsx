import { useEffect, useState } from 'react';
import { StateMark } from '~/components/StateMark';
import { Notice } from '~/components/plant/common';
import { call, messageOf, type Message } from '~/components/api';
import BaselineDetail from './BaselineDetail';
import DriftSettingsForm from './DriftSettingsForm';
import { BASELINE_LOOK, dayEndIso, dayOf, dayStartIso, pct } from './looks';
import { ALL_TERMS, TERM_LABELS, type BaselineSummary, type BaselineTerm } from './types';

export interface UnitChoice {
  id: string;
  name: string;
  kind: string;
  siteName: string;
  timeZone: string;
}

interface Span {
  first: string | null;
  last: string | null;
  hours: number;
  steady: number;
}

const PRESETS: { id: string; label: string; terms: BaselineTerm[] }[] = [
  { id: 'linear', label: 'Linear: load and ambient temperature', terms: ['load', 'T_amb'] },
  { id: 'quadratic', label: 'Quadratic: load, ambient temperature, their squares and product', terms: ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'] },
  { id: 'load', label: 'Load only (fixed dead state)', terms: ['load'] },
  { id: 'load2', label: 'Load and load² (fixed dead state)', terms: ['load', 'load^2'] },
];

/** Pick a unit, a reference period and terms; fit; read the statistics; accept or discard. */
export default function BaselineBuilder({ units, initialUnitId, initialFrom = null }: { units: UnitChoice[]; initialUnitId: string | null; initialFrom?: string | null }) {
  const [unitId, setUnitId] = useState(initialUnitId && units.some((u) => u.id === initialUnitId) ? initialUnitId : (units[0]?.id ?? ''));
  const unit = units.find((u) => u.id === unitId) ?? null;
  const [span, setSpan] = useState<Span | null>(null);
  const [versions, setVersions] = useState<BaselineSummary[] | null>(null);
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [terms, setTerms] = useState<BaselineTerm[]>(['load', 'T_amb']);
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);
  const [fitted, setFitted] = useState<string | null>(null);

  useEffect(() => {
    if (!unit) return;
    let live = true;
    setSpan(null);
    setVersions(null);
    setFitted(null);
    call<{ versions: BaselineSummary[]; span: Span }>(`/api/units/${unit.id}/baselines`)
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
  }, [unitId]);

  function toggle(t: BaselineTerm) {
    setTerms((cur) => (cur.includes(t) ? cur.filter((x) => x !== t) : ALL_TERMS.filter((x) => x === t || cur.includes(x))));
  }

  async function fit(e: React.FormEvent) {
    e.preventDefault();
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

  if (!units.length) {
    return (
      <p className="card text-sm text-ink-faint">
        No units yet. Units come from the <a href="/plant">plant model</a>; a baseline needs the unit's computed hours.
      </p>
    );
  }

  return (
    <div className="space-y-6">
      <form className="card space-y-4" onSubmit={fit} aria-label="Fit a baseline">
        <div className="grid gap-4 sm:grid-cols-3">
          <div>
            <label className="label" htmlFor="b-unit">
              Unit
            </label>
            <select id="b-unit" className="field" value={unitId} onChange={(e) => setUnitId(e.target.value)}>
              {units.map((u) => (
                <option key={u.id} value={u.id}>
                  {u.siteName} · {u.name}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="b-from">
              First day {unit ? `(${unit.timeZone})` : ''}
            </label>
            <input id="b-from" type="date" className="field" value={from} onChange={(e) => setFrom(e.target.value)} required />
          </div>
          <div>
            <label className="label" htmlFor="b-to">
              Last day
            </label>
            <input id="b-to" type="date" className="field" value={to} onChange={(e) => setTo(e.target.value)} required />
          </div>
        </div>
        <p className="text-sm text-ink-soft" data-testid="hour-span" role="status">
          {span === null
            ? 'Looking up the unit’s hours…'
            : span.hours === 0
              ? 'This unit has no computed hours yet.'
              : `${span.hours} computed hours from ${dayOf(span.first!, unit!.timeZone)} to ${dayOf(span.last!, unit!.timeZone)}, ${span.steady} of them steady. Only steady hours are fitted.`}
        </p>
        <fieldset>
          <legend className="label">Terms (besides the intercept)</legend>
          <div className="mb-2 flex flex-wrap gap-2">
            {PRESETS.map((p) => (
              <button key={p.id} type="button" className="btn" onClick={() => setTerms(p.terms)} aria-pressed={p.terms.join() === terms.join()}>
                {p.label}
              </button>
            ))}
          </div>
          <div className="flex flex-wrap gap-4 text-sm">
            {ALL_TERMS.map((t) => (
              <label key={t} className="flex items-center gap-1">
                <input type="checkbox" checked={terms.includes(t)} onChange={() => toggle(t)} /> {TERM_LABELS[t]}
              </label>
            ))}
          </div>
          <p className="mt-1 text-xs text-ink-faint">
            The ambient temperature is the hour's dead-state temperature T0; where the site keeps T0 fixed, leave the ambient-temperature terms out.
          </p>
        </fieldset>
        <Notice message={message} />
        <button type="submit" className="btn btn-primary" disabled={busy || !unit}>
          {busy ? 'Fitting…' : 'Fit baseline'}
        </button>
      </form>

      {fitted && <BaselineDetail key={fitted} baselineId={fitted} canEdit />}

      {unit && (
        <section className="card">
          <h2 className="mb-2">Versions of {unit.name}</h2>
          {versions === null ? (
            <p className="text-sm text-ink-faint">Loading…</p>
          ) : versions.length === 0 ? (
            <p className="text-sm text-ink-faint">No baseline yet for this unit.</p>
          ) : (
            <table className="grid-table">
              <thead>
                <tr>
                  <th className="num">Version</th>
                  <th>Status</th>
                  <th>Period</th>
                  <th className="num">Hours</th>
                  <th className="num">CV(RMSE) destruction [%]</th>
                  <th>By</th>
                </tr>
              </thead>
              <tbody>
                {versions.map((v) => {
                  const look = BASELINE_LOOK[v.status]!;
                  return (
                    <tr key={v.id}>
                      <td className="num">
                        <a href={`/baselines/${v.id}`}>v{v.version}</a>
                      </td>
                      <td>
                        <StateMark shape={look.shape} className={look.className} label={look.label} />
                      </td>
                      <td>
                        {dayOf(v.periodFrom, v.timeZone)} to {dayOf(new Date(new Date(v.periodTo).getTime() - 1).toISOString(), v.timeZone)}
                      </td>
                      <td className="num">{v.hours}</td>
                      <td className="num">{pct(v.destruction.stats.cvRmse)}</td>
                      <td>{v.createdBy ?? ''}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          )}
        </section>
      )}
      {unit && <DriftSettingsForm unitId={unit.id} canEdit />}
    </div>
  );
}
