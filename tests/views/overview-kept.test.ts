/**
 * The overview page keeps each site's rendered section in the read cache (src/components/KeptHtml.astro,
 * src/server/kept-html.ts). Rendered here through Astro's container with the page's real code on a
 * real database: the kept section is found again while nothing changes, a new unit hour, a changed
 * tag link unit (the site's display units) and a new drift notice each show at once, and a person
 * without the site never gets its kept section.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, expect, it, vi } from 'vitest';
import { experimental_AstroContainer as AstroContainer } from 'astro/container';
import reactRenderer from '@astrojs/react/server.js';
import { eq } from 'drizzle-orm';
import Overview from '../../src/pages/index.astro';
import { db } from '~/server/db/client';
import { driftNotices, tagLinks, tags } from '~/server/db/schema';
import { hoursGeneration, startHoursCache, stopHoursCache } from '~/server/hours-cache';
import { keptHtml } from '~/server/kept-html';
import type { Role } from '~/lib/roles';
import { describeIntegration } from '../support/integration';
import { addHours, at, inventedSite } from './support';

describeIntegration('overview page: kept site sections', () => {
  let container: AstroContainer;
  let siteId = '';
  let siteName = '';
  let unitId = '';

  beforeAll(async () => {
    await startHoursCache();
    container = await AstroContainer.create();
    container.addServerRenderer({ name: '@astrojs/react', renderer: reactRenderer });
    const made = await inventedSite({ timeZone: 'UTC', units: [{ name: 'Boiler K1', kind: 'boiler' }] });
    siteId = made.site.id;
    siteName = made.site.name;
    unitId = made.units.get('Boiler K1')!;
    // self-consistency: invented hours, 2 MW and 4 MW of destruction, means 3 MW
    await addHours(unitId, [
      { hourStart: at('2024-03-10T10:00:00Z'), state: 'steady', destruction_W: 2e6, destructionCost_per_h: 10 },
      { hourStart: at('2024-03-10T11:00:00Z'), state: 'steady', destruction_W: 4e6, destructionCost_per_h: 20 },
    ]);
  });
  afterAll(async () => {
    await stopHoursCache();
  });

  /** The page as `role` sees it, cut to this test's site section. */
  async function section(role: Role): Promise<string> {
    const html = await container.renderToString(Overview, {
      request: new Request('http://lossline.test/'),
      locals: { user: { id: randomUUID(), name: 'Kept Test', email: 'kept@example.test', role }, session: null, apiToken: null, sites: 'all' },
    });
    const start = html.indexOf(`data-testid="overview-site-${siteName}"`);
    expect(start, 'the site section is on the page').toBeGreaterThan(0);
    return html.slice(start, html.indexOf('</section>', start));
  }

  async function notified(change: () => Promise<unknown>) {
    const before = hoursGeneration();
    await change();
    await vi.waitFor(() => expect(hoursGeneration()).toBeGreaterThan(before));
  }

  it('finds a kept HTML again under the same key and generation, and renders afresh under a new one', async () => {
    const render = vi.fn(async () => `<p>${randomUUID()}</p>`);
    const key = `test:${randomUUID()}`;
    const gen = hoursGeneration();
    const first = await keptHtml(key, gen, render);
    expect(await keptHtml(key, gen, render)).toBe(first);
    expect(render).toHaveBeenCalledTimes(1);
    // Figures read under an older generation are never served again.
    expect(await keptHtml(key, gen + 1, render)).not.toBe(first);
    expect(render).toHaveBeenCalledTimes(2);
  });

  it('shows a new unit hour, a changed display unit and a new notice at once', async () => {
    const first = await section('energy-lead');
    expect(first).toContain('The 24 hours to 2024-03-10 12:00');
    expect(first).toContain('Mean destruction [kW]');
    expect(first).toContain('>3,000</td>');
    expect(await section('energy-lead')).toBe(first);

    await notified(() => addHours(unitId, [{ hourStart: at('2024-03-10T12:00:00Z'), state: 'steady', destruction_W: 6e6, destructionCost_per_h: 30 }]));
    const later = await section('energy-lead');
    expect(later).toContain('The 24 hours to 2024-03-10 13:00');
    expect(later).toContain('>4,000</td>');

    // A power tag linked in MW: the site's powers follow in MW (src/lib/units/display.ts).
    await notified(async () => {
      const [tag] = await db().insert(tags).values({ siteId, name: `KEPT_${randomUUID().slice(0, 6)}` }).returning();
      await db().insert(tagLinks).values({ siteId, unitId, tagId: tag!.id, quantity: 'power', engUnit: 'MW', uncertaintyMode: 'relative', uncertainty: 0.01, validFrom: at('2024-01-01T00:00:00Z') });
    });
    expect(await section('energy-lead')).toContain('Mean destruction [MW]');

    await notified(() =>
      db().insert(driftNotices).values({ siteId, unitId, direction: 'up', onsetHour: at('2024-03-10T10:00:00Z'), signalHour: at('2024-03-10T11:00:00Z'), lastSignalHour: at('2024-03-10T11:00:00Z'), hours: 2, extra_W: 5e4, expected_W: 3e6, shift_sigma: 3, currency: 'EUR', k: 0.5, h: 5 }),
    );
    expect(await section('energy-lead')).toContain('1 drift notice outstanding');
    await db().delete(driftNotices).where(eq(driftNotices.unitId, unitId));
  });

  it('never shows a kept section to a person without its site', async () => {
    expect(await section('energy-lead')).toContain('Boiler K1');
    const html = await container.renderToString(Overview, {
      request: new Request('http://lossline.test/'),
      locals: { user: { id: randomUUID(), name: 'Other Site', email: 'other@example.test', role: 'operator' }, session: null, apiToken: null, sites: [randomUUID()] },
    });
    expect(html).toContain('Overview');
    expect(html).not.toContain(`overview-site-${siteName}`);
  });
});
