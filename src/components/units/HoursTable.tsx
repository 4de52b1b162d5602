import { HourStateMark } from './HourStateMark';
import { fmt, fmtU, siteTime } from './format';
import type { UnitHourView as HourRow } from '~/lib/views/unit-hour';
import type { SiteWriter } from '~/lib/units/writer';
import { GridTable, num } from '~/components/ui/GridTable';

interface TableProps {
  rows: HourRow[];
  timeZone: string;
  currency: string;
  w: SiteWriter;
  /** The opened hour (ISO), if any: its row is marked. */
  open: string | null;
  onOpen: (iso: string, button: HTMLElement) => void;
}

/** One hour's row: its state, F P L D in the site's power unit, efficiency ± U, closure, cost, and the button that opens it. */
function HourRowView({
  r,
  isOpen,
  timeZone,
  pw,
  onOpen,
}: {
  r: HourRow;
  isOpen: boolean;
  timeZone: string;
  pw: (v_W: number | null | undefined) => string;
  onOpen: TableProps['onOpen'];
}) {
  const ms = Date.parse(r.hourStart);
  return (
    <tr className={isOpen ? 'bg-paper-deep' : undefined} data-hour={r.hourStart} data-hour-ms={ms}>
      <td className="whitespace-nowrap tabular-nums">{siteTime(r.hourStart, timeZone)}</td>
      <td title={r.reasons.map((x) => x.message).join('\n')}>
        <HourStateMark state={r.state} />
      </td>
      <td className="num">{pw(r.fuel_W)}</td>
      <td className="num text-teal-deep">{pw(r.product_W)}</td>
      <td className="num text-copper-deep">{pw(r.loss_W)}</td>
      <td className="num text-copper-deep">{pw(r.destruction_W)}</td>
      <td className="num whitespace-nowrap">{r.efficiency === null ? '–' : fmtU(r.efficiency, r.efficiency_U, 1, 100)}</td>
      <td className="num">{fmt(r.closure_pct, 2)}</td>
      <td className="num">{fmt(r.destructionCost_per_h, 2)}</td>
      <td>
        <button
          type="button"
          className="btn px-2 py-0.5 text-xs"
          aria-label={`Open hour ${siteTime(r.hourStart, timeZone)}`}
          aria-haspopup="dialog"
          data-open-hour
          onClick={(e) => onOpen(r.hourStart, e.currentTarget)}
        >
          Open hour
        </button>
      </td>
    </tr>
  );
}

/** A unit's hours, one row each; powers in the site's chosen display unit at fixed decimals per column. */
export function HoursTable({ rows, timeZone, currency, w, open, onOpen }: TableProps) {
  const pu = w.unit('power');
  const pDecimals = pu === 'MW' ? 3 : pu === 'W' ? 0 : 1;
  const pw = (v_W: number | null | undefined) => w.value(v_W, 'power', pDecimals);
  const openMs = open !== null ? Date.parse(open) : null;
  return (
    <div className="card overflow-x-auto p-0">
      <GridTable testId="unit-hours" columns={[<>Hour ({timeZone})</>, 'State', num(<>Fuel F [{pu}]</>), num(<>Product P [{pu}]</>), num(<>Loss L [{pu}]</>), num(<>Destruction D [{pu}]</>), num('Efficiency [%] ± U (k = 2)'), num('First-law closure [%]'), num(<>Cost of destruction [{currency}/h]</>), '']}>
        {rows.map((r) => (
          <HourRowView key={r.hourStart} r={r} isOpen={openMs === Date.parse(r.hourStart)} timeZone={timeZone} pw={pw} onOpen={onOpen} />
        ))}
      </GridTable>
    </div>
  );
}
