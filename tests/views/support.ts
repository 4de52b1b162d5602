import { randomUUID } from 'node:crypto';
import { db } from '~/server/db/client';
import { unitHours } from '~/server/db/schema';
import { createSite, createUnit } from '~/server/services/plant';
import type { UnitKind } from '~/lib/kinds';

/** A name no other test run uses. */
export const uniqueName = (what: string) => `${what} ${randomUUID().slice(0, 8)}`;

/** An invented site with units made through the plant services. */
export async function inventedSite(opts: { timeZone: string; currency?: string; units: { name: string; kind: UnitKind }[] }) {
  const site = await createSite({ name: uniqueName('Views test site'), timeZone: opts.timeZone, T0_K: 298.15, p0_Pa: 101325, currency: opts.currency ?? 'EUR', prices: [] });
  const units = new Map<string, string>();
  for (const u of opts.units) units.set(u.name, (await createUnit(site.id, { name: u.name, kind: u.kind })).id);
  return { site, units };
}

export type HourRow = Partial<typeof unitHours.$inferInsert> & { hourStart: Date; state: 'steady' | 'unsettled' | 'idle' | 'suspect' };

/** Invented unit hours, written directly (the engine is not part of these tests). */
export async function addHours(unitId: string, rows: HourRow[]) {
  if (!rows.length) return;
  await db()
    .insert(unitHours)
    .values(rows.map((r) => ({ unitId, modelVersion: 'views-test', inputsHash: randomUUID(), reasons: [], ...r })));
}

export const at = (iso: string) => new Date(iso);
export const HOUR = 3_600_000;

/** A fake Astro endpoint context for calling a route's GET directly. */
export function ctx(path: string, params: Record<string, string>, role: 'admin' | 'energy-lead' | 'operator' | 'planner' = 'energy-lead') {
  const url = new URL(path, 'http://lossline.test');
  return {
    params,
    url,
    request: new Request(url),
    locals: { user: { id: 'test', name: 'Test', email: 't@example.test', role }, session: null, apiToken: null },
  } as never;
}
