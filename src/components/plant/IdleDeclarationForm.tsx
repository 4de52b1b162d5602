import { useState } from 'react';
import { DEFAULT_RULE_HOURS, WEEKDAYS, normallyIdleText, type NormallyIdle, type Weekday } from '~/lib/plant/idle';
import { Notice } from './common';
import { call, messageOf, type Message } from '~/components/api';

const DAY_LABELS: Record<Weekday, string> = { mon: 'Mon', tue: 'Tue', wed: 'Wed', thu: 'Thu', fri: 'Fri', sat: 'Sat', sun: 'Sun' };
const HOURS = Array.from({ length: 25 }, (_, h) => `${String(h).padStart(2, '0')}:00`);

interface WindowRow {
  days: Weekday[];
  from: string;
  to: string;
}

/**
 * The unit's normally-idle declaration on its plant model page (admins edit, everyone reads): always
 * or weekly windows in the site's clock, optionally only while other units run, and the hours of
 * running that open a "running while idle" notice.
 */
export default function IdleDeclarationForm({
  siteId,
  unitId,
  timeZone,
  otherUnits,
  initial,
  canEdit,
}: {
  siteId: string;
  unitId: string;
  timeZone: string;
  otherUnits: string[];
  initial: NormallyIdle | null;
  canEdit: boolean;
}) {
  const [saved, setSaved] = useState<NormallyIdle | null>(initial);
  const [on, setOn] = useState(initial !== null);
  const [always, setAlways] = useState(initial === null || initial.when === 'always');
  const [windows, setWindows] = useState<WindowRow[]>(
    initial && initial.when !== 'always'
      ? initial.when.map((w) => ({ days: w.days ?? [...WEEKDAYS], from: w.from ?? '00:00', to: w.to ?? '24:00' }))
      : [{ days: ['sat', 'sun'], from: '00:00', to: '24:00' }],
  );
  const [waitFor, setWaitFor] = useState<string[]>(initial?.whileRunning ?? []);
  const [hours, setHours] = useState(String(initial?.hours ?? DEFAULT_RULE_HOURS));
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  const setWindow = (i: number, w: Partial<WindowRow>) => setWindows((ws) => ws.map((x, j) => (j === i ? { ...x, ...w } : x)));

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    const n = Number(hours);
    const normallyIdle: NormallyIdle | null = on
      ? {
          when: always ? 'always' : windows.map((w) => ({ ...(w.days.length === 7 ? {} : { days: w.days }), from: w.from, to: w.to })),
          ...(waitFor.length ? { whileRunning: waitFor } : {}),
          ...(n !== DEFAULT_RULE_HOURS || initial?.hours !== undefined ? { hours: n } : {}),
        }
      : null;
    try {
      await call(`/api/sites/${siteId}/units/${unitId}`, 'PATCH', { normallyIdle });
      setSaved(normallyIdle);
      setMessage({ ok: true, text: normallyIdle ? 'Saved. The unit’s hours are checked against it.' : 'Saved: the unit is not declared idle.' });
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card mt-6" aria-label="Normally idle">
      <h2 className="mb-1">Normally idle</h2>
      <p className="mb-3 text-sm text-ink-soft">
        For units that should stand still in normal operation: let-down and bypass valves, vents, standby pumps. Steady or unsettled hours of such a
        unit in its idle time, more than the hours set below in a row, open a notice “running while idle” with the cost of its destruction, mailed to
        planners and energy leads. It stays open until a person closes it. Times are the site’s clock ({timeZone}).
      </p>
      <p className="mb-3 text-sm" data-testid="idle-now">
        Now: {saved ? <>normally idle {normallyIdleText(saved)}; more than {saved.hours ?? DEFAULT_RULE_HOURS} hours running open a notice</> : 'not declared idle'}
      </p>
      <form onSubmit={save} className="space-y-3">
        <fieldset disabled={!canEdit} className="space-y-3">
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={on} onChange={(e) => setOn(e.target.checked)} /> This unit is normally idle
          </label>
          {on && (
            <>
              <div className="flex flex-wrap gap-4 text-sm" role="radiogroup" aria-label="When">
                <label className="flex items-center gap-2">
                  <input type="radio" name={`idle-when-${unitId}`} checked={always} onChange={() => setAlways(true)} /> always
                </label>
                <label className="flex items-center gap-2">
                  <input type="radio" name={`idle-when-${unitId}`} checked={!always} onChange={() => setAlways(false)} /> at these times of the week
                </label>
              </div>
              {!always && (
                <ul className="space-y-2">
                  {windows.map((w, i) => (
                    <li key={i} className="flex flex-wrap items-center gap-2 text-sm" data-testid="idle-window">
                      {WEEKDAYS.map((d) => (
                        <label key={d} className="flex items-center gap-1">
                          <input
                            type="checkbox"
                            checked={w.days.includes(d)}
                            onChange={(e) => setWindow(i, { days: e.target.checked ? WEEKDAYS.filter((x) => x === d || w.days.includes(x)) : w.days.filter((x) => x !== d) })}
                          />
                          {DAY_LABELS[d]}
                        </label>
                      ))}
                      <label className="ml-2 flex items-center gap-1">
                        from
                        <select className="field w-24" value={w.from} onChange={(e) => setWindow(i, { from: e.target.value })}>
                          {HOURS.slice(0, 24).map((h) => (
                            <option key={h}>{h}</option>
                          ))}
                        </select>
                      </label>
                      <label className="flex items-center gap-1">
                        to
                        <select className="field w-24" value={w.to} onChange={(e) => setWindow(i, { to: e.target.value })}>
                          {HOURS.slice(1).map((h) => (
                            <option key={h}>{h}</option>
                          ))}
                        </select>
                      </label>
                      {windows.length > 1 && (
                        <button type="button" className="btn" onClick={() => setWindows((ws) => ws.filter((_, j) => j !== i))}>
                          Remove
                        </button>
                      )}
                    </li>
                  ))}
                  <li>
                    <button type="button" className="btn" onClick={() => setWindows((ws) => [...ws, { days: ['mon', 'tue', 'wed', 'thu', 'fri'], from: '22:00', to: '06:00' }])}>
                      Add a time
                    </button>
                    <span className="ml-2 text-xs text-ink-faint">An end at or before the start runs over midnight.</span>
                  </li>
                </ul>
              )}
              {otherUnits.length > 0 && (
                <fieldset className="text-sm">
                  <legend className="label">Only while these units run (e.g. the turbine a bypass valve stands in for)</legend>
                  <div className="flex flex-wrap gap-3">
                    {otherUnits.map((u) => (
                      <label key={u} className="flex items-center gap-1">
                        <input type="checkbox" checked={waitFor.includes(u)} onChange={(e) => setWaitFor((xs) => (e.target.checked ? [...xs, u] : xs.filter((x) => x !== u)))} />
                        {u}
                      </label>
                    ))}
                  </div>
                </fieldset>
              )}
              <div>
                <label className="label" htmlFor={`idle-hours-${unitId}`}>
                  Hours in a row before a notice [h]
                </label>
                <input id={`idle-hours-${unitId}`} className="field w-24 text-right" inputMode="numeric" value={hours} onChange={(e) => setHours(e.target.value)} />
              </div>
            </>
          )}
          {canEdit && (
            <button type="submit" className="btn" disabled={busy}>
              Save idle declaration
            </button>
          )}
        </fieldset>
      </form>
      <div className="mt-2">
        <Notice message={message} />
      </div>
    </section>
  );
}
