/**
 * The loss ledger island: a site's units ranked by the cost of their exergy destruction over a period
 * of the site's clock, with the site totals and the exergy flow picture of the same period.
 */
import { useEffect, useState } from 'react';
import { COLORS, ErrorNote, HourStateMark, Loading } from './common';
import { useApi } from '~/components/api';
import { FlowPicture } from './FlowPicture';
import FreshnessNote from './FreshnessNote';
import { HOUR_STATES as STATES } from '~/lib/hour-states';
import type { FlowAnswer, LedgerAnswer } from '~/lib/views/ledger';
import { money, moneyDecimals, mwh, mwhDecimals, num, pct } from './format';
import { withU } from '~/lib/format';
import { PeriodPicker, periodFromSearch, periodQuery, syncSearch, type PeriodInfo, type PeriodValue } from './PeriodPicker';


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

export default function LedgerView({ sites, initialSiteId, initialSearch }: { sites: { id: string; name: string; timeZone: string; currency: string }[]; initialSiteId: string | null; initialSearch: string }) {
  const [siteId, setSiteId] = useState<string>(initialSiteId && sites.some((s) => s.id === initialSiteId) ? initialSiteId : (sites[0]?.id ?? ''));
  const [value, setValue] = useState<PeriodValue>(() => periodFromSearch(initialSearch, 'month'));
  const q = periodQuery(value);
  const ledger = useApi<LedgerAnswer>(siteId ? `/api/sites/${siteId}/ledger?${q}` : null);
  const flow = useApi<FlowAnswer>(siteId ? `/api/sites/${siteId}/flow?${q}` : null);
  const [info, setInfo] = useState<PeriodInfo | null>(null);
  useEffect(() => {
    if (ledger.data) setInfo({ ...ledger.data.period, timeZone: ledger.data.site.timeZone, opened: ledger.data.opened });
  }, [ledger.data]);
  const change = (v: PeriodValue) => {
    setValue(v);
    syncSearch({ site: siteId }, v);
  };

  if (!sites.length) return <p className="card text-sm text-ink-faint">No site yet. An admin sets up the plant model first.</p>;
  const l = ledger.data;
  const cur = l?.site.currency ?? '';
  const d = l ? mwhDecimals(Math.max(l.totals.destruction_MWh, ...l.rows.map((r) => r.destruction_MWh))) : 2;
  const anyHours = l ? STATES.some((s) => l.totals.hours[s] > 0) : false;

  return (
    <div className="space-y-4" data-testid="ledger-view">
      <div className="flex flex-wrap items-end gap-4">
        <div>
          <label className="label" htmlFor="ledger-site">
            Site
          </label>
          <select
            id="ledger-site"
            className="field"
            value={siteId}
            onChange={(e) => {
              setSiteId(e.target.value);
              syncSearch({ site: e.target.value }, value);
            }}
          >
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </div>
        <div className="flex-1">
          <PeriodPicker value={value} info={info} onChange={change} />
        </div>
      </div>
      {ledger.error && <ErrorNote text={ledger.error} />}
      {ledger.loading && <Loading what="the ledger" />}
      {l && !ledger.loading && <FreshnessNote freshness={l.freshness} />}
      {l && !ledger.loading && (
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
              <tbody>
                {l.rows.map((r) => (
                  <tr key={r.unitId} data-testid={`ledger-row-${r.name}`}>
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
                ))}
              </tbody>
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
            </table>
          </div>
          <p className="mt-2 text-xs text-ink-faint">
            Ranked by the cost of exergy destruction over steady hours (then by destruction). Uncertainties expanded (k = 2); the hours of a
            unit are added as fully correlated, the cautious reading. Hours that are not steady are counted, never summed.
          </p>
        </section>
      )}
      <section className="card">
        <h2>Exergy flow{flow.data ? `, ${flow.data.period.label}` : ''}</h2>
        {flow.error && <ErrorNote text={flow.error} />}
        {flow.loading && <Loading what="the flow" />}
        {flow.data && !flow.loading && <FlowPicture flow={flow.data} />}
      </section>
    </div>
  );
}
