import { Notice } from '~/components/plant/common';
import { Field } from '~/components/ui/Field';
import { useUnitSetting } from '../useUnitSetting';

interface Settings {
  k: number;
  h: number;
  isDefault: boolean;
  updatedAt: string | null;
}

const decimal = (text: string) => Number(text.replace(',', '.'));

/** A unit's CUSUM k and h; energy leads and admins change them, everyone reads them. */
export default function DriftSettingsForm({ unitId, canEdit }: { unitId: string; canEdit: boolean }) {
  const { value: settings, fields, setField, message, busy, save } = useUnitSetting<Settings, { k: string; h: string }>({
    url: `/api/units/${unitId}/drift-settings`,
    key: 'settings',
    empty: { k: '', h: '' },
    toFields: (s) => ({ k: String(s.k), h: String(s.h) }),
    toBody: (f) => ({ k: decimal(f.k), h: decimal(f.h) }),
    saved: 'Saved. The unit’s drift check runs again over all its hours since the baseline.',
  });

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
          <Field id={`k-${unitId}`} label="Allowance k [σ]">
            <input id={`k-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={fields.k} onChange={(e) => setField('k')(e.target.value)} disabled={!canEdit} />
          </Field>
          <Field id={`h-${unitId}`} label="Decision limit h [σ]">
            <input id={`h-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={fields.h} onChange={(e) => setField('h')(e.target.value)} disabled={!canEdit} />
          </Field>
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
