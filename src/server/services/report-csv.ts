/**
 * The monthly report as CSV: one file, sections one after the other, each with its own head row and
 * a blank line between them; the site's display units in the heads ("measured destruction [MW]"),
 * numbers with a decimal point and no grouping (so spreadsheets read them as numbers), times in the
 * site's clock with its zone named. Every
 * record is written by Papa.unparse (csvLine), so text a spreadsheet would run as a formula (=, +, -,
 * @ ...) is written as text (plain decimal numbers, negative ones included, stay numbers).
 */
import { NOTICE_STATUS_WORDS } from '~/lib/words';
import type { NoticeStatus } from '~/lib/notice-view';
import { csvLine, type CsvCell } from '~/lib/csv-write';
import type { ReportData } from './report';
import { fixed, mwhDecimals, reportNumbers } from './report-format';
import { writerOf } from '~/lib/units/writer';
import { labelOf } from '~/lib/words';
import { siteStamp } from '~/lib/site-time';
import { HOUR_STATES as STATES } from '~/lib/hour-states';

const line = (...cells: CsvCell[]) => csvLine(cells);
/** Numbers of the CSV: the site's display units, plain decimals. */
type Numbers = ReturnType<typeof reportNumbers>;

/** The head: site, month, zone, period, when it was made, and the uncertainty note. */
function headLines(r: ReportData): string[] {
  const tz = r.site.timeZone;
  return [
    line('Lossline monthly site report'),
    line('site', r.site.name),
    line('month', r.month, r.period.label),
    line('time zone', r.site.timeZone),
    line(`period start (${tz})`, siteStamp(r.period.fromMs, tz)),
    line(`period end (${tz}; exclusive)`, siteStamp(r.period.toMs, tz)),
    line(`generated (${tz})`, r.generated),
    line('note', r.uncertaintyNote),
  ];
}

/** The loss ledger: a row per unit and the site total. */
function ledgerLines(r: ReportData): string[] {
  const cur = r.site.currency;
  const dMWh = mwhDecimals(Math.max(0, ...r.ledger.rows.map((x) => x.destruction_MWh), r.ledger.totals.destruction_MWh));
  const out = [line('Loss ledger')];
  out.push(
    line(
      'rank',
      'unit',
      'kind',
      'destruction [MWh]',
      'destruction U (k=2) [MWh]',
      `cost of destruction [${cur}]`,
      `cost U (k=2) [${cur}]`,
      `share of site ${r.ledger.shareBasis} [%]`,
      'efficiency mean [%]',
      'efficiency U (k=2) [%]',
      ...STATES.map((s) => `${s} [h]`),
      'steady hours without cost [h]',
    ),
  );
  for (const x of r.ledger.rows) {
    out.push(
      line(
        x.rank,
        x.name,
        x.kindLabel,
        fixed(x.destruction_MWh, dMWh),
        fixed(x.destruction_U_MWh, dMWh),
        fixed(x.cost, 2),
        fixed(x.cost_U, 2),
        fixed(x.share === null ? null : x.share * 100, 1),
        fixed(x.efficiencyMean === null ? null : x.efficiencyMean * 100, 2),
        fixed(x.efficiencyMean_U === null ? null : x.efficiencyMean_U * 100, 2),
        ...STATES.map((s) => x.hours[s]),
        x.hoursWithoutCost,
      ),
    );
  }
  const t = r.ledger.totals;
  out.push(line('', 'site total', '', fixed(t.destruction_MWh, dMWh), fixed(t.destruction_U_MWh, dMWh), fixed(t.cost, 2), fixed(t.cost_U, 2), t.cost !== null || t.destruction_MWh > 0 ? '100.0' : '', '', '', ...STATES.map((s) => t.hours[s]), ''));
  return out;
}

