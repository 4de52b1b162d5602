/**
 * The loss ledger's card (LedgerView.tsx): the site total, the table of units ranked by the cost of
 * their destruction with its head, rows and totals, and the note on how the figures are summed.
 */
import { COLORS, HourStateMark } from './common';
import { HOUR_STATES as STATES } from '~/lib/hour-states';
import type { LedgerAnswer, LedgerRow } from '~/lib/views/ledger';
import { ledgerHasHours, ledgerMWhDecimals } from '~/lib/views/ledger-table';
import { moneyDecimals, mwhDecimals, num, pct } from './format';
import { withU } from '~/lib/format';

function ShareBar({ share }: { share: number | null }) {
  if (share === null) return <span>—</span>;
  return (
    <span className="inline-flex items-center justify-end gap-2">
      <span className="inline-block h-2 w-16 rounded-sm bg-paper-deep" aria-hidden="true">
        <span className="block h-2 rounded-sm" style={{ width: `${Math.min(100, share * 100)}%`, background: COLORS.copper }} />
      </span>
      {num(share * 100, 1)}
    </span>
  );
}

function LedgerHead({ l, cur }: { l: LedgerAnswer; cur: string }) {
  return (
    <thead>
      <tr>
        <th className="num">#</th>
        <th>Unit</th>
        <th>Kind</th>
        <th className="num">Destruction [MWh]</th>
        <th className="num">
          Cost [{cur}]<span className="block text-xs font-normal">sum over steady hours of {l.period.label}</span>
        </th>
        <th className="num">Share of site {l.shareBasis} [%]</th>
        <th className="num">Mean efficiency [%]</th>
        {STATES.map((s) => (
          <th key={s} className="num">
            <span className="inline-flex items-center gap-1">
              <HourStateMark state={s} /> [h]
            </span>
          </th>
        ))}
      </tr>
    </thead>
  );
}

/** One unit's row; `q` is the period's query, carried to the unit's trend. */
function LedgerRowView({ r, d, q }: { r: LedgerRow; d: number; q: string }) {
  return (
    <tr data-testid={`ledger-row-${r.name}`}>
      <td className="num">{r.rank}</td>
      <td>
        <a href={`/trends/${r.unitId}?${q}`}>{r.name}</a>
      </td>
      <td className="text-ink-soft">{r.kindLabel}</td>
      <td className="num">
        {withU(r.destruction_MWh, r.destruction_U_MWh, { decimals: Math.max(d, mwhDecimals(r.destruction_MWh)) })}
      </td>
      <td className="num" title={r.hoursWithoutCost ? `${r.hoursWithoutCost} steady hours have no price for the unit's fuel` : undefined}>
        {r.cost === null ? (r.hours.steady ? 'no price' : '—') : withU(r.cost, r.cost_U, { decimals: moneyDecimals(r.cost) })}
        {r.cost !== null && r.hoursWithoutCost > 0 && <span className="text-amber-deep"> *</span>}
      </td>
      <td className="num">
        <ShareBar share={r.share} />
      </td>
      <td className="num">{r.efficiencyMean === null ? (r.hours.steady ? 'dissipative' : '—') : pct(r.efficiencyMean, r.efficiencyMean_U).replace(/ %/g, '')}</td>
      {STATES.map((s) => (
        <td key={s} className="num">
          {r.hours[s]}
        </td>
      ))}
    </tr>
  );
}

function LedgerFoot({ l, d, anyHours }: { l: LedgerAnswer; d: number; anyHours: boolean }) {
  return (
    <tfoot>
      <tr className="font-semibold" data-testid="ledger-totals">
        <td />
        <td>Site total</td>
        <td />
        <td className="num">
          {withU(l.totals.destruction_MWh, l.totals.destruction_U_MWh, { decimals: d })}
        </td>
        <td className="num">{l.totals.cost === null ? '—' : withU(l.totals.cost, l.totals.cost_U, { decimals: moneyDecimals(l.totals.cost) })}</td>
        <td className="num">{anyHours ? '100.0' : '—'}</td>
        <td />
        {STATES.map((s) => (
          <td key={s} className="num">
            {l.totals.hours[s]}
          </td>
        ))}
      </tr>
    </tfoot>
  );
}

/** The ledger's card: site total, the ranked table and how its figures are summed. */
export function LedgerSection({ l, q }: { l: LedgerAnswer; q: string }) {
  const cur = l.site.currency;
  const d = ledgerMWhDecimals(l);
  const anyHours = ledgerHasHours(l);
  return (
    <section className="card">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2>Loss ledger</h2>
        <p className="text-sm text-ink-soft" data-testid="ledger-total">
          Site total: <b>{withU(l.totals.destruction_MWh, l.totals.destruction_U_MWh, { unit: 'MWh', decimals: d })}</b> destroyed
          {l.totals.cost !== null && (
            <>
              , costing{' '}
              <b>{withU(l.totals.cost, l.totals.cost_U, { unit: cur, decimals: moneyDecimals(l.totals.cost) })}</b>
            </>
          )}
        </p>
      </div>
      {!anyHours && (
        <p className="mt-2 text-sm text-ink-faint" data-testid="ledger-empty">
          No unit hours in {l.period.label}. Pick another period.
        </p>
      )}
      <div className="mt-2 overflow-x-auto">
        <table className="grid-table [&_td.num]:whitespace-nowrap" data-testid="ledger-table">
          <LedgerHead l={l} cur={cur} />
          <tbody>
            {l.rows.map((r) => (
              <LedgerRowView key={r.unitId} r={r} d={d} q={q} />
            ))}
          </tbody>
          <LedgerFoot l={l} d={d} anyHours={anyHours} />
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-faint">
        Ranked by the cost of exergy destruction over steady hours (then by destruction). Uncertainties expanded (k = 2); the hours of a
        unit are added as fully correlated, the cautious reading. Hours that are not steady are counted, never summed.
      </p>
    </section>
  );
}
