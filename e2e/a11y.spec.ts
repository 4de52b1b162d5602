import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page, type Request } from '@playwright/test';
import { navFor } from '~/lib/navigation';
import type { Role } from '~/lib/roles';
import { DEMO, DEMO_PASSWORD } from './helpers';
import { codesOnPage } from './words-scan';

/**
 * Every page each role can reach, at 1440 px, in one browser context per role and one page after
 * another: no WCAG 2.1 AA violation that axe-core finds (tags wcag2a, wcag2aa, wcag21a, wcag21aa),
 * no horizontal overflow of the document, the main navigation on one line, and every numeric column
 * head right-aligned over its numbers, no code or identifier of the word catalogue in the visible
 * text, and no page transferring 300 KB or more (what the browser fetched for it, its cache warm from
 * the pages before, as a person moving through the product would have it). The pages are the role's navigation plus the first detail
 * page each list links to (a site, a unit of the model, a unit's hours, a baseline, a notice, a
 * trend), so a new page is checked as soon as it is listed or linked. Every problem of every page is
 * collected before the test fails, so one run names them all.
 */
const WCAG_21_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const WIDTH = 1440;
const MAX_PAGE_BYTES = 300 * 1024;

/** Detail pages reached from the lists: the first link of each pattern found on the pages visited. */
const DETAIL_PAGES = [
  /^\/plant\/[0-9a-f-]{36}$/,
  /^\/plant\/[0-9a-f-]{36}\/units\/[0-9a-f-]{36}$/,
  /^\/units\/[0-9a-f-]{36}$/,
  /^\/baselines\/[0-9a-f-]{36}$/,
  /^\/baselines\/new(\?.*)?$/,
  /^\/notices\/[0-9a-f-]{36}$/,
  /^\/trends\/[0-9a-f-]{36}(\?.*)?$/,
];

/** Pages are given a minute each: on a shared machine the first render of a page can be slow. */
const SLOW = { timeout: 60_000 };

async function settle(page: Page) {
  await page.waitForLoadState('networkidle', SLOW);
  await expect(page.locator('astro-island[ssr]')).toHaveCount(0, SLOW);
  await expect(page.getByTestId('loading')).toHaveCount(0, SLOW);
}

async function signIn(page: Page, email: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('signed-in-user')).toBeVisible(SLOW);
}

/** What is wrong with the page in view, as sentences naming the page; empty when nothing is. */
async function problemsOf(page: Page, path: string): Promise<string[]> {
  const out: string[] = [];
  const axe = await new AxeBuilder({ page }).withTags(WCAG_21_AA).analyze();
  for (const v of axe.violations) {
    const where = v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ');
    out.push(`${path}: axe ${v.id} (${v.impact}) on ${v.nodes.length} element(s): ${v.help} [${where}]`);
  }
  const layout = await page.evaluate(() => {
    const doc = document.documentElement;
    const links = [...document.querySelectorAll('nav[aria-label="Main"] a')].map((a) => Math.round(a.getBoundingClientRect().top));
    const heads = [...document.querySelectorAll('th.num')].filter((th) => getComputedStyle(th).textAlign !== 'right').map((th) => th.textContent?.trim() ?? '');
    return { scrollWidth: doc.scrollWidth, clientWidth: doc.clientWidth, navLines: new Set(links).size, heads };
  });
  if (layout.scrollWidth > layout.clientWidth) out.push(`${path}: the page is ${layout.scrollWidth} px wide in a ${layout.clientWidth} px window (horizontal overflow)`);
  if (layout.navLines > 1) out.push(`${path}: the main navigation wraps onto ${layout.navLines} lines`);
  if (layout.heads.length) out.push(`${path}: numeric column heads not right-aligned: ${layout.heads.join('; ')}`);
  for (const code of await codesOnPage(page)) out.push(`${path}: a code instead of words: ${code}`);
  return out;
}

/** The role's pages and the details they link to, each visited once and checked. */
async function walk(page: Page, role: Role): Promise<{ visited: string[]; problems: string[] }> {
  const queue = navFor(role).map((n) => n.href);
  const found = new Set<RegExp>();
  const visited: string[] = [];
  const problems: string[] = [];
  while (queue.length) {
    const path = queue.shift()!;
    const requests: Request[] = [];
    const listener = (r: Request) => requests.push(r);
    page.on('requestfinished', listener);
    const res = await page.goto(path, SLOW);
    expect(res?.status(), `${path} answers for ${role}`).toBe(200);
    await settle(page);
    page.off('requestfinished', listener);
    let bytes = 0;
    for (const r of requests) {
      const s = await r.sizes();
      bytes += s.responseBodySize + s.responseHeadersSize;
    }
    if (bytes >= MAX_PAGE_BYTES) problems.push(`${path}: ${Math.round(bytes / 1024)} KB transferred (limit ${MAX_PAGE_BYTES / 1024} KB)`);
    visited.push(path);
    problems.push(...(await problemsOf(page, path)));
    const hrefs = await page.locator('main a[href^="/"]').evaluateAll((as) => as.map((a) => a.getAttribute('href') ?? ''));
    for (const pattern of DETAIL_PAGES) {
      if (found.has(pattern)) continue;
      const hit = hrefs.find((h) => pattern.test(h));
      if (hit) {
        found.add(pattern);
        queue.push(hit);
      }
    }
  }
  return { visited, problems };
}

test.describe.configure({ timeout: 600_000 });

for (const role of Object.keys(DEMO) as Role[]) {
  test(`every page a ${role} reaches meets WCAG 2.1 AA (axe-core), fits 1440 px, keeps the navigation on one line, shows words not codes and transfers under 300 KB`, async ({ browser }) => {
    const context = await browser.newContext({ viewport: { width: WIDTH, height: 900 } });
    const page = await context.newPage();
    await signIn(page, DEMO[role]);
    const { visited, problems } = await walk(page, role);
    await context.close();
    expect(visited.length).toBeGreaterThanOrEqual(navFor(role).length);
    expect(problems, `pages visited: ${visited.join(', ')}`).toEqual([]);
  });
}

test('the pages before signing in meet WCAG 2.1 AA and fit 1440 px', async ({ browser }) => {
  const context = await browser.newContext({ viewport: { width: WIDTH, height: 900 } });
  const page = await context.newPage();
  const problems: string[] = [];
  for (const path of ['/sign-in', '/forgot-password', '/set-password']) {
    await page.goto(path);
    await settle(page);
    problems.push(...(await problemsOf(page, path)));
  }
  await context.close();
  expect(problems).toEqual([]);
});

test('self-consistency: the checks see a violation, an overflow, a misaligned numeric head and a code when there is one', async ({ page }) => {
  await page.setViewportSize({ width: WIDTH, height: 900 });
  await page.setContent(
    '<html lang="en"><body><main><p>Why: SPREAD_HIGH</p><img src="x.png"><div style="width:3000px">wide</div><table><tr><th class="num">x</th></tr></table></main></body></html>',
  );
  const problems = await problemsOf(page, 'sample');
  expect(problems.some((p) => p.includes('axe image-alt'))).toBe(true);
  expect(problems.some((p) => p.includes('horizontal overflow'))).toBe(true);
  expect(problems.some((p) => p.includes('numeric column heads'))).toBe(true);
  expect(problems.some((p) => p.includes('a code instead of words') && p.includes('SPREAD_HIGH'))).toBe(true);
});
