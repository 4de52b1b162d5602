import { Notice } from '../plant/common';
import { Field } from '~/components/ui/Field';
import type { UnitLimits, UnitLimitsFields } from '~/lib/views/unit-limits';
import { useUnitLimits } from './useUnitLimits';

/** The three fields and the save button. */
function LimitsFields({ unitId, canEdit, limits, fields, setField, busy, save }: { unitId: string; canEdit: boolean; limits: UnitLimits | null; fields: UnitLimitsFields; setField: (k: keyof UnitLimitsFields) => (v: string) => void; busy: boolean; save: (e: React.FormEvent) => void }) {
  return (
    <form className="flex flex-wrap items-end gap-3" onSubmit={save}>
      <Field id={`lim-cost-${unitId}`} label={<>Cost of destruction above [{limits?.currency ?? ''}/day]</>}>
        <input id={`lim-cost-${unitId}`} className="field w-32 text-right" inputMode="decimal" value={fields.cost} onChange={(e) => setField('cost')(e.target.value)} disabled={!canEdit} />
      </Field>
      <Field id={`lim-eff-${unitId}`} label="Exergy efficiency below [%]">
        <input id={`lim-eff-${unitId}`} className="field w-24 text-right" inputMode="decimal" value={fields.eff} onChange={(e) => setField('eff')(e.target.value)} disabled={!canEdit} />
      </Field>
      <Field id={`lim-hours-${unitId}`} label="Hours in a row [h]">
        <input id={`lim-hours-${unitId}`} className="field w-20 text-right" inputMode="numeric" value={fields.hours} onChange={(e) => setField('hours')(e.target.value)} disabled={!canEdit} />
      </Field>
      {canEdit && (
        <button type="submit" className="btn" disabled={busy}>
          Save limits
        </button>
      )}
    </form>
  );
}

/**
 * A unit's limits on the cost of destruction per day and on exergy efficiency; more than the set hours
 * in a row across a limit open a "limit crossed" notice. Energy leads and admins change them.
 * The data and saving in useUnitLimits.ts.
 */
export default function UnitLimitsForm({ unitId, canEdit }: { unitId: string; canEdit: boolean }) {
  const { limits, fields, setField, message, busy, save } = useUnitLimits(unitId);
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
        <LimitsFields unitId={unitId} canEdit={canEdit} limits={limits} fields={fields} setField={setField} busy={busy} save={save} />
      )}
      <div className="mt-2">
        <Notice message={message} />
      </div>
    </section>
  );
}
