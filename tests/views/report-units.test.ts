/**
 * The monthly report for people in the site's display units and number style: the CSV names the
 * units in its heads ("measured destruction [MW]") and keeps plain decimal numbers; the PDF groups
 * thousands and marks decimals as the site's locale does. Factors: NIST SP 811 (2008) Appendix B.8
 * (1 MW = 10⁶ W, 1 kW = 10³ W); value and ± at the decimals of U: JCGM 100:2008 7.2.6; separators:
 * CLDR as shipped in Node's Intl (de-DE groups with '.', marks decimals with ',').
 */
import { describe, expect, it } from 'vitest';
import { SAFETY_CAUTION } from '~/lib/caution';
import { DEFAULT_DISPLAY_UNITS, type DisplayUnits } from '~/lib/units/display';
import { monthPeriod } from '~/lib/views/period';
import { CODE_PATTERN } from '~/lib/words';
import type { ReportData } from '~/server/services/report';
import { reportCsvLines } from '~/server/services/report-csv';
import { reportPdfBuffer } from '~/server/services/report-pdf';
import { pdfText } from './pdf-text';

const hours = { steady: 600, unsettled: 40, idle: 80, suspect: 23 };

function report(units: DisplayUnits): ReportData {
  const row = {
    rank: 1,
    unitId: 'u1',
    name: 'Boiler B2',
    kind: 'boiler',
    kindLabel: 'boiler',
    hours,
    destruction_MWh: 1234.5,
    destruction_U_MWh: 45.6,
    fuel_MWh: 5000,
    product_MWh: 3500,
    loss_MWh: 265.5,
    cost: 123_456.7,
    cost_U: 4_567.8,
    hoursWithoutCost: 0,
    share: 1,
    efficiencyMean: 0.7,
    efficiencyMean_U: 0.012,
  };
  return {
    site: { id: 's1', name: 'Harbourmouth Mill', timeZone: 'Europe/Berlin', currency: 'EUR' },
    display: { units, p_atm_Pa: 101325 },
    month: '2024-03',
    period: monthPeriod('2024-03', 'Europe/Berlin'),
    generated: '2024-04-02 09:00',
    ledger: { rows: [row], totals: { ...row }, shareBasis: 'cost' },
    efficiency: [
      {
        unitId: 'u1',
        name: 'Boiler B2',
        kindLabel: 'boiler',
        baseline: 'Baseline v1',
        steadyHours: 600,
        hoursCompared: 590,
        measuredEfficiency: 0.7,
        measuredEfficiency_U: 0.012,
        expectedEfficiency: 0.72,
        measuredDestruction_W: 1_567_300,
        measuredDestruction_U_W: 69_950,
        expectedDestruction_W: 1_500_000,
      },
    ],
    notices: [
      { id: 'n1', unitId: 'u1', unitName: 'Boiler B2', direction: 'up', status: 'open', onsetMs: Date.parse('2024-03-12T08:00:00Z'), signalMs: Date.parse('2024-03-12T14:00:00Z'), hours: 6, extra_W: 250_000, shiftU_W: 40_000, exceedsUncertainty: true, extraCost_per_day: 1_920.4, currency: 'EUR' },
    ],
    quality: { units: [{ unitId: 'u1', name: 'Boiler B2', hours, noHour: 0 }], reasons: [] },
    caution: SAFETY_CAUTION,
    uncertaintyNote: 'Uncertainties are expanded (k = 2).',
  };
}

const MW: DisplayUnits = { ...DEFAULT_DISPLAY_UNITS, power: 'MW', pressure: 'barg', locale: 'de-DE' };

describe('the report in the site display units', () => {
  it('NIST SP 811 B.8: the CSV names MW in its heads and writes 1 567 300 W ± 69 950 W as 1.567 and 0.070, with no kW head', () => {
    const lines = reportCsvLines(report(MW));
    const text = lines.join('\n');
    expect(text).toContain('measured destruction [MW]');
    expect(text).toContain('extra destruction [MW]');
    expect(text).not.toMatch(/\[kW\]|\[W\]|\[Pa\]/);
    const eff = lines.find((l) => l.startsWith('Boiler B2,boiler,Baseline v1'))!;
    // Plain numbers for spreadsheets even in a de-DE site: a decimal point, no grouping.
    expect(eff.split(',').slice(-3)).toEqual(['1.567', '0.070', '1.50']);
    // 250 000 W ± 40 000 W = 0.250 MW ± 0.040 MW.
    expect(lines.find((l) => l.startsWith('Boiler B2,more destruction'))).toContain(',0.250,0.040,');
    // Times in the site's clock with its zone named: 08:00 UTC is 09:00 in Berlin in March.
    expect(text).toContain('onset (Europe/Berlin)');
    expect(text).toContain('2024-03-12 09:00');
    expect(text).toContain('period start (Europe/Berlin),2024-03-01 00:00');
    expect(text.match(new RegExp(CODE_PATTERN.source, 'g')) ?? []).toEqual([]);
  });

  it('a kW site keeps kW heads: 1 567 300 W ± 69 950 W is 1567 and 70', () => {
    const lines = reportCsvLines(report({ ...DEFAULT_DISPLAY_UNITS, power: 'kW' }));
    expect(lines.join('\n')).toContain('measured destruction [kW]');
    expect(lines.find((l) => l.startsWith('Boiler B2,boiler,Baseline v1'))!.split(',').slice(-3)).toEqual(['1567', '70', '1500']);
  });

  it('CLDR de-DE: the PDF groups with "." and marks decimals with ",", power in MW with its ± at the same decimals', async () => {
    const text = pdfText(await reportPdfBuffer(report(MW)));
    expect(text).toContain('Measured destruction [MW]');
    expect(text).toContain('Extra destruction [MW]');
    expect(text).not.toMatch(/\[kW\]/);
    // 1.567 MW ± 0.070 MW in de-DE.
    expect(text).toContain('1,567 ± 0,070');
    // Money grouped by the locale: EUR 123 456.7 ± 4 567.8 -> "123.457 ± 4.568".
    expect(text).toContain('123.457 ± 4.568');
    expect(text).toMatch(/Onset \(Europe\/\s?Berlin\)/); // the head may wrap after the slash
    expect(text).toContain('2024-03-12 09:00');
  });

  it('CLDR en-GB: the PDF groups with ","', async () => {
    const text = pdfText(await reportPdfBuffer(report({ ...DEFAULT_DISPLAY_UNITS, power: 'kW', locale: 'en-GB' })));
    expect(text).toContain('123,457 ± 4,568');
    expect(text).toContain('1,567 ± 70');
    expect(text).toContain('Measured destruction [kW]');
  });
});
