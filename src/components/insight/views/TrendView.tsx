/**
 * A unit's trend island: fetches /api/units/:id/trend for the chosen period of the site's clock and
 * draws efficiency and destruction against the expected band, the scatter against load, and the
 * notices of the period.
 */
import { NOTICE_STATUS_WORDS } from '~/lib/words';
import type { NoticeStatus } from '~/lib/notice-view';
import { useMemo, type ReactNode } from 'react';
import { ErrorNote, HourStateMark, Loading, ViewsCaution } from './common';
import { pct, siteTime, type HourState } from './format';
import { writerOf, type SiteDisplayUnits, type SiteWriter } from '~/lib/units/writer';
import { useTrend } from './useTrend';
import { PeriodPicker } from './PeriodPicker';
import { LoadScatter, TimeChart, TrendLegend } from './TrendCharts';
import type { TrendAnswer } from '~/lib/views/trend';
import { GridTable, num } from '~/components/ui/GridTable';

function BaselineName({ b }: { b: TrendAnswer['baseline'] }) {
  return (
    <p className="text-xs text-ink-soft" data-testid="baseline-name">
      {b ? (
        <>
          Expected from <span className="font-semibold text-ink">{b.label}</span>
          {!b.meetsGuideline14 && <span className="ml-1 text-amber-deep">(fit outside ASHRAE Guideline 14 hourly limits: read the band with care)</span>}
          {b.trustWarnings && b.trustWarnings.length > 0 && (
            <span className="ml-1 text-amber-deep" data-testid="baseline-trust">
              (a fit to read with care: {b.trustWarnings.join(' ')})
            </span>
          )}
        </>
      ) : (
        <>No active baseline for this unit yet: the expected band is not shown.</>
      )}
    </p>
  );
}

function Stat({ label, value, sub, testId }: { label: string; value: string; sub?: string; testId?: string }) {
  return (
    <div className="card" data-testid={testId}>
      <p className="text-xs font-medium uppercase tracking-wide text-ink-faint">{label}</p>
      <p className="mt-1 text-lg font-semibold tabular-nums">{value}</p>
      {sub && <p className="text-xs text-ink-soft">{sub}</p>}
    </div>
  );
}

/** One quantity over the period: measured line, expected band, notices, and its legend. */
function TimeCard({ kind, title, data, shown, w, children }: { kind: 'efficiency' | 'destruction'; title: string; data: TrendAnswer; shown: Set<string>; w: SiteWriter; children?: ReactNode }) {
  return (
    <section className="card">
      <h2>{title}</h2>
      <BaselineName b={data.baseline} />
      <TimeChart
        kind={kind}
        points={data.points}
        context={data.context}
        notices={data.notices}
        fromMs={data.period.fromMs}
        toMs={data.period.toMs}
        timeZone={data.site.timeZone}
        bucket={data.bucket}
        loadUnit={data.loadUnit}
        writer={w}
      />
      <TrendLegend kind={kind} shown={shown} />
      {children}
    </section>
  );
}

/** The period's figures: steady hours, mean efficiency and destruction against expected, hours by state. */
function TrendStats({ data, hasEfficiency, w }: { data: TrendAnswer; hasEfficiency: boolean; w: SiteWriter }) {
  const power = (v_W: number | null | undefined, U_W?: number | null) => w.withU(v_W, U_W, 'power');
  return (
    <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
      <Stat
        testId="stat-hours"
        label="Steady hours"
        value={`${data.summary.steadyHours} h of ${data.period.hours} h`}
        sub={data.missingHours ? `${data.missingHours} h without a unit hour` : 'every hour has a unit hour'}
      />
      <Stat
        testId="stat-efficiency"
        label="Mean efficiency"
        value={hasEfficiency ? pct(data.summary.efficiencyMean, data.summary.efficiencyMean_U) : 'none (dissipative)'}
        sub={data.summary.expectedEfficiencyMean !== null ? `expected ${pct(data.summary.expectedEfficiencyMean)}` : undefined}
      />
      <Stat
        testId="stat-destruction"
        label="Mean destruction"
        value={power(data.summary.destructionMean_W, data.summary.destructionMean_U_W)}
        sub={data.summary.expectedDestructionMean_W !== null ? `expected ${power(data.summary.expectedDestructionMean_W)}` : undefined}
      />
      <div className="card">
        <p className="text-xs font-medium uppercase tracking-wide text-ink-faint">Hours by state</p>
        <div className="mt-1 flex flex-col gap-0.5" data-testid="state-hours">
          {(Object.keys(data.stateHours) as HourState[]).map((s) => (
            <HourStateMark key={s} state={s} count={data.stateHours[s]} />
          ))}
        </div>
      </div>
    </div>
  );
}

