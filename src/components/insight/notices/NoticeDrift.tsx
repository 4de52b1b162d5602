import { StateMark } from '~/components/StateMark';
import { at, atZ } from '../baselines/looks';
import { NoticeChart } from './NoticeChart';
import type { ChartColumns } from '~/lib/analytics/chart-thin';
import { LIFE_LOOK, NOTICE_LOOK, PRIOR_WORDS, TREND_LOOK, noticeFigures, type Notice, type NoticeChartEvent } from './looks';

function Figure({ label, value, unit, sub, testId }: { label: string; value: string; unit?: string; sub?: string; testId?: string }) {
  return (
    <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="text-lg font-semibold tabular-nums">
        <span data-testid={testId}>
          {value} {unit && <span className="text-sm font-normal text-ink-soft">{unit}</span>}
        </span>
        {sub && (
          <span className="ml-1 text-sm font-normal text-ink-soft" data-testid={testId ? `${testId}-u` : undefined}>
            {sub}
          </span>
        )}
      </dd>
    </div>
  );
}

const yesNo = (v: boolean | null) => (v === null ? 'not known' : v ? 'yes' : 'no');

/** Who the notice is about, its life and status, and whether it faded, was superseded or follows an earlier one. */
function DriftHeadline({ n }: { n: Notice }) {
  const look = NOTICE_LOOK[n.status]!;
  const life = LIFE_LOOK[n.life];
  const more = n.direction === 'up';
  return (
    <>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-sm text-ink-soft">
          {n.unitName} at {n.siteName} destroys {more ? 'more' : 'less'} exergy than expected
          {n.baselineLabel && (
            <>
              {' '}
              against <a href={`/baselines/${n.baselineId}`}>{n.baselineLabel}</a>
            </>
          )}
          .
        </p>
        <span className="flex gap-4">
          <span data-testid="notice-life">
            <StateMark shape={life.shape} className={life.className} label={life.label} />
          </span>
          <span data-testid="notice-status">
            <StateMark shape={look.shape} className={look.className} label={look.label} />
          </span>
        </span>
      </div>
      {n.fadedSince && (
        <p className="rounded border border-slate px-3 py-2 text-sm" data-testid="notice-faded">
          Faded since {atZ(n.fadedSince, n.timeZone)}: over a day of steady hours the shift has gone. This notice takes no later signal; a new shift opens a new
          notice.
        </p>
      )}
      {n.supersededBy && (
        <p className="rounded border border-slate px-3 py-2 text-sm" data-testid="notice-superseded">
          A later, clearly larger shift of this unit has <a href={`/notices/${n.supersededBy}`}>its own notice</a>.
        </p>
      )}
      {n.priorNoticeId && n.priorReason && (
        <p className="text-sm" data-testid="notice-prior">
          Opened for {PRIOR_WORDS[n.priorReason]}: <a href={`/notices/${n.priorNoticeId}`}>the earlier notice</a>.
        </p>
      )}
    </>
  );
}

/** The headline figures: extra destruction and its cost now, the trend, the onset, and whether it is beyond measurement. */
function DriftFigures({ n }: { n: Notice }) {
  const hoursNow = n.currentHours ?? n.hours;
  const f = noticeFigures(n);
  const [headV, headU] = f.parts(n.headline_W, n.headlineU_W);
  const [costV, costU] = f.moneyParts(n.headlineCost_per_day, n.headlineCostU_per_day);
  return (
    <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
      <Figure label={`Extra destruction now (last ${hoursNow} steady hours)`} value={headV} unit={f.unit} sub={headU} testId="fig-extra" />
      <Figure
        label="Cost per day now"
        value={n.headlineCost_per_day === null ? 'not known' : costV}
        unit={n.headlineCost_per_day === null ? undefined : `${n.currency}/day`}
        sub={costU || undefined}
        testId="fig-cost"
      />
      <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
        <dt className="text-xs text-ink-soft">The shift is</dt>
        <dd className="text-lg font-semibold" data-testid="fig-trend">
          {n.trend ? (
            <StateMark shape={TREND_LOOK[n.trend].shape} className={TREND_LOOK[n.trend].className} label={TREND_LOOK[n.trend].label} />
          ) : (
            'not yet known'
          )}
        </dd>
      </div>
      <Figure label={`Since (onset estimate, ${n.timeZone})`} value={at(n.onsetHour, n.timeZone)} testId="fig-since" />
      <Figure label="Beyond measurement uncertainty (now)" value={yesNo(n.headlineExceeds)} testId="fig-uncertainty" />
    </dl>
  );
}

