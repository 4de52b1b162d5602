import { useState } from 'react';
import { DEFAULT_RULE_HOURS, normallyIdleText, type NormallyIdle } from '~/lib/plant/idle';
import { idleDeclaration, idleFormState, type IdleFormState } from '~/lib/plant/idle-form';
import { Notice } from './common';
import { call, messageOf, type Message } from '~/components/api';
import { IdleWindowsFields, WhileRunningFields } from './IdleWindowsFields';

/** The form's fields below "This unit is normally idle": when, while which units, and the hours. */
function DeclarationFields({ unitId, otherUnits, s, update }: { unitId: string; otherUnits: string[]; s: IdleFormState; update: (f: (s: IdleFormState) => IdleFormState) => void }) {
  return (
    <>
      <div className="flex flex-wrap gap-4 text-sm" role="radiogroup" aria-label="When">
        <label className="flex items-center gap-2">
          <input type="radio" name={`idle-when-${unitId}`} checked={s.always} onChange={() => update((x) => ({ ...x, always: true }))} /> always
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name={`idle-when-${unitId}`} checked={!s.always} onChange={() => update((x) => ({ ...x, always: false }))} /> at these times of the week
        </label>
      </div>
      {!s.always && <IdleWindowsFields windows={s.windows} setWindows={(f) => update((x) => ({ ...x, windows: f(x.windows) }))} />}
      {otherUnits.length > 0 && <WhileRunningFields otherUnits={otherUnits} waitFor={s.waitFor} setWaitFor={(f) => update((x) => ({ ...x, waitFor: f(x.waitFor) }))} />}
      <div>
        <label className="label" htmlFor={`idle-hours-${unitId}`}>
          Hours in a row before a notice [h]
        </label>
        <input id={`idle-hours-${unitId}`} className="field w-24 text-right" inputMode="numeric" value={s.hours} onChange={(e) => update((x) => ({ ...x, hours: e.target.value }))} />
      </div>
    </>
  );
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
  const [s, update] = useState<IdleFormState>(() => idleFormState(initial));
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    const normallyIdle = idleDeclaration(s, initial);
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
            <input type="checkbox" checked={s.on} onChange={(e) => update((x) => ({ ...x, on: e.target.checked }))} /> This unit is normally idle
          </label>
          {s.on && <DeclarationFields unitId={unitId} otherUnits={otherUnits} s={s} update={update} />}
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
