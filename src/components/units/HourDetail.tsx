import { useEffect, useState } from 'react';
import { Caution } from '../Caution';
import { HourStateMark } from './HourStateMark';
import { fmt, fmtU, siteTime } from './format';
import { call } from '~/components/api';
import type { HourAudit as Detail, UnitHourDetailView as Hour, UnitInfo } from '~/lib/views/unit-hour';
import { siteWriter, type SiteWriter } from '~/lib/units/writer';
import { inputWords, labelOf, wordsFor } from '~/lib/words';

const ROLE_WORD: Record<string, string> = { fuel: 'fuel F', product: 'product P', loss: 'loss L' };

function sourceText(s: Detail['inputs'][number]['source'], w: SiteWriter): string {
  if (s.kind === 'tag') return `${s.tag} (${w.number(s.reading ?? null, 3)} ${s.engUnit})${s.note ? `; ${s.note}` : ''}`;
  if (s.kind === 'parameter') return `parameter: ${inputWords(s.key ?? '').label}`;
  if (s.kind === 'copy') return `${s.note} (${s.of})`;
  return s.what ?? 'site';
}

/** A value of the input vector in the site's unit, with its unit. */
function valueText(v: number | null, q: ReturnType<typeof inputWords>['quantity'], w: SiteWriter): string {
  if (v === null) return '–';
  const u = w.unit(q);
  return `${w.value(v, q, q === 'none' ? 4 : undefined)}${u ? ` ${u}` : ''}`;
}

/** A standard uncertainty in the site's unit of a difference, with its unit. */
function deltaText(u_SI: number, q: ReturnType<typeof inputWords>['quantity'], w: SiteWriter): string {
  if (!u_SI) return '0';
  const u = w.deltaUnit(q);
  return `${w.delta(u_SI, q)}${u ? ` ${u}` : ''}`;
}

/**
 * One hour opened up: every port's state, every term, F P L D, uncertainty, reasons, the tag hours and
 * links used. Shown inside ./HourPanel.tsx, which carries the title, the link and the close button.
 */