/** The figures in full: now, since onset, at signal, expected, σ, the signal hours, uncertainty, cost basis, settings. */
function DriftFigureTable({ n }: { n: Notice }) {
  const hoursNow = n.currentHours ?? n.hours;
  const f = noticeFigures(n);
  return (
    <table className="grid-table text-sm">
      <tbody>
        <tr>
          <td>
            Now: mean of the last {hoursNow} steady hours{n.figuresHour ? ` (to ${atZ(n.figuresHour, n.timeZone)})` : ''}
          </td>
          <td className="num">{f.signed(n.headline_W, n.headlineU_W)}</td>
        </tr>
        {n.sinceOnset_W !== null && (
          <tr>
            <td>Since onset: mean of {n.sinceOnsetHours} steady hours</td>
            <td className="num" data-testid="fig-since-onset">
              {f.signed(n.sinceOnset_W, n.sinceOnsetU_W)}
            </td>
          </tr>
        )}
        <tr>
          <td>At signal: mean of the {n.hours} steady hours from onset to signal (the first figure)</td>
          <td className="num" data-testid="fig-first">
            {f.signed(n.extra_W)}
            {n.extraCost_per_day !== null ? `, ${n.currency} ${f.money(n.extraCost_per_day)}/day` : ''}
          </td>
        </tr>
        <tr>
          <td>Expected destruction over the first hours</td>
          <td className="num">{f.power(n.expected_W)}</td>
        </tr>
        <tr>
          <td>Shift at signal in units of σ, the spread of the residuals of the baseline’s fit</td>
          <td className="num">{f.w.number(n.shift_sigma, 2)} σ</td>
        </tr>
        <tr>
          <td>Sustained shift confirmed</td>
          <td className="num">
            {atZ(n.signalHour, n.timeZone)}
            {n.lastSignalHour !== n.signalHour && ` (still signalling ${atZ(n.lastSignalHour, n.timeZone)})`}
          </td>
        </tr>
        <tr>
          <td>Measurement uncertainty of the current figure, U(one hour)/√n (k = 2)</td>
          <td className="num">
            {n.currentMeasU_W !== null ? f.plusMinus(n.currentMeasU_W) : n.shiftU_W !== null && n.current_W === null ? f.plusMinus(n.shiftU_W) : 'not known'}
            {n.hourU_W !== null && <span className="text-ink-faint"> (one hour {f.plusMinus(n.hourU_W)})</span>}
          </td>
        </tr>
        <tr>
          <td>Cost basis</td>
          <td className="num">{n.costBasis ?? "none: the hours carry no cost and the site has no price for the unit's fuel"}</td>
        </tr>
        <tr>
          <td>Cumulative sum settings</td>
          <td className="num">
            allowance k = {n.k} σ, decision limit h = {n.h} σ
          </td>
        </tr>
      </tbody>
    </table>
  );
}

/** A drift notice's summary: the headline, its figures, how to read them, and the chart. */
export function DriftSummary({ n, chart }: { n: Notice; chart: ChartColumns & { events: NoticeChartEvent[] } }) {
  return (
    <section className="card space-y-4">
      <DriftHeadline n={n} />
      <DriftFigures n={n} />
      <DriftFigureTable n={n} />
      <p className="text-xs text-ink-faint">
        The figures are recomputed at every drift check. The ± is the expanded uncertainty (k = 2) of a mean: the spread of the residuals σ over the effective
        number of independent hours (fewer than the hours when the residuals are correlated from hour to hour), combined with the measurement uncertainty.
        “Beyond measurement uncertainty” compares the current figure with the measurement part alone; when the shift is smaller than one hour’s uncertainty,
        check the instruments first. The shift is growing (or receding) when the current figure is above (or below) the mean since onset by more than their
        combined uncertainty.
      </p>
      <NoticeChart notice={n} chart={chart} events={chart.events} />
    </section>
  );
}
