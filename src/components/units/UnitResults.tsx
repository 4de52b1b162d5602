import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { HourPanel } from './HourPanel';
import { HourStateMark } from './HourStateMark';
import { fmt, fmtU, hourFromAddress, hourInAddress, siteDay, siteDayStart, siteTime } from './format';
import { call } from '~/components/api';
import { HOUR_STATES } from '~/lib/hour-states';
import { DAY_MS } from '~/lib/time';
import type { UnitHourView as HourRow, UnitInfo } from '~/lib/views/unit-hour';
import { counted } from '~/lib/counts';
import { siteWriter } from '~/lib/units/writer';

/** The page's address with the opened hour (?hour=...), or without it. */
function addressWith(iso: string | null): URL {
  const url = new URL(window.location.href);
  if (iso) url.searchParams.set('hour', hourInAddress(iso));
  else url.searchParams.delete('hour');
  return url;
}

/** The key of a history entry this page pushed for an opened hour (its value: the hour). */
const HOUR_ENTRY = 'lossline.hour';

/** The address that opens one hour of this unit directly (the page picks a range that holds it). */
const hourLink = (iso: string) => `${window.location.origin}${window.location.pathname}?hour=${hourInAddress(iso)}`;

/**
 * A unit's hours in a table over a date range (site-local days); one hour opens in place in a side
 * sheet over the table (./HourPanel.tsx), and the address names it. Reads GET
 * /api/v1/units/{unitId}/hours and /hours/{hour}.
 */
