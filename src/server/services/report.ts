/**
 * The monthly site report: the loss ledger, each unit's efficiency against its baseline (measured
 * mean against expected mean over the same steady hours), drift notices, a data-quality summary
 * (hours by state, the most frequent reasons) and the caution of docs/domain.md section 8.
 * ./report-csv.ts and ./report-pdf.ts write it out; this file only gathers the figures.
 */
import { and, asc, eq, gte, lt, sql } from 'drizzle-orm';
import { db } from '../db/client';
import { SAFETY_CAUTION } from '~/lib/caution';
import { zeroStateCounts, type HourState, type StateCounts } from '~/lib/hour-states';
import { siteStamp } from '~/lib/site-time';
import { kindLabel, ledgerFrom, type LedgerAnswer } from '~/lib/views/ledger';
import { defaultPeriod, monthPeriod, resolvePeriod, type Period, type PeriodChoice } from '~/lib/views/period';
import type { SiteDisplayUnits } from '~/lib/units/writer';
import { meanOf } from '~/lib/views/trend';
import { plantUnits, sites, unitHours } from '../db/schema';
import { AppError } from '../errors';
import { isId } from '../access';
import { expectedBand, siteNotices, type NoticeMark } from './views-insight';
import { dataSpan, unitSums } from './views';
import { displaysOf } from './notice-display';

/** How the report's uncertainties are to be read. */
export const REPORT_UNCERTAINTY_NOTE =
  'Only steady hours count in sums and means. Uncertainties are expanded (k = 2); for sums and means the hourly ' +
  'uncertainties are added as fully correlated (instrument bias does not average out), which is the cautious reading.';

export interface EfficiencyVsBaseline {
  unitId: string;
  name: string;
  kindLabel: string;
  baseline: string | null;
  steadyHours: number;
  /** Steady hours with an expected value (the hours compared). */
  hoursCompared: number;
  /**
   * Means over the compared hours (over every steady hour when there is no baseline): efficiency [-],
   * destruction [W]; measured U is the mean hourly U.
   */
  measuredEfficiency: number | null;
  measuredEfficiency_U: number | null;
  expectedEfficiency: number | null;
  measuredDestruction_W: number | null;
  measuredDestruction_U_W: number | null;
  expectedDestruction_W: number | null;
}

export interface ReportData {
  site: { id: string; name: string; timeZone: string; currency: string };
  /** The site's display units: the report writes power in them (the API keeps SI). */
  display: SiteDisplayUnits;
  month: string;
  period: Period;
  generated: string;
  ledger: Pick<LedgerAnswer, 'rows' | 'totals' | 'shareBasis'>;
  efficiency: EfficiencyVsBaseline[];
  notices: NoticeMark[];
  quality: {
    units: { unitId: string; name: string; hours: StateCounts; noHour: number }[];
    reasons: { code: string; example: string; hours: number }[];
  };
  caution: string;
  uncertaintyNote: string;
}

async function siteRow(siteId: string) {
  if (!isId(siteId)) throw new AppError('NOT_FOUND', 'No such site.');
  const [site] = await db().select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  return site;
}

function monthOrError(month: string, timeZone: string): Period {
  try {
    return monthPeriod(month, timeZone);
  } catch (err) {
    throw new AppError('VALIDATION_FAILED', (err as Error).message);
  }
}


