/**
 * The demo loader against the real database, object store and job queue, with the worker's handlers
 * running in this process: a short demo goes into a new site through the machine-upload path, is
 * read and computed, gets its baselines; a second run finds everything in place and changes nothing.
 */
import { and, asc, count, eq, inArray } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { baselines, plantUnits, sites, tagHours, tags, uploads } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { registerHandlers } from '~/worker/handlers';
import { plannedFileNames } from '../../scripts/demo/generate';
import { loadDemo, type LoadOptions } from '../../scripts/demo/load';
import { demoModel, tagOf } from '../../scripts/demo/site';
import { describeIntegration } from '../support/integration';

const siteName = `Demo loader test ${Date.now()}`;
const opts: LoadOptions = { siteName, days: 9, start: '2025-01-06', seed: 3, pollMs: 200, waitTimeoutMs: 150_000, log: () => undefined };

describeIntegration('the demo loader', () => {
  beforeAll(async () => {
    await registerHandlers(await queue());
  });

  it('self-consistency: loads a short demo into a new site through the machine-upload path; a second run changes nothing', { timeout: 240_000 }, async () => {
    const first = await loadDemo(opts);
    const names = plannedFileNames(opts);
    expect(names).toEqual(['HM_weekly_2025-01-06.csv', 'HM_weekly_2025-01-13.csv']);
    expect(first.createdSite).toBe(true);
    expect(first.importedModel).toBe(true);
    expect(first.uploaded).toEqual(names);
    expect(first.statuses).toEqual({ done: 2 });
    expect(first.notWaited).toEqual([]);

    const [site] = await db().select().from(sites).where(eq(sites.id, first.siteId));
    expect(site!.timeZone).toBe('Europe/London');
    expect(site!.currency).toBe('GBP');
    const units = await db().select({ id: plantUnits.id, name: plantUnits.name }).from(plantUnits).where(eq(plantUnits.siteId, first.siteId)).orderBy(asc(plantUnits.name));
    expect(units.map((u) => u.name)).toEqual(demoModel().units.map((u) => u.name).sort());
    const ups = await db().select().from(uploads).where(eq(uploads.siteId, first.siteId));
    expect(ups.map((u) => u.source)).toEqual(['api', 'api']);

    // the worker read every minute of the nine days into tag hours (the site's local hours)
    const [steam] = await db().select().from(tags).where(and(eq(tags.siteId, first.siteId), eq(tags.name, tagOf('b1.steam.m').tag)));
    const [{ n }] = (await db().select({ n: count() }).from(tagHours).where(eq(tagHours.tagId, steam!.seq))) as [{ n: number }];
    expect(n).toBe(9 * 24);
    // the engine computed every unit's hours, and the units steady often enough got a baseline
    expect(first.unitHours).toBe(9 * 24 * units.length);
    const fitted = first.baselines.filter((b) => b.outcome.startsWith('baseline v1'));
    expect(fitted.length).toBeGreaterThanOrEqual(4);
    expect(first.baselines.find((b) => b.unit === 'PRV1')!.outcome).toMatch(/^no baseline/);

    const second = await loadDemo(opts);
    expect(second.siteId).toBe(first.siteId);
    expect(second.createdSite).toBe(false);
    expect(second.importedModel).toBe(false);
    expect(second.uploaded).toEqual([]);
    expect(second.alreadyThere).toBe(2);
    const [{ nu }] = (await db().select({ nu: count() }).from(uploads).where(eq(uploads.siteId, first.siteId))) as [{ nu: number }];
    expect(nu).toBe(2);
    const [{ nb }] = (await db()
      .select({ nb: count() })
      .from(baselines)
      .where(inArray(baselines.unitId, units.map((u) => u.id)))) as [{ nb: number }];
    expect(nb).toBe(fitted.length);
  });
});
