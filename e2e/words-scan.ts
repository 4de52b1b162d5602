import { expect, type Page } from '@playwright/test';
import { CODE_PATTERN } from '~/lib/words';

/** Every code found in the visible text (and option texts) of the page, with some text around it. */
export async function codesOnPage(page: Page): Promise<string[]> {
  await page.waitForLoadState('networkidle');
  await expect(page.getByTestId('loading')).toHaveCount(0);
  const text = await page.evaluate(() => {
    const options = [...document.querySelectorAll('option')].map((o) => o.textContent ?? '');
    return [document.body.innerText, ...options].join('\n');
  });
  const found: string[] = [];
  const all = new RegExp(CODE_PATTERN.source, 'g');
  for (const m of text.matchAll(all)) found.push(`"${m[0]}" in "…${text.slice(Math.max(0, m.index! - 40), m.index! + m[0].length + 40).replace(/\s+/g, ' ')}…"`);
  return found;
}