/** Every figure of a site's report for a calendar month 'yyyy-MM' of the site. */
export async function reportData(siteId: string, month: string, nowMs = Date.now()): Promise<ReportData> {
  const site = await siteRow(siteId);
  const period = monthOrError(month, site.timeZone);
  const sums = await unitSums(site.id, period.fromMs, period.toMs);
  const ledger = ledgerFrom(sums);

  const units = await db().select({ id: plantUnits.id, name: plantUnits.name, kind: plantUnits.kind }).from(plantUnits).where(eq(plantUnits.siteId, site.id)).orderBy(asc(plantUnits.name));
  const efficiency: EfficiencyVsBaseline[] = [];
  for (const u of units) {
    const hours = await db()
      .select({ hourStart: unitHours.hourStart, load: unitHours.load, T0_K: unitHours.T0_K, efficiency: unitHours.efficiency, efficiency_U: unitHours.efficiency_U, destruction_W: unitHours.destruction_W, destruction_U_W: unitHours.destruction_U_W })
      .from(unitHours)
      .where(and(eq(unitHours.unitId, u.id), eq(unitHours.state, 'steady'), gte(unitHours.hourStart, new Date(period.fromMs)), lt(unitHours.hourStart, new Date(period.toMs))))
      .orderBy(asc(unitHours.hourStart));
    const { baseline, expected } = await expectedBand(u.id, hours);
    const paired = hours.map((h, i) => ({ h, e: expected[i] })).filter((p) => p.e);
    // Without a baseline the measured means still stand, over every steady hour.
    const basis = paired.length ? paired : hours.map((h) => ({ h, e: null }));
    const m = (list: typeof basis, f: (p: (typeof basis)[number]) => number | null | undefined) => meanOf(list.map((p) => f(p) ?? null));
    const effBasis = basis.filter((p) => p.h.efficiency !== null && (!p.e || p.e.efficiency !== null));
    efficiency.push({
      unitId: u.id,
      name: u.name,
      kindLabel: kindLabel(u.kind),
      baseline: baseline?.label ?? null,
      steadyHours: hours.length,
      hoursCompared: paired.length,
      measuredEfficiency: m(effBasis, (p) => p.h.efficiency),
      measuredEfficiency_U: m(effBasis, (p) => p.h.efficiency_U),
      expectedEfficiency: m(effBasis, (p) => p.e?.efficiency),
      measuredDestruction_W: m(basis, (p) => p.h.destruction_W),
      measuredDestruction_U_W: m(basis, (p) => p.h.destruction_U_W),
      expectedDestruction_W: m(basis, (p) => p.e?.destruction_W),
    });
  }

  // Notices opened in the month, and those still not closed however old.
  const touching = await siteNotices({ siteId: site.id, fromMs: period.fromMs, toMs: period.toMs });
  const stillOpen = await siteNotices({ siteId: site.id, openOnly: true });
  const notices = [...new Map([...touching, ...stillOpen].map((n) => [n.id, n])).values()].sort((a, b) => a.onsetMs - b.onsetMs);

  const from = new Date(period.fromMs).toISOString();
  const to = new Date(period.toMs).toISOString();
  const reasonRows = await db().execute<{ code: string; example: string; hours: number }>(sql`
    select r->>'code' as code, min(r->>'message') as example, count(distinct (h.unit_id, h.hour_start))::int as hours
    from unit_hours h
    join plant_units u on u.id = h.unit_id
    cross join lateral jsonb_array_elements(h.reasons) r
    where u.site_id = ${site.id} and h.state <> 'steady' and h.hour_start >= ${from}::timestamptz and h.hour_start < ${to}::timestamptz
    group by r->>'code'
    order by hours desc, code
    limit 10`);

  return {
    site: { id: site.id, name: site.name, timeZone: site.timeZone, currency: site.currency },
    display: (await displaysOf([site.id])).get(site.id)!,
    month,
    period,
    generated: siteStamp(nowMs, site.timeZone),
    ledger,
    efficiency,
    notices,
    quality: {
      units: sums.map((a) => {
        const counted = a.hours.steady + a.hours.unsettled + a.hours.idle + a.hours.suspect;
        return { unitId: a.unitId, name: a.name, hours: a.hours, noHour: Math.max(0, period.hours - counted) };
      }),
      reasons: reasonRows.rows.map((r) => ({ code: String(r.code ?? 'unspecified'), example: String(r.example ?? ''), hours: Number(r.hours) })),
    },
    caution: SAFETY_CAUTION,
    uncertaintyNote: REPORT_UNCERTAINTY_NOTE,
  };
}

/**
 * The month a site's reports open on: the latest FULL month with data (the rule of
 * src/lib/views/period.ts defaultPeriod: the month holding the latest computed hour when that hour
 * closes it), else the newest earlier month that has unit hours, else the partial month; null
 * without data. @param monthsWithData 'yyyy-MM' months that have unit hours, newest first
 */
export async function reportDefaultMonth(siteId: string, timeZone: string, monthsWithData: string[], nowMs = Date.now()): Promise<{ month: string; label: string; choice: PeriodChoice } | null> {
  const span = await dataSpan(siteId, undefined, nowMs);
  if (!span || !monthsWithData.length) return null;
  const { period, choice } = defaultPeriod('month', timeZone, span, nowMs);
  const holding = resolvePeriod({ range: 'month' }, timeZone, span.lastMs);
  const pick = (month: string, c: PeriodChoice) => ({ month, label: monthPeriod(month, timeZone).label, choice: c });
  if (period.fromMs === holding.fromMs) return pick(period.firstDay.slice(0, 7), choice);
  const earlier = monthsWithData.find((m) => m < holding.firstDay.slice(0, 7));
  return earlier ? pick(earlier, 'latest-full') : pick(holding.firstDay.slice(0, 7), 'latest-partial');
}

/** Months (yyyy-MM, the site's calendar) with unit hours at a site, newest first, with hours by state and the month reports open on. */
export async function reportMonths(siteId: string): Promise<{
  site: { id: string; name: string; timeZone: string };
  months: { month: string; label: string; hours: Record<HourState, number> }[];
  latest: { month: string; label: string; choice: PeriodChoice } | null;
}> {
  const site = await siteRow(siteId);
  const res = await db().execute<{ month: string; state: HourState; n: number }>(sql`
    select to_char(h.hour_start at time zone ${site.timeZone}, 'YYYY-MM') as month, h.state, count(*)::int as n
    from unit_hours h join plant_units u on u.id = h.unit_id
    where u.site_id = ${site.id}
    group by 1, 2`);
  const byMonth = new Map<string, StateCounts>();
  for (const r of res.rows) {
    const m = byMonth.get(r.month) ?? zeroStateCounts();
    m[r.state] = Number(r.n);
    byMonth.set(r.month, m);
  }
  const months = [...byMonth.entries()]
    .sort((a, b) => b[0].localeCompare(a[0]))
    .map(([month, hours]) => ({ month, label: monthPeriod(month, site.timeZone).label, hours }));
  return { site: { id: site.id, name: site.name, timeZone: site.timeZone }, months, latest: await reportDefaultMonth(site.id, site.timeZone, months.map((m) => m.month)) };
}

/** A file name for the report: letters, digits and dashes only. */
export function reportFileName(siteName: string, month: string, ext: 'pdf' | 'csv'): string {
  const slug = siteName
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/[\s_]+/g, '-')
    .toLowerCase()
    .slice(0, 60);
  return `lossline-report-${slug || 'site'}-${month}.${ext}`;
}
