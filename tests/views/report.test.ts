import { beforeAll, expect, it } from 'vitest';
import { GET as getPdf } from '~/pages/api/sites/[siteId]/reports/[month]/report.pdf';
import { GET as getCsv } from '~/pages/api/sites/[siteId]/reports/[month]/report.csv';
import { GET as getMonths } from '~/pages/api/sites/[siteId]/reports/index';
import { db } from '~/server/db/client';
import { driftNotices } from '~/server/db/schema';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { SAFETY_CAUTION } from '~/lib/caution';
import { reportData } from '~/server/services/report';
import { expectedBand } from '~/server/services/views-insight';
import { describeIntegration } from '../support/integration';
import { expectClose } from '../support/expect-close';
import { HOUR, addHours, ctx, inventedSite, type HourRow } from './support';
import { pdfText } from './pdf-text';

/** Reads the CSV as a spreadsheet would: rows of cells (quotes undone). */
function cells(csv: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < csv.length; i++) {
    const ch = csv[i]!;
    if (quoted) {
      if (ch === '"' && csv[i + 1] === '"') (cell += '"'), i++;
      else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') row.push(cell), (cell = '');
    else if (ch === '\n') row.push(cell.replace(/\r$/, '')), rows.push(row), (row = []), (cell = '');
    else cell += ch;
  }
  return rows;
}