/** Efficiency (or destruction) of the steady hours against load, with the baseline's curve. */
function LoadCard({ data, hasEfficiency, w }: { data: TrendAnswer; hasEfficiency: boolean; w: SiteWriter }) {
  return (
    <section className="card">
      <h2>{hasEfficiency ? 'Efficiency' : 'Destruction'} against load</h2>
      <BaselineName b={data.baseline} />
      {data.scatter.length === 0 ? (
        <p className="py-4 text-sm text-ink-faint">No steady hours with a load in this period.</p>
      ) : (
        <LoadScatter kind={hasEfficiency ? 'efficiency' : 'destruction'} scatter={data.scatter} curve={data.curve} loadUnit={data.loadUnit} timeZone={data.site.timeZone} writer={w} />
      )}
      <p className="mt-1 text-xs text-ink-faint">
        Dots: steady hours of the period. Dashed line and band: the baseline at the period's mean ambient temperature (k = 2).
      </p>
    </section>
  );
}

/** The drift notices whose onset falls in the period, with the views' caution. */
function TrendNotices({ data, w }: { data: TrendAnswer; w: SiteWriter }) {
  const power = (v_W: number | null | undefined, U_W?: number | null) => w.withU(v_W, U_W, 'power');
  const unitP = w.unit('power');
  return (
    <section className="card" data-testid="trend-notices">
      <h2>Drift notices in the period</h2>
      {data.notices.length === 0 ? (
        <p className="text-sm text-ink-faint">None.</p>
      ) : (
        <GridTable className="mt-2" columns={[<>Onset ({data.site.timeZone})</>, 'Shift', 'Status', num(<>Extra destruction [{unitP}]</>), num(<>Extra cost at signal, onset to signal hours [{data.site.currency}/day]</>)]}>
          {data.notices.map((n) => (
            <tr key={n.id}>
              <td>
                <a href={`/notices/${n.id}`}>{siteTime(n.onsetMs, data.site.timeZone)}</a>
              </td>
              <td>{n.direction === 'up' ? 'more destruction than expected' : 'less destruction than expected'}</td>
              <td>{NOTICE_STATUS_WORDS[n.status as NoticeStatus]?.label ?? 'other'}</td>
              <td className="num">{power(n.extra_W, n.shiftU_W).split(` ${unitP}`).join('')}</td>
              <td className="num">{w.number(n.extraCost_per_day, 0)}</td>
            </tr>
          ))}
        </GridTable>
      )}
      <div className="mt-3">
        <ViewsCaution />
      </div>
    </section>
  );
}

/** `display`: the site's display units (its settings), so powers are in the site's chosen unit whatever their size. */
export default function TrendView({ unitId, initialSearch, display }: { unitId: string; initialSearch: string; display?: SiteDisplayUnits | null }) {
  const w = useMemo(() => writerOf(display), [display]);
  const { value, change, info, data, error, loading } = useTrend(unitId, initialSearch);
  const shown = useMemo(() => new Set(data?.context.map((c) => c.state) ?? []), [data]);
  const total = data ? Object.values(data.stateHours).reduce((a, b) => a + b, 0) : 0;
  const hasEfficiency = !!data?.points.some((p) => p.efficiency !== null);

  return (
    <div className="space-y-4" data-testid="trend-view">
      <PeriodPicker value={value} info={info} onChange={change} />
      {error && <ErrorNote text={error} />}
      {loading && <Loading what="hours" />}
      {data && !loading && total === 0 && (
        <div className="card text-sm text-ink-soft" data-testid="trend-empty">
          <p className="font-medium text-ink">No unit hours in {data.period.label}.</p>
          <p>Pick another period, or upload historian exports for this site; hours appear once the balances are computed.</p>
        </div>
      )}
      {data && !loading && total > 0 && (
        <>
          <TrendStats data={data} hasEfficiency={hasEfficiency} w={w} />

          {hasEfficiency && <TimeCard kind="efficiency" title="Exergy efficiency" data={data} shown={shown} w={w} />}

          <TimeCard kind="destruction" title="Exergy destruction" data={data} shown={shown} w={w}>
            {data.bucket === 'day' && <p className="mt-1 text-xs text-ink-faint">Long periods are drawn per local day: each point is the mean of that day's steady hours.</p>}
          </TimeCard>

          <LoadCard data={data} hasEfficiency={hasEfficiency} w={w} />

          <TrendNotices data={data} w={w} />
        </>
      )}
    </div>
  );
}
