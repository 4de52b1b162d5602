import { StateMark } from '~/components/StateMark';
import { BASELINE_LOOK, pct } from './looks';
import { ALL_TERMS, TERM_LABELS, type BaselineSummary, type BaselineTerm } from './types';
import { periodDaysText, toggledTerms } from '~/lib/views/baseline-fit-text';
import { GridTable, num } from '~/components/ui/GridTable';
import { Field, Options } from '~/components/ui/Field';

export interface UnitChoice {
  id: string;
  name: string;
  kind: string;
  siteName: string;
  timeZone: string;
}

const PRESETS: { id: string; label: string; terms: BaselineTerm[] }[] = [
  { id: 'linear', label: 'Linear: load and ambient temperature', terms: ['load', 'T_amb'] },
  { id: 'quadratic', label: 'Quadratic: load, ambient temperature, their squares and product', terms: ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'] },
  { id: 'load', label: 'Load only (fixed dead state)', terms: ['load'] },
  { id: 'load2', label: 'Load and load² (fixed dead state)', terms: ['load', 'load^2'] },
];

interface PeriodProps {
  units: UnitChoice[];
  unitId: string;
  setUnitId: (id: string) => void;
  timeZone: string | null;
  from: string;
  setFrom: (day: string) => void;
  to: string;
  setTo: (day: string) => void;
}

/** The unit and the first and last day of the reference period. */
export function PeriodFields({ units, unitId, setUnitId, timeZone, from, setFrom, to, setTo }: PeriodProps) {
  return (
    <div className="grid gap-4 sm:grid-cols-3">
      <Field id="b-unit" label="Unit">
        <select id="b-unit" className="field" value={unitId} onChange={(e) => setUnitId(e.target.value)}>
          <Options choices={units.map((u) => [u.id, <>{u.siteName} · {u.name}</>] as const)} />
        </select>
      </Field>
      <div>
        <label className="label" htmlFor="b-from">
          First day {timeZone ? `(${timeZone})` : ''}
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
  );
}

/** The terms of the fit: presets and one box per term. */
export function TermsFieldset({ terms, setTerms }: { terms: BaselineTerm[]; setTerms: (terms: BaselineTerm[]) => void }) {
  return (
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
            <input type="checkbox" checked={terms.includes(t)} onChange={() => setTerms(toggledTerms(terms, t))} /> {TERM_LABELS[t]}
          </label>
        ))}
      </div>
      <p className="mt-1 text-xs text-ink-faint">
        The ambient temperature is the hour's dead-state temperature T0; where the site keeps T0 fixed, leave the ambient-temperature terms out.
      </p>
    </fieldset>
  );
}

/** The unit's baseline versions: status, period, hours, CV(RMSE) and who fitted them. */
export function VersionsSection({ unitName, versions }: { unitName: string; versions: BaselineSummary[] | null }) {
  return (
    <section className="card">
      <h2 className="mb-2">Versions of {unitName}</h2>
      {versions === null ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : versions.length === 0 ? (
        <p className="text-sm text-ink-faint">No baseline yet for this unit.</p>
      ) : (
        <GridTable columns={[num('Version'), 'Status', 'Period', num('Hours'), num('CV(RMSE) destruction [%]'), 'By']}>
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
                <td>{periodDaysText(v.periodFrom, v.periodTo, v.timeZone)}</td>
                <td className="num">{v.hours}</td>
                <td className="num">{pct(v.destruction.stats.cvRmse)}</td>
                <td>{v.createdBy ?? ''}</td>
              </tr>
            );
          })}
        </GridTable>
      )}
    </section>
  );
}