export default function UnitResults({ unit, initialFrom, initialTo, initialHour }: { unit: UnitInfo; initialFrom: string; initialTo: string; initialHour: string | null }) {
  const tz = unit.timeZone;
  // Powers in the site's chosen display unit and locale (its settings), at fixed decimals per column.
  const w = useMemo(() => siteWriter(unit.display?.units, unit.display?.p_atm_Pa), [unit.display]);
  const pu = w.unit('power');
  const pDecimals = pu === 'MW' ? 3 : pu === 'W' ? 0 : 1;
  const pw = (v_W: number | null | undefined) => w.value(v_W, 'power', pDecimals);
  const [fromDay, setFromDay] = useState(siteDay(initialFrom, tz));
  const [toDay, setToDay] = useState(siteDay(new Date(new Date(initialTo).getTime() - 1).toISOString(), tz));
  const [rows, setRows] = useState<HourRow[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [open, setOpen] = useState<string | null>(() => hourFromAddress(initialHour));
  const openRef = useRef(open);
  const opener = useRef<HTMLElement | null>(null);

  /*
   * The address and the browser's history: opening an hour pushes an entry (?hour=...), so Back closes
   * the panel and Forward opens it again; closing by Escape or the button goes back over that entry
   * when this page pushed it, and otherwise (an address that opened the hour directly) replaces it.
   */
  const openHour = useCallback((iso: string, button: HTMLElement) => {
    opener.current = button;
    openRef.current = iso;
    setOpen(iso);
    window.history.pushState({ ...(window.history.state ?? {}), [HOUR_ENTRY]: iso }, '', addressWith(iso));
  }, []);

  /** Closes the panel on screen (once) and gives the focus back to what opened it; the address is the caller's. */
  const closePanel = useCallback((): string | null => {
    const was = openRef.current;
    if (!was) return null;
    openRef.current = null;
    setOpen(null);
    const back = opener.current?.isConnected ? opener.current : document.querySelector<HTMLElement>(`tr[data-hour-ms="${Date.parse(was)}"] button[data-open-hour]`);
    opener.current = null;
    requestAnimationFrame(() => back?.focus());
    return was;
  }, []);

  /** Closes the opened hour (once, however asked: Escape, the button) and takes the hour out of the address. */
  const closeHour = useCallback(() => {
    const was = closePanel();
    if (!was) return;
    if ((window.history.state as Record<string, unknown> | null)?.[HOUR_ENTRY] === was) window.history.back();
    else window.history.replaceState(window.history.state, '', addressWith(null));
  }, [closePanel]);

  // Back and Forward: the address says which hour is open, if any.
  useEffect(() => {
    const onPop = () => {
      const hour = hourFromAddress(new URL(window.location.href).searchParams.get('hour'));
      if (hour === openRef.current) return;
      if (openRef.current) closePanel();
      if (hour) {
        opener.current = null;
        openRef.current = hour;
        setOpen(hour);
      }
    };
    window.addEventListener('popstate', onPop);
    return () => window.removeEventListener('popstate', onPop);
  }, [closePanel]);

  const range = useCallback(() => {
    const from = siteDayStart(fromDay, tz);
    const to = new Date(new Date(siteDayStart(toDay, tz)).getTime() + DAY_MS).toISOString();
    return { from, to };
  }, [fromDay, toDay, tz]);

  const load = useCallback(async () => {
    setRows(null);
    setError(null);
    const { from, to } = range();
    if (!(to > from)) return setError('The last day must not be before the first.');
    const data = await call<{ hours: HourRow[] }>(`/api/v1/units/${unit.id}/hours?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`).catch((e: Error) => e);
    if (data instanceof Error) return setError(data.message);
    setRows(data.hours);
  }, [range, unit.id]);

  useEffect(() => {
    void load();
  }, [load]);

  const { from, to } = range();
  const csvHref = `/api/v1/units/${unit.id}/hours?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}&format=csv`;
  const counts = (rows ?? []).reduce<Record<string, number>>((m, r) => ((m[r.state] = (m[r.state] ?? 0) + 1), m), {});
  const cur = unit.currency;

  return (
    <div className="space-y-6">
      <form
        className="card flex flex-wrap items-end gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          void load();
        }}
      >
        <label>
          <span className="label">First day ({tz})</span>
          <input className="field" type="date" value={fromDay} onChange={(e) => setFromDay(e.target.value)} data-testid="range-from" required />
        </label>
        <label>
          <span className="label">Last day</span>
          <input className="field" type="date" value={toDay} onChange={(e) => setToDay(e.target.value)} data-testid="range-to" required />
        </label>
        <button type="submit" className="btn btn-primary">
          Show hours
        </button>
        <a className="btn" href={csvHref} download>
          Download CSV
        </a>
        {rows && rows.length > 0 && (
          <p className="text-sm text-ink-soft" data-testid="state-counts">
            {counted(rows.length, 'hour', 'hours')}:{' '}
            {HOUR_STATES
              .filter((s) => counts[s])
              .map((s) => `${counts[s]} ${s}`)
              .join(', ')}
          </p>
        )}
      </form>

      {error && <p className="notice-error">{error}</p>}
      {!error && rows === null && <p className="text-sm text-ink-soft">Loading the hours…</p>}
      {!error && rows !== null && rows.length === 0 && (
        <p className="card text-sm text-ink-soft" data-testid="no-hours">
          No computed hours in this range. Hours appear once files with this unit's tags have been read and its links are complete.
        </p>
      )}

      {rows !== null && rows.length > 0 && (
        <div className="card overflow-x-auto p-0">
          <table className="grid-table" data-testid="unit-hours">
            <thead>
              <tr>
                <th>Hour ({tz})</th>
                <th>State</th>
                <th className="num">Fuel F [{pu}]</th>
                <th className="num">Product P [{pu}]</th>
                <th className="num">Loss L [{pu}]</th>
                <th className="num">Destruction D [{pu}]</th>
                <th className="num">Efficiency [%] ± U (k = 2)</th>
                <th className="num">First-law closure [%]</th>
                <th className="num">Cost of D [{cur}/h]</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => {
                const ms = Date.parse(r.hourStart);
                const isOpen = open !== null && Date.parse(open) === ms;
                return (
                  <tr key={r.hourStart} className={isOpen ? 'bg-paper-deep' : undefined} data-hour={r.hourStart} data-hour-ms={ms}>
                    <td className="whitespace-nowrap tabular-nums">{siteTime(r.hourStart, tz)}</td>
                    <td title={r.reasons.map((x) => x.message).join('\n')}>
                      <HourStateMark state={r.state} />
                    </td>
                    <td className="num">{pw(r.fuel_W)}</td>
                    <td className="num text-teal-deep">{pw(r.product_W)}</td>
                    <td className="num text-copper-deep">{pw(r.loss_W)}</td>
                    <td className="num text-copper-deep">{pw(r.destruction_W)}</td>
                    <td className="num whitespace-nowrap">
                      {r.efficiency === null ? '–' : fmtU(r.efficiency, r.efficiency_U, 1, 100)}
                    </td>
                    <td className="num">{fmt(r.closure_pct, 2)}</td>
                    <td className="num">{fmt(r.destructionCost_per_h, 2)}</td>
                    <td>
                      <button
                        type="button"
                        className="btn px-2 py-0.5 text-xs"
                        aria-label={`Open hour ${siteTime(r.hourStart, tz)}`}
                        aria-haspopup="dialog"
                        data-open-hour
                        onClick={(e) => openHour(r.hourStart, e.currentTarget)}
                      >
                        Open hour
                      </button>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}

      {open && <HourPanel key={open} unit={unit} hourStart={open} link={hourLink(open)} onClose={closeHour} />}
    </div>
  );
}
