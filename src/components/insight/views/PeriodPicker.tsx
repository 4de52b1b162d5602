import { useEffect, useState } from 'react';

import type { Period, PeriodChoice, Range } from '~/lib/views/period';
import { pickRange, stepPeriod, type PeriodValue } from '~/lib/views/period-step';
import { submitTo } from '~/components/ui/Field';

export type { Range, PeriodValue };
/** What the server answered for the period (src/lib/views/period.ts). */
export type PeriodInfo = Pick<Period, 'range' | 'label' | 'firstDay' | 'lastDay' | 'prevAnchor' | 'nextAnchor' | 'hours' | 'timeZone'> & {
  /** Why the server chose this period (src/lib/views/period.ts periodFor). */
  opened?: PeriodChoice;
};

/** Words beside the period for how it was chosen. */
const OPENED_WORDS: Record<PeriodChoice, string> = {
  asked: '',
  'latest-full': 'the latest full period with data',
  'latest-partial': 'the latest period with data (not yet complete)',
  now: 'no data yet: the current period',
};

const RANGES: { key: Range; label: string }[] = [
  { key: 'day', label: 'Day' },
  { key: 'week', label: 'Week' },
  { key: 'month', label: 'Month' },
  { key: 'year', label: 'Year' },
  { key: 'custom', label: 'Custom' },
];

/** The period as query parameters of the views' API. */
export function periodQuery(v: PeriodValue): string {
  const p = new URLSearchParams({ range: v.range });
  if (v.range === 'custom') {
    if (v.from) p.set('from', v.from);
    if (v.to) p.set('to', v.to);
  } else if (v.anchor) p.set('anchor', v.anchor);
  return p.toString();
}

/** Reads a period from the page's query string. */
export function periodFromSearch(search: string, fallback: Range = 'week'): PeriodValue {
  const p = new URLSearchParams(search);
  const r = p.get('range');
  const range: Range = r === 'day' || r === 'week' || r === 'month' || r === 'year' || r === 'custom' ? r : fallback;
  return { range, anchor: p.get('anchor') ?? undefined, from: p.get('from') ?? undefined, to: p.get('to') ?? undefined };
}

/** Keeps the page's address in step with the chosen period (so a reload or a shared link shows the same). */
export function syncSearch(extra: Record<string, string | undefined>, v: PeriodValue) {
  const url = new URL(window.location.href);
  for (const k of ['range', 'anchor', 'from', 'to']) url.searchParams.delete(k);
  for (const [k, val] of new URLSearchParams(periodQuery(v))) url.searchParams.set(k, val);
  for (const [k, val] of Object.entries(extra)) {
    if (val) url.searchParams.set(k, val);
    else url.searchParams.delete(k);
  }
  window.history.replaceState(null, '', url);
}

/** A local date of the custom period. */
function DayField({ id, label, value, onChange }: { id: string; label: string; value: string; onChange: (v: string) => void }) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      <input id={id} type="date" className="field" value={value} onChange={(e) => onChange(e.target.value)} required />
    </div>
  );
}

/** The range buttons: day, week, month, year, custom (the chosen one pressed). */
function RangeButtons({ range, onPick }: { range: Range; onPick: (r: Range) => void }) {
  return (
    <div role="group" aria-label="Range" className="inline-flex overflow-hidden rounded border border-ink/20">
      {RANGES.map((r) => (
        <button
          key={r.key}
          type="button"
          aria-pressed={range === r.key}
          onClick={() => onPick(r.key)}
          className={`px-3 py-1.5 text-sm font-medium ${range === r.key ? 'bg-ink text-paper' : 'bg-white text-ink hover:bg-paper-deep'}`}
        >
          {r.label}
        </button>
      ))}
    </div>
  );
}

/** Earlier, later, and (except for a custom period) the latest full period with data. */
function StepButtons({ range, ready, onStep, onLatest }: { range: Range; ready: boolean; onStep: (dir: -1 | 1) => void; onLatest: () => void }) {
  return (
    <div className="inline-flex items-center gap-1">
      <button type="button" className="btn" onClick={() => onStep(-1)} disabled={!ready} aria-label="Earlier period">
        ← Earlier
      </button>
      <button type="button" className="btn" onClick={() => onStep(1)} disabled={!ready} aria-label="Later period">
        Later →
      </button>
      {range !== 'custom' && (
        <button
          type="button"
          className="btn"
          onClick={onLatest}
          title={`Go to the latest full ${range} that has computed hours (not the calendar ${range} holding today)`}
          data-testid="period-latest"
        >
          Latest full {range} with data
        </button>
      )}
    </div>
  );
}

/** The first and last day of a custom period, shown on submit. */
function CustomDays({ from, to, setFrom, setTo, onShow }: { from: string; to: string; setFrom: (v: string) => void; setTo: (v: string) => void; onShow: () => void }) {
  return (
    <form
      className="flex items-end gap-2"
      onSubmit={submitTo(onShow)}
    >
      <DayField id="period-from" label="From (first day)" value={from} onChange={setFrom} />
      <DayField id="period-to" label="To (last day)" value={to} onChange={setTo} />
      <button type="submit" className="btn btn-primary">
        Show
      </button>
    </form>
  );
}

/** The shown period in words, its hours and zone, and why it was chosen. */
function PeriodLabel({ info }: { info: PeriodInfo | null }) {
  return (
    <p className="ml-auto text-sm text-ink-soft" data-testid="period-label" aria-live="polite">
      {info ? (
        <>
          <span className="font-semibold text-ink">{info.label}</span> · {info.hours} h · {info.timeZone}
          {info.opened && OPENED_WORDS[info.opened] && <span data-testid="period-opened"> · {OPENED_WORDS[info.opened]}</span>}
        </>
      ) : (
        ' '
      )}
    </p>
  );
}

/** Day, week, month, year or custom, in the site's clock, with earlier and later steps. */
export function PeriodPicker({ value, info, onChange }: { value: PeriodValue; info: PeriodInfo | null; onChange: (v: PeriodValue) => void }) {
  const [from, setFrom] = useState(value.from ?? info?.firstDay ?? '');
  const [to, setTo] = useState(value.to ?? info?.lastDay ?? '');
  useEffect(() => {
    if (value.range === 'custom') return;
    if (info) {
      setFrom(info.firstDay);
      setTo(info.lastDay);
    }
  }, [info, value.range]);

  const pick = (range: Range) => onChange(pickRange(range, value, info, from, to));
  const step = (dir: -1 | 1) => {
    const next = stepPeriod(value, info, dir);
    if (next) onChange(next);
  };

  return (
    <div className="flex flex-wrap items-end gap-3" data-testid="period-picker">
      <RangeButtons range={value.range} onPick={pick} />
      <StepButtons range={value.range} ready={!!info} onStep={step} onLatest={() => onChange({ range: value.range })} />
      {value.range === 'custom' && <CustomDays from={from} to={to} setFrom={setFrom} setTo={setTo} onShow={() => onChange({ range: 'custom', from, to })} />}
      <PeriodLabel info={info} />
    </div>
  );
}