describeIntegration('monthly report', () => {
  let siteId: string;
  let units: Map<string, string>;
  const EVIL = "=cmd|' /C calc'!A0";

  beforeAll(async () => {
    ({ site: { id: siteId }, units } = await inventedSite({
      timeZone: 'Europe/Berlin',
      units: [
        { name: 'Steam turbine ST1', kind: 'turbine' },
        { name: EVIL, kind: 'pump' },
      ],
    }));
    const st = units.get('Steam turbine ST1')!;
    // Baseline on January: efficiency 0.70 + 0.10 load, destruction 200 kW + 100 kW x load (wiggle 0.0005, 0.5 kW).
    const jan = Date.parse('2024-01-10T00:00:00Z');
    const row = (t: number, i: number, over: Partial<HourRow> = {}): HourRow => {
      const load = 0.4 + 0.05 * (i % 12);
      return {
        hourStart: new Date(t),
        state: 'steady',
        load,
        T0_K: 285 + (i % 7),
        efficiency: 0.7 + 0.1 * load + 0.0005 * Math.sin(i),
        efficiency_U: 0.01,
        destruction_W: 2e5 + 1e5 * load + 500 * Math.cos(i),
        destruction_U_W: 1e4,
        destructionCost_per_h: 8,
        fuel_W: 1e6,
        product_W: 7.5e5,
        ...over,
      };
    };
    await addHours(st, Array.from({ length: 48 }, (_, i) => row(jan + i * HOUR, i)));
    const b = await fitDraft(st, { periodFrom: new Date(jan), periodTo: new Date(jan + 48 * HOUR), terms: ['load', 'T_amb'] }, null);
    await acceptBaseline(b.id, null);
    // March 2024 (Berlin): 10 steady hours each 0.02 below the baseline's efficiency, one suspect hour.
    const mar = Date.parse('2024-03-12T08:00:00Z');
    await addHours(st, [
      ...Array.from({ length: 10 }, (_, i) => row(mar + i * HOUR, i, { efficiency: 0.7 + 0.1 * (0.4 + 0.05 * i) - 0.02 })),
      row(mar + 10 * HOUR, 10, { state: 'suspect', reasons: [{ code: 'out-of-range', message: 'ST1_P_IN above its valid range' }] }),
    ]);
    await addHours(units.get(EVIL)!, [row(mar, 0, { efficiency: 0.5, destructionCost_per_h: 3, destruction_W: 3e4 }), row(mar + HOUR, 1, { state: 'idle', reasons: [{ code: '@SUM(1+1)', message: '-2+3' }] })]);
    await db().insert(driftNotices).values({
      siteId,
      unitId: st,
      direction: 'up',
      onsetHour: new Date(mar),
      signalHour: new Date(mar + 6 * HOUR),
      lastSignalHour: new Date(mar + 6 * HOUR),
      hours: 6,
      extra_W: 2.5e4,
      expected_W: 2.6e5,
      shift_sigma: 4.2,
      shiftU_W: 4e3,
      exceedsUncertainty: true,
      extraCost_per_day: 19.2,
      currency: 'EUR',
      k: 0.5,
      h: 5,
    });
  });

  it('hand-worked: measured against expected efficiency over the same steady hours, the notice and the data quality', async () => {
    const r = await reportData(siteId, '2024-03');
    expect(r.period.from).toBe('2024-02-29T23:00:00.000Z'); // 1 March 00:00 in Berlin (UTC+01:00)
    const e = r.efficiency.find((x) => x.name === 'Steam turbine ST1')!;
    expect(e.hoursCompared).toBe(10);
    // Measured: mean of 0.70 + 0.10 (0.40 + 0.05 i) - 0.02 for i = 0..9 = 0.70 + 0.10 x 0.625 - 0.02 = 0.7425.
    expectClose(e.measuredEfficiency!, 0.7425, { rtol: 1e-12 });
    // Expected: the baseline gives 0.70 + 0.10 x 0.625 = 0.7625 within its wiggle.
    expectClose(e.expectedEfficiency!, 0.7625, { atol: 1e-3 });
    expect(e.baseline).toMatch(/^Baseline v1/);
    // A unit without a baseline still shows its measured mean, over all its steady hours (one, at 0.50).
    const pump = r.efficiency.find((x) => x.name === EVIL)!;
    expect([pump.baseline, pump.steadyHours, pump.hoursCompared, pump.measuredEfficiency, pump.expectedEfficiency]).toEqual([null, 1, 0, 0.5, null]);
    expect(r.notices.map((n) => [n.unitName, n.direction, n.status])).toEqual([['Steam turbine ST1', 'up', 'open']]);
    expect(r.quality.units.find((q) => q.name === 'Steam turbine ST1')!.hours).toEqual({ steady: 10, unsettled: 0, idle: 0, suspect: 1 });
    // March in Berlin has 743 hours (31 x 24 - 1 for summer time): 743 - 11 = 732 without a unit hour.
    expect(r.quality.units.find((q) => q.name === 'Steam turbine ST1')!.noHour).toBe(732);
    expect(r.quality.reasons.map((q) => [q.code, q.hours])).toEqual([
      ['@SUM(1+1)', 1],
      ['out-of-range', 1],
    ]);
    // Ledger: turbine 10 x 8 = 80 EUR, the pump 3 EUR.
    expect(r.ledger.rows.map((x) => [x.name, x.cost])).toEqual([
      ['Steam turbine ST1', 80],
      [EVIL, 3],
    ]);
  });

  it('the CSV neutralises cells a spreadsheet would run as formulas, keeps negative numbers as numbers, and carries the caution', async () => {
    const res = await getCsv(ctx(`/api/sites/${siteId}/reports/2024-03/report.csv`, { siteId, month: '2024-03' }));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="lossline-report-views-test-site-[0-9a-f]{8}-2024-03\.csv"$/);
    const text = (await res.text()).replace(/^\ufeff/, '');
    const rows = cells(text);
    const all = rows.flat();
    // No cell starts with a formula character unless it is a plain number.
    const risky = all.filter((c) => /^[=+\-@\t\r]/.test(c) && !/^-?\d+(\.\d+)?$/.test(c));
    expect(risky).toEqual([]);
    expect(all).toContain(`'${EVIL}`);
    // A reason code reaches the report for people as words, never as the code (src/lib/words).
    expect(all.some((c) => c.includes('SUM(1+1)'))).toBe(false);
    expect(all).toContain('other reason');
    expect(all).toContain("'-2+3");
    // The efficiency difference is negative and stays a number: 74.25 - 76.25 = -2.00 percentage points, within the fit's wiggle.
    const eff = rows.find((r) => r[0] === 'Steam turbine ST1' && r[2]?.startsWith('Baseline'))!;
    expect(Number(eff[8])).toBeCloseTo(-2, 0);
    expect(eff[8]).toMatch(/^-\d/);
    expect(all).toContain(SAFETY_CAUTION);
  });

  it('the PDF endpoint streams a PDF set in IBM Plex Sans that names the units and carries the caution', async () => {
    const res = await getPdf(ctx(`/api/sites/${siteId}/reports/2024-03/report.pdf`, { siteId, month: '2024-03' }));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('content-disposition')).toMatch(/filename="lossline-report-.*-2024-03\.pdf"$/);
    const pdf = Buffer.from(await res.arrayBuffer());
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.subarray(-6).toString('latin1')).toMatch(/%%EOF\s*$/);
    expect(pdf.length).toBeGreaterThan(10_000);
    expect(pdf.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+IBMPlexSans/);
    const text = pdfText(pdf);
    expect(text).toContain('Steam turbine ST1');
    expect(text).toContain(EVIL);
    expect(text).toContain('March 2024');
    expect(text).toContain('Loss ledger');
    expect(text).toContain('more destruction than expected');
    expect(text).toContain('monitoring aid');
  });

  it('the trend says beside the baseline line that a fit on 48 steady hours (less than a week) is to be read with care', async () => {
    const { baseline } = await expectedBand(units.get('Steam turbine ST1')!, []);
    expect(baseline!.trustWarnings!.join(' ')).toContain('Fitted on only 48 steady hours');
  });

  it('lists the months with unit hours, newest first, and refuses a month that is not one', async () => {
    const res = await getMonths(ctx(`/api/sites/${siteId}/reports`, { siteId }));
    const body = await res.json();
    expect(body.months.map((m: { month: string }) => m.month)).toEqual(['2024-03', '2024-01']);
    expect(body.months[0].pdf).toBe(`/api/sites/${siteId}/reports/2024-03/report.pdf`);
    expect(body.months[0].hours).toEqual({ steady: 11, unsettled: 0, idle: 1, suspect: 1 });
    // The latest hour (12 March 2024) does not close March, and February has no hours: the reports open on
    // January, the latest full month with data (src/lib/views/period.ts defaultPeriod; issue 13).
    expect(body.latest).toEqual({ month: '2024-01', label: 'January 2024', choice: 'latest-full' });
    const bad = await getCsv(ctx(`/api/sites/${siteId}/reports/2024-13/report.csv`, { siteId, month: '2024-13' }));
    expect(bad.status).toBe(400);
  });
});
