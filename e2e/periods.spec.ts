import { expect, test, type Page } from '@playwright/test';
import { DEMO, signIn } from './helpers';
import { noticeWithChart } from './notice-fixture';
import { stamp, turbineWithHours } from './unit-hours-fixture';

/**
 * Periods with data, freshness and page sizes. An invented site shaped like the demo plant: unit
 * hours from 1 April 2025 to Monday 19 May 2025 16:00 UTC, so the calendar week of the latest hour
 * holds only 17 of its 168 hours and the month 19 days of 31, while earlier full periods exist.
 */
const FIRST = '2025-04-01T00:00:00Z';
const HOURS = 24 * 48 + 17; // to 2025-05-19 16:00 UTC, the start of the last hour

const staleSite = (name: string) => turbineWithHours(name, 'Periods turbine', FIRST, HOURS);

/** The JSON answer of the first response whose URL contains `part`, while `go` runs. */
async function answerOf<T>(page: Page, part: string, go: () => Promise<unknown>): Promise<T> {
  const [res] = await Promise.all([page.waitForResponse((r) => r.url().includes(part) && r.status() === 200), go()]);
  return (await res.json()) as T;
}

interface PeriodAnswer {
  period: { fromMs: number; toMs: number; hours: number; label: string };
  opened: string;
}

/** Fails when a default period has less than half of its hours computed while an earlier full period has data. */
function expectFilled(a: PeriodAnswer, computedHours: number, firstMs: number) {
  const earlierFullExists = firstMs < a.period.fromMs;
  if (earlierFullExists) expect(computedHours, `${a.period.label}: ${computedHours} of ${a.period.hours} hours computed`).toBeGreaterThanOrEqual(a.period.hours / 2);
}

