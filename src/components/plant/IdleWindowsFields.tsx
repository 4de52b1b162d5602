import { WEEKDAYS, type Weekday } from '~/lib/plant/idle';
import { NEXT_WINDOW, tickDay, type IdleWindowRow } from '~/lib/plant/idle-form';

const DAY_LABELS: Record<Weekday, string> = { mon: 'Mon', tue: 'Tue', wed: 'Wed', thu: 'Thu', fri: 'Fri', sat: 'Sat', sun: 'Sun' };
const HOURS = Array.from({ length: 25 }, (_, h) => `${String(h).padStart(2, '0')}:00`);

/** One weekly window: its days, from and to, and Remove while there is more than one. */
function WindowRow({ w, canRemove, onChange, onRemove }: { w: IdleWindowRow; canRemove: boolean; onChange: (w: Partial<IdleWindowRow>) => void; onRemove: () => void }) {
  return (
    <li className="flex flex-wrap items-center gap-2 text-sm" data-testid="idle-window">
      {WEEKDAYS.map((d) => (
        <label key={d} className="flex items-center gap-1">
          <input type="checkbox" checked={w.days.includes(d)} onChange={(e) => onChange({ days: tickDay(w.days, d, e.target.checked) })} />
          {DAY_LABELS[d]}
        </label>
      ))}
      <label className="ml-2 flex items-center gap-1">
        from
        <select className="field w-24" value={w.from} onChange={(e) => onChange({ from: e.target.value })}>
          {HOURS.slice(0, 24).map((h) => (
            <option key={h}>{h}</option>
          ))}
        </select>
      </label>
      <label className="flex items-center gap-1">
        to
        <select className="field w-24" value={w.to} onChange={(e) => onChange({ to: e.target.value })}>
          {HOURS.slice(1).map((h) => (
            <option key={h}>{h}</option>
          ))}
        </select>
      </label>
      {canRemove && (
        <button type="button" className="btn" onClick={onRemove}>
          Remove
        </button>
      )}
    </li>
  );
}

/** The weekly windows of a normally-idle unit, and "Add a time". */
export function IdleWindowsFields({ windows, setWindows }: { windows: IdleWindowRow[]; setWindows: (f: (ws: IdleWindowRow[]) => IdleWindowRow[]) => void }) {
  const setWindow = (i: number, w: Partial<IdleWindowRow>) => setWindows((ws) => ws.map((x, j) => (j === i ? { ...x, ...w } : x)));
  return (
    <ul className="space-y-2">
      {windows.map((w, i) => (
        <WindowRow key={i} w={w} canRemove={windows.length > 1} onChange={(patch) => setWindow(i, patch)} onRemove={() => setWindows((ws) => ws.filter((_, j) => j !== i))} />
      ))}
      <li>
        <button type="button" className="btn" onClick={() => setWindows((ws) => [...ws, NEXT_WINDOW])}>
          Add a time
        </button>
        <span className="ml-2 text-xs text-ink-faint">An end at or before the start runs over midnight.</span>
      </li>
    </ul>
  );
}

/** The other units whose running the idle time depends on. */
export function WhileRunningFields({ otherUnits, waitFor, setWaitFor }: { otherUnits: string[]; waitFor: string[]; setWaitFor: (f: (xs: string[]) => string[]) => void }) {
  return (
    <fieldset className="text-sm">
      <legend className="label">Only while these units run (e.g. the turbine a bypass valve stands in for)</legend>
      <div className="flex flex-wrap gap-3">
        {otherUnits.map((u) => (
          <label key={u} className="flex items-center gap-1">
            <input type="checkbox" checked={waitFor.includes(u)} onChange={(e) => setWaitFor((xs) => (e.target.checked ? [...xs, u] : xs.filter((x) => x !== u)))} />
            {u}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
