import { useCallback, useMemo, useState } from 'react';
import { HourPanel } from './HourPanel';
import { HoursTable } from './HoursTable';
import { hourInAddress, siteDay } from './format';
import { useOpenHour } from './useOpenHour';
import { useUnitHours } from './useUnitHours';
import type { UnitHourView as HourRow, UnitInfo } from '~/lib/views/unit-hour';
import { dayRange, stateCountsText, unitHoursUrl } from '~/lib/views/unit-hours-range';
import { siteWriter } from '~/lib/units/writer';
import { submitTo } from '~/components/ui/Field';

/** The address that opens one hour of this unit directly (the page picks a range that holds it). */
const hourLink = (iso: string) => `${window.location.origin}${window.location.pathname}?hour=${hourInAddress(iso)}`;

interface RangeFormProps {
  timeZone: string;
  fromDay: string;
  toDay: string;
  setFromDay: (day: string) => void;
  setToDay: (day: string) => void;
  csvHref: string;
  rows: HourRow[] | null;
  onShow: () => void;
}

/** The first and last site-local day, "Show hours", the CSV of the range and the hours by state. */
function RangeForm({ timeZone, fromDay, toDay, setFromDay, setToDay, csvHref, rows, onShow }: RangeFormProps) {
  return (
    <form
      className="card flex flex-wrap items-end gap-4"
      onSubmit={submitTo(onShow)}
    >
      <label>
        <span className="label">First day ({timeZone})</span>
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
          {stateCountsText(rows)}
        </p>
      )}
    </form>
  );
}

/**
 * A unit's hours in a table over a date range (site-local days); one hour opens in place in a side
 * sheet over the table (./HourPanel.tsx), and the address names it (./useOpenHour.ts). Reads GET
 * /api/v1/units/{unitId}/hours (./useUnitHours.ts) and /hours/{hour}.
 */
export default function UnitResults({
  unit,
  initialFrom,
  initialTo,
  initialHour,
}: {
  unit: UnitInfo;
  initialFrom: string;
  initialTo: string;
  initialHour: string | null;
}) {
  const tz = unit.timeZone;
  // Powers in the site's chosen display unit and locale (its settings).
  const w = useMemo(() => siteWriter(unit.display?.units, unit.display?.p_atm_Pa), [unit.display]);
  const [fromDay, setFromDay] = useState(siteDay(initialFrom, tz));
  const [toDay, setToDay] = useState(siteDay(new Date(new Date(initialTo).getTime() - 1).toISOString(), tz));
  const { open, openHour, closeHour } = useOpenHour(initialHour);
  const range = useCallback(() => dayRange(fromDay, toDay, tz), [fromDay, toDay, tz]);
  const { rows, error, load } = useUnitHours(unit.id, range);

  return (
    <div className="space-y-6">
      <RangeForm
        timeZone={tz}
        fromDay={fromDay}
        toDay={toDay}
        setFromDay={setFromDay}
        setToDay={setToDay}
        csvHref={unitHoursUrl(unit.id, range(), true)}
        rows={rows}
        onShow={() => void load()}
      />

      {error && <p className="notice-error">{error}</p>}
      {!error && rows === null && <p className="text-sm text-ink-soft">Loading the hours…</p>}
      {!error && rows !== null && rows.length === 0 && (
        <p className="card text-sm text-ink-soft" data-testid="no-hours">
          No computed hours in this range. Hours appear once files with this unit's tags have been read and its links are complete.
        </p>
      )}

      {rows !== null && rows.length > 0 && <HoursTable rows={rows} timeZone={tz} currency={unit.currency} w={w} open={open} onOpen={openHour} />}

      {open && <HourPanel key={open} unit={unit} hourStart={open} link={hourLink(open)} onClose={closeHour} />}
    </div>
  );
}
