import { useEffect, useState } from 'react';
import { Notice } from '../plant/common';
import { call, messageOf, type Message } from '~/components/api';

interface Limits {
  maxCost_per_day: number | null;
  minEfficiency: number | null;
  hours: number;
  currency: string;
  normallyIdle: string | null;
  updatedAt: string | null;
}

const num = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));

/**
 * A unit's limits on the cost of destruction per day and on exergy efficiency; more than the set hours
 * in a row across a limit open a "limit crossed" notice. Energy leads and admins change them.
 */
export default function UnitLimitsForm({ unitId, canEdit }: { unitId: string; canEdit: boolean }) {
  const [limits, setLimits] = useState<Limits | null>(null);
  const [cost, setCost] = useState('');
  const [eff, setEff] = useState('');
  const [hours, setHours] = useState('3');
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  const show = (l: Limits) => {
    setLimits(l);
    setCost(l.maxCost_per_day === null ? '' : String(l.maxCost_per_day));
    setEff(l.minEfficiency === null ? '' : String(Math.round(l.minEfficiency * 1000) / 10));
    setHours(String(l.hours));
  };

  useEffect(() => {
    call<{ limits: Limits }>(`/api/units/${unitId}/limits`)
      .then(({ limits }) => show(limits))
      .catch((e) => setMessage(messageOf(e)));
  }, [unitId]);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    const pct = num(eff);
    try {
      const out = await call<{ limits: Limits }>(`/api/units/${unitId}/limits`, 'PUT', {
        maxCost_per_day: num(cost),
        minEfficiency: pct === null ? null : pct / 100,
        hours: Number(hours),
      });
      show(out.limits);
      setMessage({ ok: true, text: 'Saved. The unit’s hours are checked against the limits.' });
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card mt-6" aria-label="Limits">
      <h2 className="mb-1">Limits</h2>
      <p className="mb-3 text-sm text-ink-soft">
        A cost of destruction per day above which, or an exergy efficiency below which, an hour crosses (efficiency: steady hours only). More than the
        set hours in a row across a limit open a notice “limit crossed”, mailed to planners and energy leads; it stays open until a person closes it.
        Leave a limit empty for none.
        {limits?.normallyIdle && <> This unit is declared normally idle {limits.normallyIdle} (on its plant model page).</>}
      </p>
      {limits === null && !message ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : (
        <form className="flex flex-wrap items-end gap-3" onSubmit={save}>
          <div>
            <label className="label" htmlFor={`lim-cost-${unitId}`}>
              Cost of destruction above [{limits?.currency ?? ''}/day]
            </label>
            <input id={`lim-cost-${unitId}`} className="field w-32 text-right" inputMode="decimal" value={cost} onChange={(e) => setCost(e.target.value)} disabled={!canEdit} />
          </div>
          <div>
            <label className="label" htmlFor={`lim-eff-${unitId}`}>
              Exergy efficiency below [%]
            </label>
            <input id={`lim-eff-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={eff} onChange={(e) => setEff(e.target.value)} disabled={!canEdit} />
          </div>
          <div>
            <label className="label" htmlFor={`lim-hours-${unitId}`}>
              Hours in a row [h]
            </label>
            <input id={`lim-hours-${unitId}`} className="field w-20 text-right" inputMode="numeric" value={hours} onChange={(e) => setHours(e.target.value)} disabled={!canEdit} />
          </div>
          {canEdit && (
            <button type="submit" className="btn" disabled={busy}>
              Save limits
            </button>
          )}
        </form>
      )}
      <div className="mt-2">
        <Notice message={message} />
      </div>
    </section>
  );
}