export function HourDetail({ unit, hourStart }: { unit: UnitInfo; hourStart: string }) {
  const [hour, setHour] = useState<Hour | null>(null);
  const [error, setError] = useState<string | null>(null);
  const tz = unit.timeZone;
  const w = siteWriter(unit.display?.units, unit.display?.p_atm_Pa);
  const kW = (v: number | null | undefined) => w.value(v, 'power');
  const P = w.unit('power');

  useEffect(() => {
    let live = true;
    setHour(null);
    setError(null);
    void (async () => {
      const data = await call<{ hour: Hour }>(`/api/v1/units/${unit.id}/hours/${encodeURIComponent(hourStart)}`).catch((e: Error) => e);
      if (!live) return;
      if (data instanceof Error) setError(data.message);
      else setHour(data.hour);
    })();
    return () => {
      live = false;
    };
  }, [unit.id, hourStart]);

  if (error) return <p className="notice-error">{error}</p>;
  if (!hour) return <p className="text-sm text-ink-soft">Opening the hour…</p>;
  const d = hour.detail;
  const b = d?.balance ?? null;
  const plan = new Map((d?.plan ?? []).map((p) => [p.name, p]));

  return (
    <div className="space-y-5" data-testid="hour-figures">
      <Caution className="caution" />

      <div>
        <div className="mb-1 flex items-center gap-3">
          <h3 className="font-medium">Why this hour is {hour.state}</h3>
          <HourStateMark state={hour.state} />
        </div>
        {hour.reasons.length === 0 ? (
          <p className="text-sm text-ink-soft">Every key tag is sound and steady, the load is above the minimum, and the balances close within their tolerances.</p>
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

      {b && (
        <div>
          <h3 className="mb-1 font-medium">The balance</h3>
          <table className="grid-table max-w-2xl" data-testid="hour-balance">
            <tbody>
              <tr>
                <td>Fuel exergy F [{P}]</td>
                <td className="num">{kW(b.fuel_W)}</td>
              </tr>
              <tr>
                <td className="text-teal-deep">Product exergy P [{P}]</td>
                <td className="num">{b.product_W === null ? 'none (dissipative unit)' : kW(b.product_W)}</td>
              </tr>
              <tr>
                <td className="text-copper-deep">Exergy loss L [{P}]</td>
                <td className="num">{kW(b.loss_W)}</td>
              </tr>
              <tr>
                <td className="text-copper-deep">Exergy destruction D [{P}] ± U (k = 2)</td>
                <td className="num">
                  {w.withU(b.destruction_W, hour.destruction_U_W, 'power').replaceAll(` ${P}`, '')}
                </td>
              </tr>
              <tr>
                <td>Exergy efficiency P / F [%] ± U (k = 2)</td>
                <td className="num">{b.efficiency === null ? 'none' : fmtU(b.efficiency, hour.efficiency_U, 2, 100)}</td>
              </tr>
              <tr>
                <td>T0 Sgen from the entropy balance [{P}]</td>
                <td className="num">{kW(b.T0Sgen_W)}</td>
              </tr>
              <tr>
                <td>D − T0 Sgen [{P}]</td>
                <td className="num">{kW(b.gouyStodolaResidual_W)}</td>
              </tr>
              <tr>
                <td>First-law residual [{P}] (closure [%])</td>
                <td className="num">
                  {kW(b.energyResidual_W)} ({fmt(b.energyClosure_pct, 2)})
                </td>
              </tr>
              <tr>
                <td>Mass residual [{w.unit('massFlow')}]{b.massClosureShare !== null ? ' (share of inflow [%])' : ''}</td>
                <td className="num">
                  {w.value(b.massResidual_kg_per_s, 'massFlow', 3)}
                  {b.massClosureShare !== null ? ` (${fmt(b.massClosureShare, 2, 100)})` : ''}
                </td>
              </tr>
              <tr>
                <td>Cost of destruction [{unit.currency}/h]</td>
                <td className="num">{fmt(hour.destructionCost_per_h, 2)}</td>
              </tr>
              {Object.entries(b.extras)
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
            </tbody>
          </table>
          {d?.cost && <p className="mt-1 text-xs text-ink-soft">Price of the fuel exergy: {d.cost.basis}.</p>}
        </div>
      )}

      {d && d.ports.length > 0 && (
        <div className="overflow-x-auto">
          <h3 className="mb-1 font-medium">Port states</h3>
          <table className="grid-table" data-testid="hour-ports">
            <thead>
              <tr>
                <th>Port</th>
                <th>Fluid</th>
                <th>State from</th>
                <th>Flow from</th>
                <th className="num">Flow [{w.unit('massFlow')}]</th>
                <th className="num">p [{w.unit('pressure')}]</th>
                <th className="num">T [{w.unit('temperature')}]</th>
                <th className="num">h [kJ/kg]</th>
                <th className="num">s [kJ/(kg K)]</th>
                <th className="num">x [-]</th>
                <th className="num">ψ [kJ/kg]</th>
                <th className="num">Exergy flow [{P}]</th>
              </tr>
            </thead>
            <tbody>
              {d.ports.map((p) => (
                <tr key={p.name}>
                  <td>
                    {p.name} <span className="text-xs text-ink-faint">({p.direction})</span>
                  </td>
                  <td>{plan.get(p.name)?.fluid ?? (p.name === 'air' ? 'air (ambient)' : '')}</td>
                  <td className="text-xs">{plan.get(p.name)?.state ?? 'at the dead state'}</td>
                  <td className="text-xs">{plan.get(p.name)?.flow ?? 'from the combustion balance'}</td>
                  <td className="num">{w.value(p.mDot_kg_per_s, 'massFlow', 3)}</td>
                  <td className="num">{w.value(p.p_Pa, 'pressure', 3)}</td>
                  <td className="num">{w.value(p.T_K, 'temperature', 2)}</td>
                  <td className="num">{fmt(p.h_J_per_kg, 2, 1e-3)}</td>
                  <td className="num">{fmt(p.s_J_per_kgK, 4, 1e-3)}</td>
                  <td className="num">{p.x === null ? '–' : fmt(p.x, 4)}</td>
                  <td className="num">{fmt(p.psi_J_per_kg, 2, 1e-3)}</td>
                  <td className="num">{kW(p.exergy_W)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {d.balanceKind === 'boiler' && <p className="mt-1 text-xs text-ink-soft">The boiler's exergy flows include the chemical exergy of fuel, air and flue gas.</p>}
        </div>
      )}

      {d && d.terms.length > 0 && (
        <div>
          <h3 className="mb-1 font-medium">Terms of the balance (F = P + L + D)</h3>
          <table className="grid-table max-w-2xl" data-testid="hour-terms">
            <thead>
              <tr>
                <th>Term</th>
                <th>Counts as</th>
                <th className="num">Exergy [{P}]</th>
              </tr>
            </thead>
            <tbody>
              {d.terms.map((t, i) => (
                <tr key={i}>
                  <td>{t.label}</td>
                  <td>{ROLE_WORD[t.role] ?? t.role}</td>
                  <td className="num">{kW(t.exergy_W)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {d?.uncertainty && (
        <div>
          <h3 className="mb-1 font-medium">Biggest uncertainty contributors</h3>
          <p className="mb-1 text-xs text-ink-soft">{d.uncertainty.method}; coverage factor k = {d.uncertainty.k}.</p>
          <table className="grid-table max-w-3xl" data-testid="hour-contributors">
            <thead>
              <tr>
                <th>Input</th>
                <th>Tag</th>
                <th className="num">Standard uncertainty u</th>
                <th className="num">Share of the variance of the efficiency [%]</th>
                <th className="num">Share of the variance of D [%]</th>
              </tr>
            </thead>
            <tbody>
              {d.uncertainty.contributors.map((c) => (
                <tr key={c.input}>
                  <td>{inputWords(c.input).label}</td>
                  <td>{c.tag ?? ''}</td>
                  <td className="num">{deltaText(c.u_SI, inputWords(c.input).quantity, w)}</td>
                  <td className="num">{fmt(c.share_efficiency, 1, 100)}</td>
                  <td className="num">{fmt(c.share_destruction, 1, 100)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {d && d.tagHours.length > 0 && (
        <div className="overflow-x-auto">
          <h3 className="mb-1 font-medium">Tag hours and links used</h3>
          <table className="grid-table" data-testid="hour-tags">
            <thead>
              <tr>
                <th>Tag</th>
                <th>Measures</th>
                <th>Unit</th>
                <th className="num">Mean</th>
                <th className="num">Min</th>
                <th className="num">Max</th>
                <th className="num">Samples</th>
                <th className="num">Covered [%]</th>
                <th>Quality</th>
                <th>Link uncertainty</th>
                <th>Link valid ({tz})</th>
              </tr>
            </thead>
            <tbody>
              {d.tagHours.map((t) => (
                <tr key={t.tag}>
                  <td className="font-mono text-xs">{t.tag}</td>
                  <td>{t.quantity ? `${labelOf(t.quantity, 'measurement')}${t.port ? ` at ${t.port}` : ' of the unit'}` : t.role}</td>
                  <td>{t.engUnit ?? ''}</td>
                  <td className="num">{fmt(t.hour?.mean ?? null, 3)}</td>
                  <td className="num">{fmt(t.hour?.min ?? null, 3)}</td>
                  <td className="num">{fmt(t.hour?.max ?? null, 3)}</td>
                  <td className="num">{t.hour ? t.hour.samples : '–'}</td>
                  <td className="num">{t.hour ? fmt(t.hour.coveredFraction, 0, 100) : '–'}</td>
                  <td className="text-xs">
                    {!t.hour
                      ? 'no data this hour'
                      : [t.hour.flatline ? 'frozen' : '', t.hour.outOfRange ? `${t.hour.outOfRange} out of range` : '', t.hour.nonNumeric ? `${t.hour.nonNumeric} status words` : '']
                          .filter(Boolean)
                          .join(', ') || 'sound'}
                  </td>
                  <td className="text-xs">{t.uncertainty ? (t.uncertainty.mode === 'relative' ? `${t.uncertainty.value} % of reading` : `${t.uncertainty.value} ${t.engUnit}`) : ''}</td>
                  <td className="text-xs">
                    {t.validFromMs !== undefined
                      ? `${t.validFromMs === 0 ? 'from the start' : `from ${siteTime(new Date(t.validFromMs).toISOString(), tz)}`}${t.validToMs ? ` to ${siteTime(new Date(t.validToMs).toISOString(), tz)}` : ''}`
                      : ''}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {d && d.inputs.length > 0 && (
        <details>
          <summary className="cursor-pointer font-medium">Values the balance was given</summary>
          <table className="grid-table mt-2 max-w-4xl" data-testid="hour-inputs">
            <thead>
              <tr>
                <th>Entry</th>
                <th className="num">Value</th>
                <th className="num">Standard uncertainty u</th>
                <th>From</th>
              </tr>
            </thead>
            <tbody>
              {d.inputs.map((i) => (
                <tr key={i.name}>
                  <td>{inputWords(i.name).label}</td>
                  <td className="num">{valueText(i.value, inputWords(i.name).quantity, w)}</td>
                  <td className="num">{deltaText(i.u, inputWords(i.name).quantity, w)}</td>
                  <td className="text-xs">{sourceText(i.source, w)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      )}

      <div className="text-xs text-ink-soft">
        {d && (
          <p>
            Dead state T0 = {w.value(d.deadState.T0_K, 'temperature', 2)} {w.unit('temperature')}, p0 = {w.number(d.deadState.p0_Pa / 1e3, 2)} kPa ({d.deadState.source}).
            {d.load ? ` Load: ${d.load.label} ${w.value(d.load.value, d.load.unit === 'W' ? 'power' : 'massFlow', 2)} ${w.unit(d.load.unit === 'W' ? 'power' : 'massFlow')}.` : ''}
          </p>
        )}
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
            The tag hours or the plant model of this hour changed after it was computed; the detail shows the hour as it would be computed
            now, and the figures above are the stored ones until the recompute has run.
          </p>
        )}
      </div>
    </div>
  );
}