test('trend and ledger open on the latest full period with data, and say that the data is old', async ({ page }) => {
  test.setTimeout(150_000);
  const name = `E2E periods site ${stamp()}`;
  const { siteId, unitId } = await staleSite(name);
  await signIn(page, DEMO['energy-lead']);
  const firstMs = Date.parse(FIRST);

  const trend = await answerOf<PeriodAnswer & { stateHours: Record<string, number> }>(page, `/api/units/${unitId}/trend`, () => page.goto(`/trends/${unitId}`));
  expectFilled(trend, Object.values(trend.stateHours).reduce((x, y) => x + y, 0), firstMs);
  expect(trend.opened).toBe('latest-full');
  await expect(page.getByTestId('period-label')).toContainText('Week of 12 May 2025 · 168 h');
  await expect(page.getByTestId('period-opened')).toContainText('latest full period with data');
  await expect(page.getByTestId('freshness')).toContainText(/Latest data: .* ago \(hour 2025-05-19 16:00–17:00 \(UTC\)\)/);
  await expect(page.getByTestId('period-latest')).toHaveText('Latest full week with data');

  // The month: April, not the 19 days of May.
  await answerOf(page, `/api/units/${unitId}/trend?range=month`, () => page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Month' }).click());
  const month = await answerOf<PeriodAnswer & { stateHours: Record<string, number> }>(page, `/api/units/${unitId}/trend?range=month`, () => page.getByTestId('period-latest').click());
  expect(month.period.label).toBe('April 2025');
  expectFilled(month, Object.values(month.stateHours).reduce((x, y) => x + y, 0), firstMs);

  const ledger = await answerOf<PeriodAnswer & { totals: { hours: Record<string, number> } }>(page, `/api/sites/${siteId}/ledger`, () => page.goto(`/ledger?site=${siteId}&range=month`));
  expectFilled(ledger, Object.values(ledger.totals.hours).reduce((x, y) => x + y, 0), firstMs);
  expect(ledger.period.label).toBe('April 2025');
  await expect(page.getByTestId('freshness')).toBeVisible();
  await expect(page.getByTestId('ledger-table')).toContainText('sum over steady hours of April 2025');

  // The unit's results page says it too, and so does the site's section of the unit list.
  await page.goto(`/units/${unitId}`);
  await expect(page.getByTestId('freshness')).toContainText('Latest data:');
  await page.goto(`/units?site=${siteId}&from=2025-05-12&to=2025-05-18`);
  await expect(page.locator(`section[data-site="${siteId}"]`).getByTestId('freshness')).toContainText('Latest data:');
  await expect(page.getByTestId('days-chosen')).toContainText('2025-05-12 to 2025-05-18 (UTC)');
});

test('reports and the overview open on the latest full period with data, and say that the data is old', async ({ page }) => {
  test.setTimeout(150_000);
  const name = `E2E report periods site ${stamp()}`;
  // Hours to Friday 9 May 2025 16:00 UTC: May holds 209 of its 744 hours (under half), April all 720.
  const { siteId } = await turbineWithHours(name, 'Periods turbine', FIRST, 24 * 38 + 17);
  await signIn(page, DEMO['energy-lead']);
  const firstMonth = FIRST.slice(0, 7);

  // Reports: the month they open on (the one linked as latest) must be at least half computed while an
  // earlier full month has data: April 2025 (720 h computed), not the 9 days of May.
  await page.goto(`/reports?site=${siteId}`);
  const section = page.getByTestId(`reports-site-${name}`);
  await expect(section.getByTestId('freshness')).toContainText(/Latest data: .* ago/);
  const latest = section.getByTestId('report-latest');
  const pdf = await latest.getByRole('link', { name: /^PDF report of / }).getAttribute('href');
  const month = /\/reports\/(\d{4}-\d{2})\/report\.pdf$/.exec(pdf ?? '')?.[1];
  expect(month, `the latest report's link: ${pdf}`).toBeDefined();
  const cells = await section.getByTestId(`report-${month}`).locator('td.num').allTextContents();
  const computed = cells.reduce((sum, c) => sum + Number(c.replace(/[^\d]/g, '')), 0);
  const [y, m] = month!.split('-').map(Number) as [number, number];
  const monthHours = new Date(Date.UTC(y, m, 0)).getUTCDate() * 24; // the site is in UTC: no clock change
  if (firstMonth < month!) expect(computed, `report month ${month}: ${computed} of ${monthHours} hours computed`).toBeGreaterThanOrEqual(monthHours / 2);
  expect(month).toBe('2025-04');
  await expect(latest).toContainText('Latest full month with data: April 2025');
  // Each download link is named with its site and month (not a row of bare "PDF" links).
  await expect(latest.getByRole('link', { name: `CSV report of ${name}, April 2025` })).toHaveAttribute('href', `/api/sites/${siteId}/reports/2025-04/report.csv`);
  await expect(section.getByTestId('report-2025-05').getByRole('link', { name: `PDF report of ${name}, May 2025` })).toBeVisible();

  // The overview has no calendar period: its figures are the 24 hours up to the latest computed hour,
  // so all 24 of them are computed, and it says how old they are.
  await page.goto('/');
  const site = page.getByTestId(`overview-site-${name}`);
  await expect(site.getByTestId('freshness')).toContainText(/Latest data: .* ago/);
  await expect(site).toContainText('The 24 hours to 2025-05-09 17:00 (UTC), up to the latest computed hour');
  const steady = Number(await site.getByTestId('overview-unit-Periods turbine').locator('td.num').first().textContent());
  expect(steady, `overview: ${steady} of 24 hours computed`).toBeGreaterThanOrEqual(12);
});

test('every page for a signed-in admin transfers under 300 KB', async ({ page }) => {
  test.setTimeout(240_000);
  const { siteId, unitId } = await staleSite(`E2E sizes site ${stamp()}`);
  await signIn(page, DEMO.admin);
  const pages = [
    '/', '/uploads', '/plant', `/plant/${siteId}`, '/units', `/units/${unitId}`, '/baselines', '/baselines/new', '/notices',
    '/trends', `/trends/${unitId}`, `/ledger?site=${siteId}`, '/reports', '/admin/users', '/admin/tokens', '/help', '/help/method', '/help/model-file',
  ];
  for (const path of pages) {
    const requests: import('@playwright/test').Request[] = [];
    const listener = (r: import('@playwright/test').Request) => requests.push(r);
    page.on('requestfinished', listener);
    await page.goto(path, { waitUntil: 'networkidle' });
    page.off('requestfinished', listener);
    let bytes = 0;
    for (const r of requests) {
      const s = await r.sizes();
      bytes += s.responseBodySize + s.responseHeadersSize;
    }
    expect(bytes, `${path}: ${bytes} bytes transferred`).toBeLessThan(300 * 1024);
  }
});

test('a drift notice page carries what its chart draws: under 150 KB of HTML, also over two years', async ({ page }) => {
  test.setTimeout(120_000);
  // 330 hourly points: the longest chart drawn per hour (onset - 72 h to the latest figures + 72 h).
  const { noticeId } = await noticeWithChart(`E2E notice size site ${stamp()}`, { chartHours: 330 });
  await signIn(page, DEMO.admin);
  const requests: import('@playwright/test').Request[] = [];
  const listener = (r: import('@playwright/test').Request) => requests.push(r);
  page.on('requestfinished', listener);
  const res = await page.goto(`/notices/${noticeId}`, { waitUntil: 'networkidle' });
  page.off('requestfinished', listener);
  const html = (await res!.body()).length;
  expect(html, `/notices/${noticeId}: ${html} bytes of HTML`).toBeLessThan(150 * 1024);
  let bytes = 0;
  for (const r of requests) {
    const s = await r.sizes();
    bytes += s.responseBodySize + s.responseHeadersSize;
  }
  expect(bytes, `/notices/${noticeId}: ${bytes} bytes transferred`).toBeLessThan(300 * 1024);
  // Every hour of the chart is still drawn.
  await expect(page.getByTestId('drift-chart')).toHaveAttribute('data-span', 'hour');
  await expect(page.getByTestId('drift-chart')).toHaveAttribute('data-points', '330');
  await expect(page.getByTestId('chart-marks')).toContainText('onset');

  // A notice of nearly two years: 700 days merge two by two, and the page stays small.
  const long = await noticeWithChart(`E2E long notice site ${stamp()}`, { first: '2023-06-05T00:00:00Z', hours: 24 * 730, chartHours: 24 * 700 });
  const longRes = await page.goto(`/notices/${long.noticeId}`, { waitUntil: 'networkidle' });
  const longHtml = (await longRes!.body()).length;
  expect(longHtml, `/notices/${long.noticeId}: ${longHtml} bytes of HTML`).toBeLessThan(150 * 1024);
  await expect(page.getByTestId('drift-chart')).toHaveAttribute('data-span', 'day');
  const drawn = Number(await page.getByTestId('drift-chart').getAttribute('data-points'));
  expect(drawn).toBeGreaterThan(300);
  expect(drawn).toBeLessThanOrEqual(500);
  await expect(page.getByTestId('drift-chart').locator('xpath=..')).toContainText('one point per 2 days');
});
