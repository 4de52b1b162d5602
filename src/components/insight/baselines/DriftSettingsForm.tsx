import { useEffect, useState } from 'react';
import { Notice } from '~/components/plant/common';
import { call, messageOf, type Message } from '~/components/api';

interface Settings {
  k: number;
  h: number;
  isDefault: boolean;
  updatedAt: string | null;
}

/** A unit's CUSUM k and h; energy leads and admins change them, everyone reads them. */
export default function DriftSettingsForm({ unitId, canEdit }: { unitId: string; canEdit: boolean }) {
  const [settings, setSettings] = useState<Settings | null>(null);
  const [k, setK] = useState('');
  const [h, setH] = useState('');
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    let live = true;
    setSettings(null);
    call<{ settings: Settings }>(`/api/units/${unitId}/drift-settings`)
      .then(({ settings }) => {
        if (!live) return;
        setSettings(settings);
        setK(String(settings.k));
        setH(String(settings.h));
      })
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [unitId]);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    try {
      const out = await call<{ settings: Settings }>(`/api/units/${unitId}/drift-settings`, 'PUT', { k: Number(k.replace(',', '.')), h: Number(h.replace(',', '.')) });
      setSettings(out.settings);
      setMessage({ ok: true, text: 'Saved. The unit’s drift check runs again over all its hours since the baseline.' });
    } catch (err) {
      setMessage(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card" aria-label="Drift settings">
      <h2 className="mb-1">Drift check</h2>
      <p className="mb-3 text-sm text-ink-soft">
        Tabular CUSUM (Page, 1954) on each steady hour’s destruction residual, first freed of what the previous hours’ residuals predict (the
        serial correlation fitted on the baseline’s reference period) and divided by the spread σ of what remains. A notice opens when the
        cumulative sum passes the decision limit h and the shift has lasted 3 steady hours; shifts smaller than the allowance k are absorbed.
        Defaults k = 0.5 σ, h = 8 σ: about one chance notice per unit in 9,500 steady hours (<a href="/help/method#drift">the method</a>).
      </p>
      {settings === null && !message ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : (
        <form className="flex flex-wrap items-end gap-3" onSubmit={save}>
          <div>
            <label className="label" htmlFor={`k-${unitId}`}>
              Allowance k [σ]
            </label>
            <input id={`k-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={k} onChange={(e) => setK(e.target.value)} disabled={!canEdit} />
          </div>
          <div>
            <label className="label" htmlFor={`h-${unitId}`}>
              Decision limit h [σ]
            </label>
            <input id={`h-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={h} onChange={(e) => setH(e.target.value)} disabled={!canEdit} />
          </div>
          {canEdit && (
            <button type="submit" className="btn" disabled={busy}>
              Save drift settings
            </button>
          )}
          {settings?.isDefault && <span className="text-sm text-ink-faint">(defaults)</span>}
        </form>
      )}
      <div className="mt-2">
        <Notice message={message} />
      </div>
    </section>
  );
}