/** Efficiency against baseline: a row per unit, destruction in the site's power unit. */
function efficiencyLines(r: ReportData, p: Numbers): string[] {
  const P = p.powerUnit;
  const out = [line('Efficiency against baseline (means over the steady hours that have an expected value; over all steady hours when the unit has no baseline)')];
  out.push(
    line(
      'unit',
      'kind',
      'baseline',
      'steady hours [h]',
      'hours compared [h]',
      'measured efficiency [%]',
      'measured efficiency U (k=2) [%]',
      'expected efficiency [%]',
      'measured minus expected [percentage points]',
      `measured destruction [${P}]`,
      `measured destruction U (k=2) [${P}]`,
      `expected destruction [${P}]`,
    ),
  );
  for (const e of r.efficiency) {
    const diff = e.measuredEfficiency !== null && e.expectedEfficiency !== null ? (e.measuredEfficiency - e.expectedEfficiency) * 100 : null;
    out.push(
      line(
        e.name,
        e.kindLabel,
        e.baseline ?? 'no active baseline',
        e.steadyHours,
        e.hoursCompared,
        fixed(e.measuredEfficiency === null ? null : e.measuredEfficiency * 100, 2),
        fixed(e.measuredEfficiency_U === null ? null : e.measuredEfficiency_U * 100, 2),
        fixed(e.expectedEfficiency === null ? null : e.expectedEfficiency * 100, 2),
        fixed(diff, 2),
        p.powerAtU(e.measuredDestruction_W, e.measuredDestruction_U_W),
        p.powerOnlyU(e.measuredDestruction_U_W),
        p.power(e.expectedDestruction_W),
      ),
    );
  }
  return out;
}

/** The drift notices opened in the month or not closed, times in the site's clock. */
function noticeLines(r: ReportData, p: Numbers): string[] {
  const cur = r.site.currency;
  const tz = r.site.timeZone;
  const P = p.powerUnit;
  const at = (ms: number) => siteStamp(ms, r.site.timeZone);
  const out = [line('Drift notices (opened in the month, or not closed)')];
  out.push(
    line('unit', 'direction', 'status', `onset (${tz})`, `signal (${tz})`, 'steady hours onset to signal [h]', `extra destruction [${P}]`, `shift U (k=2) [${P}]`, 'exceeds measurement uncertainty', `extra cost per day [${cur}]`),
  );
  if (!r.notices.length) out.push(line('none'));
  for (const n of r.notices) {
    out.push(
      line(
        n.unitName,
        n.direction === 'up' ? 'more destruction than expected' : 'less destruction than expected',
        NOTICE_STATUS_WORDS[n.status as NoticeStatus]?.label ?? 'other',
        at(n.onsetMs),
        at(n.signalMs),
        n.hours,
        p.powerAtU(n.extra_W, n.shiftU_W),
        p.powerOnlyU(n.shiftU_W),
        n.exceedsUncertainty === null ? 'unknown' : n.exceedsUncertainty ? 'yes' : 'no',
        fixed(n.extraCost_per_day, 2),
      ),
    );
  }
  return out;
}

/** Data quality: hours by state per unit, and the commonest reasons for hours that are not steady. */
function qualityLines(r: ReportData): string[] {
  const out = [line('Data quality: hours by state'), line('unit', ...STATES.map((s) => `${s} [h]`), 'no unit hour [h]')];
  for (const q of r.quality.units) out.push(line(q.name, ...STATES.map((s) => q.hours[s]), q.noHour));
  out.push('');
  out.push(line('Data quality: most frequent reasons for hours that are not steady'));
  out.push(line('reason', 'example', 'hours [h]'));
  if (!r.quality.reasons.length) out.push(line('none'));
  for (const q of r.quality.reasons) out.push(line(labelOf(q.code, 'other reason'), q.example, q.hours));
  return out;
}

/** The lines of the CSV, each already joined (CRLF is added by the writer); a blank line between sections. */
export function reportCsvLines(r: ReportData): string[] {
  const p = reportNumbers(writerOf(r.display), true);
  const sections = [headLines(r), ledgerLines(r), efficiencyLines(r, p), noticeLines(r, p), qualityLines(r)];
  return [...sections.flatMap((s) => [...s, '']), line('Caution'), line(r.caution)];
}

/** The whole CSV as text (UTF-8 with CRLF line ends, as spreadsheets expect). */
export function reportCsv(r: ReportData): string {
  return reportCsvLines(r).join('\r\n') + '\r\n';
}
