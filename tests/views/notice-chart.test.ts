/**
 * The shaping of a drift notice's chart (src/lib/views/notice-chart.ts), worked by hand: what a daily
 * point covers in words, the residuals in the site's power unit, and the marks inside the drawn span.
 */
import { expect, it } from 'vitest';
import { eventsWithin, noticeChartData, pointSpanWords } from '~/lib/views/notice-chart';
import { siteWriter } from '~/lib/units/writer';
import { DEFAULT_DISPLAY_UNITS } from '~/lib/units/display';
import { HOUR_MS } from '~/lib/time';

it('says how many days a point covers', () => {
  expect(pointSpanWords(1)).toBe('day');
  expect(pointSpanWords(24)).toBe('day');
  expect(pointSpanWords(48)).toBe('2 days');
  expect(pointSpanWords(7 * 24)).toBe('7 days');
});

it('turns the columns into points in the site power unit', () => {
  const chart = { span: 'hour' as const, perHours: 1, t0: '2024-03-01T00:00:00Z', at_min: [0, 60, 180], residual_kW: [1500, -250, 0], cusum: [0, 0.5, 2.25] };
  const t0 = Date.parse('2024-03-01T00:00:00Z');
  const inMW = noticeChartData(chart, siteWriter({ ...DEFAULT_DISPLAY_UNITS, power: 'MW' }));
  expect(inMW).toEqual([
    { t: t0, residual: 1.5, cusum: 0 },
    { t: t0 + HOUR_MS, residual: -0.25, cusum: 0.5 },
    { t: t0 + 3 * HOUR_MS, residual: 0, cusum: 2.25 },
  ]);
  // A writer with nothing to show draws 0 rather than leaving a hole.
  expect(noticeChartData(chart, { shown: () => null }).map((p) => p.residual)).toEqual([0, 0, 0]);
});

it('keeps the marks inside the drawn span, ends included', () => {
  const t0 = Date.parse('2024-03-01T00:00:00Z');
  const t1 = Date.parse('2024-03-02T00:00:00Z');
  const events = [
    { t: '2024-02-29T23:59:59Z', label: 'before' },
    { t: '2024-03-01T00:00:00Z', label: 'first' },
    { t: '2024-03-01T12:00:00+02:00', label: 'middle' },
    { t: '2024-03-02T00:00:00Z', label: 'last' },
    { t: '2024-03-02T00:00:01Z', label: 'after' },
  ];
  expect(eventsWithin(events, t0, t1).map((e) => e.label)).toEqual(['first', 'middle', 'last']);
});
