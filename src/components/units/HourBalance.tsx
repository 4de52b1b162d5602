import { HourStateMark } from './HourStateMark';
import { fmt, fmtU, siteTime } from './format';
import type { HourAudit, UnitHourDetailView as Hour, UnitInfo } from '~/lib/views/unit-hour';
import { deadStateText } from '~/lib/views/hour-audit-text';
import type { SiteWriter } from '~/lib/units/writer';
import { labelOf, wordsFor } from '~/lib/words';

/** Why the hour has its state: its reasons, or the words of a sound hour; a balance that could not be formed. */
export function HourReasons({ hour }: { hour: Hour }) {
  const d = hour.detail;
  return (
    <div>
      <div className="mb-1 flex items-center gap-3">
        <h3 className="font-medium">Why this hour is {hour.state}</h3>
        <HourStateMark state={hour.state} />
      </div>
      {hour.reasons.length === 0 ? (
        <p className="text-sm text-ink-soft">
          Every key tag is sound and steady, the load is above the minimum, and the balances close within their tolerances.
        </p>
      ) : (
        <ul className="list-disc pl-5 text-sm" data-testid="hour-reasons">
          {hour.reasons.map((r, i) => (
            <li key={i}>
              <span className="font-medium">{labelOf(r.code, 'other reason')}:</span> {r.message}
            </li>
          ))}
        </ul>
      )}
      {d?.balanceError && <p className="mt-1 text-sm text-ink-soft">Balance not formed: {d.balanceError.message}</p>}
    </div>
  );
}

/** The kind's own figures of the balance (extras), one row each, in the word catalogue's words. */
function ExtraRows({ extras, w }: { extras: Record<string, number | null>; w: SiteWriter }) {
  return (
    <>
      {Object.entries(extras)
        .filter(([, v]) => v !== null)
        .map(([k, v]) => {
          const e = wordsFor(k);
          const q = e?.quantity ?? 'none';
          const u = w.unit(q);
          return (
            <tr key={k}>
              <td className="text-ink-soft">
                {e?.label ?? 'other figure'}
                {u ? ` [${u}]` : ''}
              </td>
              <td className="num text-ink-soft">{w.value(v, q)}</td>
            </tr>
          );
        })}
    </>
  );
}

/** F, P, L, D with their uncertainty, the closures and the cost of destruction of the hour. */
export function HourBalance({
  hour,
  b,
  cost,
  currency,
  w,
}: {
  hour: Hour;
  b: NonNullable<HourAudit['balance']>;
  cost: HourAudit['cost'];
  currency: string;
  w: SiteWriter;
}) {
  const kW = (v: number | null | undefined) => w.value(v, 'power');
  const P = w.unit('power');
  const rows: [string, string, string?][] = [
    [`Fuel exergy F [${P}]`, kW(b.fuel_W)],
    [`Product exergy P [${P}]`, b.product_W === null ? 'none (dissipative unit)' : kW(b.product_W), 'text-teal-deep'],
    [`Exergy loss L [${P}]`, kW(b.loss_W), 'text-copper-deep'],
    [`Exergy destruction D [${P}] ± U (k = 2)`, w.withU(b.destruction_W, hour.destruction_U_W, 'power').replaceAll(` ${P}`, ''), 'text-copper-deep'],
    ['Exergy efficiency P / F [%] ± U (k = 2)', b.efficiency === null ? 'none' : fmtU(b.efficiency, hour.efficiency_U, 2, 100)],
    [`T0 Sgen from the entropy balance [${P}]`, kW(b.T0Sgen_W)],
    [`D − T0 Sgen [${P}]`, kW(b.gouyStodolaResidual_W)],
    [`First-law residual [${P}] (closure [%])`, `${kW(b.energyResidual_W)} (${fmt(b.energyClosure_pct, 2)})`],
    [
      `Mass residual [${w.unit('massFlow')}]${b.massClosureShare !== null ? ' (share of inflow [%])' : ''}`,
      `${w.value(b.massResidual_kg_per_s, 'massFlow', 3)}${b.massClosureShare !== null ? ` (${fmt(b.massClosureShare, 2, 100)})` : ''}`,
    ],
    [`Cost of destruction [${currency}/h]`, fmt(hour.destructionCost_per_h, 2)],
  ];
  return (
    <div>
      <h3 className="mb-1 font-medium">The balance</h3>
      <table className="grid-table max-w-2xl" data-testid="hour-balance">
        <tbody>
          {rows.map(([label, value, className]) => (
            <tr key={label}>
              <td className={className}>{label}</td>
              <td className="num">{value}</td>
            </tr>
          ))}
          <ExtraRows extras={b.extras} w={w} />
        </tbody>
      </table>
      {cost && <p className="mt-1 text-xs text-ink-soft">Price of the fuel exergy: {cost.basis}.</p>}
    </div>
  );
}

/** The dead state, the load, the notes, the model version and when and by what the hour was computed. */
export function HourFootnote({ hour, unit, w }: { hour: Hour; unit: UnitInfo; w: SiteWriter }) {
  const d = hour.detail;
  const tz = unit.timeZone;
  return (
    <div className="text-xs text-ink-soft">
      {d && <p>{deadStateText(d, w)}</p>}
      {d?.notes.length ? (
        <ul className="list-disc pl-5">
          {d.notes.map((n, i) => (
            <li key={i}>{n}</li>
          ))}
        </ul>
      ) : null}
      <p>
        Model version {hour.modelVersion}, computed {siteTime(hour.computedAt, tz, 'yyyy-MM-dd HH:mm:ss')} ({tz}) by {d?.engine ?? 'the engine'}.
        {hour.rebuilt?.matches ? ' Opened up from the stored tag hours: same inputs as the stored hour.' : ''}
      </p>
      {hour.rebuilt && !hour.rebuilt.matches && (
        <p className="notice-error" data-testid="hour-rebuilt-differs">
          The tag hours or the plant model of this hour changed after it was computed; the detail shows the hour as it would be computed now, and the figures
          above are the stored ones until the recompute has run.
        </p>
      )}
    </div>
  );
}
