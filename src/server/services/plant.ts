/**
 * The plant model's sites, units and ports. The view of a site as a model (the same shape as the
 * model file) with each unit's completeness lives in ./plant-site-model.ts (re-exported here); tag
 * links and their versions in ./plant-links.ts; import and export in ./plant-model.ts.
 */
import { and, asc, eq, ilike, isNull, gt, lte, or, sql, notExists } from 'drizzle-orm';
import { z } from 'zod';
import { checkParameter, checkPort, checkNormallyIdle, checkUnit, type PortModel } from '~/lib/plant/model';
import { pressureAtElevation } from '~/lib/plant/atmosphere';
import { defaultParameters, kindSpec, type ParamValue } from '~/lib/plant/kinds';
import { tidyNormallyIdle, type NormallyIdle } from '~/lib/plant/idle';
import { canConvert } from '~/lib/units/convert';
import { PortInput, PortUpdateInput, SiteInput, UnitCreateInput, UnitUpdateInput } from '~/lib/plant/inputs';
import { db } from '../db/client';
import { plantPorts, plantUnits, sites, tagLinks, tags } from '../db/schema';
import { isId } from '../access';
import { AppError } from '../errors';
import { inTransaction, openEndMs, type Tx } from './plant-tx';
import type { Reader } from '../db/tx';
import { getSite } from './plant-site-model';
import { queueUnitRuleCheck } from './unit-rules';
import { HOUR_MS } from '~/lib/time';


// ---- sites -------------------------------------------------------------------------------------

export { SiteInput };

/** Atmospheric pressure to store: as given, else from the elevation, else sea level. */
export function resolveAtmosphere(input: { elevation_m?: number | null; p_atm_Pa?: number | null }): number {
  if (input.p_atm_Pa != null) return input.p_atm_Pa;
  if (input.elevation_m != null) return Math.round(pressureAtElevation(input.elevation_m) * 10) / 10;
  return 101325;
}

export async function listSites() {
  return db().select().from(sites).orderBy(asc(sites.name));
}

export { getSite };

/** The tag of a site by name, created (unlinked) when the site has none of that name yet. */
export async function ensureTag(tx: Tx, siteId: string, name: string): Promise<string> {
  await tx.insert(tags).values({ siteId, name }).onConflictDoNothing();
  const [row] = await tx.select({ id: tags.id }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, name))).limit(1);
  return row!.id;
}

async function siteValues(tx: Tx, siteId: string | null, input: SiteInput) {
  if (input.T0Tag && !canConvert(input.T0Tag.unit, 'temperature')) {
    throw new AppError('VALIDATION_FAILED', 'The ambient-temperature tag needs a temperature unit.', [
      { path: '$.T0Tag.unit', message: `'${input.T0Tag.unit}' is not a temperature unit.` },
    ]);
  }
  const names = new Set<string>();
  for (const [i, p] of input.prices.entries()) {
    if (names.has(p.name)) throw new AppError('VALIDATION_FAILED', 'Two prices share a name.', [{ path: `$.prices[${i}].name`, message: `Price name '${p.name}' is used twice.` }]);
    names.add(p.name);
  }
  return {
    name: input.name,
    timeZone: input.timeZone,
    elevation_m: input.elevation_m ?? null,
    p_atm_Pa: resolveAtmosphere(input),
    T0_K: input.T0_K,
    p0_Pa: input.p0_Pa,
    t0TagId: input.T0Tag && siteId ? await ensureTag(tx, siteId, input.T0Tag.tag) : null,
    t0TagUnit: input.T0Tag?.unit ?? null,
    currency: input.currency,
    prices: input.prices,
    ...(input.displayUnits !== undefined ? { displayUnits: input.displayUnits } : {}),
    updatedAt: new Date(),
  };
}

async function nameTaken(tx: Tx, name: string, exceptId: string | null): Promise<boolean> {
  const rows = await tx.select({ id: sites.id }).from(sites).where(eq(sites.name, name));
  return rows.some((r) => r.id !== exceptId);
}

export async function createSite(input: SiteInput) {
  return inTransaction(async (tx) => {
    if (await nameTaken(tx, input.name, null)) throw new AppError('CONFLICT', `A site named '${input.name}' exists already.`);
    const values = await siteValues(tx, null, { ...input, T0Tag: null });
    const [row] = await tx.insert(sites).values(values).returning();
    if (input.T0Tag) {
      await tx.update(sites).set({ t0TagId: await ensureTag(tx, row!.id, input.T0Tag.tag), t0TagUnit: input.T0Tag.unit }).where(eq(sites.id, row!.id));
    }
    return row!;
  });
}

/** Changes a site's settings; a changed atmosphere or dead state recomputes every hour that has data. */
export async function updateSite(siteId: string, input: SiteInput) {
  return inTransaction(async (tx, recompute) => {
    const before = await getSite(siteId, tx);
    if (await nameTaken(tx, input.name, siteId)) throw new AppError('CONFLICT', `A site named '${input.name}' exists already.`);
    const values = await siteValues(tx, siteId, input);
    await tx.update(sites).set(values).where(eq(sites.id, siteId));
    const physics = (s: { p_atm_Pa: number; T0_K: number; p0_Pa: number; t0TagId: string | null; t0TagUnit: string | null }) =>
      JSON.stringify([s.p_atm_Pa, s.T0_K, s.p0_Pa, s.t0TagId, s.t0TagUnit]);
    if (physics(before) !== physics(values)) {
      const span = await dataSpan(tx, siteId);
      if (span) await recompute({ siteId, fromMs: span.fromMs, toMs: span.toMs });
    }
    return getSite(siteId, tx);
  });
}

export async function deleteSite(siteId: string) {
  if (!isId(siteId)) throw new AppError('NOT_FOUND', 'No such site.');
  const out = await db().delete(sites).where(eq(sites.id, siteId)).returning({ id: sites.id });
  if (!out.length) throw new AppError('NOT_FOUND', 'No such site.');
}

/** First and last hour with tag data at the site [ms, ms + 1 h), or null when it has none. */
export async function dataSpan(r: Reader, siteId: string): Promise<{ fromMs: number; toMs: number } | null> {
  const res = await r.execute<{ lo: Date | string | null; hi: Date | string | null }>(
    sql`select min(h.hour_start) as lo, max(h.hour_start) as hi from tag_hours h join tags t on t.seq = h.tag_id where t.site_id = ${siteId}`,
  );
  const row = res.rows[0];
  if (!row?.lo || !row.hi) return null;
  return { fromMs: new Date(row.lo).getTime(), toMs: new Date(row.hi).getTime() + HOUR_MS };
}

// ---- units and ports ---------------------------------------------------------------------------

export { UnitCreateInput, UnitUpdateInput, PortInput, PortUpdateInput };

async function getUnit(tx: Reader, siteId: string, unitId: string) {
  if (!isId(siteId) || !isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit at this site.');
  const [unit] = await tx.select().from(plantUnits).where(and(eq(plantUnits.id, unitId), eq(plantUnits.siteId, siteId))).limit(1);
  if (!unit) throw new AppError('NOT_FOUND', 'No such unit at this site.');
  return unit;
}

async function siteContext(tx: Reader, siteId: string) {
  const site = await getSite(siteId, tx);
  const boilers = await tx.select({ name: plantUnits.name }).from(plantUnits).where(and(eq(plantUnits.siteId, siteId), eq(plantUnits.kind, 'boiler')));
  return { boilers: new Set(boilers.map((b) => b.name)), priceNames: new Set(site.prices.map((p) => p.name)) };
}

function rejectIssues(issues: { path: string; message: string }[], what: string) {
  if (issues.length) throw new AppError('VALIDATION_FAILED', `${what}: ${issues[0]!.message}`, issues);
}

async function unitNameTaken(tx: Tx, siteId: string, name: string, exceptId: string | null) {
  const rows = await tx.select({ id: plantUnits.id }).from(plantUnits).where(and(eq(plantUnits.siteId, siteId), eq(plantUnits.name, name)));
  return rows.some((r) => r.id !== exceptId);
}

export async function createUnit(siteId: string, input: z.infer<typeof UnitCreateInput>) {
  return inTransaction(async (tx) => {
    const ctx = await siteContext(tx, siteId);
    if (await unitNameTaken(tx, siteId, input.name, null)) throw new AppError('CONFLICT', `The site has a unit named '${input.name}' already.`);
    const parameters = { ...defaultParameters(input.kind), ...(input.parameters ?? {}) };
    if (input.kind === 'boiler') ctx.boilers.add(input.name);
    rejectIssues(checkUnit({ name: input.name, kind: input.kind, parameters, fuel: input.fuel, ports: [], links: [] }, [], ctx), 'The unit is not valid');
    const [unit] = await tx
      .insert(plantUnits)
      .values({ siteId, name: input.name, kind: input.kind, description: input.description ?? null, parameters, fuel: input.fuel ?? null })
      .returning();
    if (input.withPorts) {
      let position = 0;
      for (const slot of kindSpec(input.kind).ports) {
        for (let i = 0; i < slot.min; i++) {
          const fluid = slot.fluids.length === 1 ? { kind: slot.fluids[0]! } : null;
          await tx.insert(plantPorts).values({
            unitId: unit!.id,
            name: slot.min > 1 ? `${slot.slot} ${i + 1}` : slot.slot,
            slot: slot.slot,
            role: slot.role,
            stream: slot.stream,
            fluid: fluid as PortModel['fluid'] ?? null,
            position: position++,
          });
        }
      }
    }
    return unit!;
  });
}

/** Edits a unit; changed parameters or fuel recompute the unit's hours that have data. */
export async function updateUnit(siteId: string, unitId: string, input: z.infer<typeof UnitUpdateInput>) {
  return inTransaction(async (tx, recompute) => {
    const unit = await getUnit(tx, siteId, unitId);
    const ctx = await siteContext(tx, siteId);
    if (input.name && input.name !== unit.name && (await unitNameTaken(tx, siteId, input.name, unitId))) {
      throw new AppError('CONFLICT', `The site has a unit named '${input.name}' already.`);
    }
    const parameters: Record<string, ParamValue> = { ...unit.parameters };
    const defaults = defaultParameters(unit.kind);
    const issues = [];
    for (const [key, value] of Object.entries(input.parameters ?? {})) {
      if (value === null) {
        if (defaults[key] !== undefined) parameters[key] = defaults[key]!;
        else delete parameters[key];
      } else {
        issues.push(...checkParameter(unit.kind, key, value, ['parameters', key]));
        parameters[key] = value;
      }
    }
    const fuel = input.fuel === undefined ? unit.fuel : input.fuel;
    const normallyIdle: NormallyIdle | null = input.normallyIdle === undefined ? unit.normallyIdle : input.normallyIdle && tidyNormallyIdle(input.normallyIdle);
    if (input.normallyIdle) {
      const names = await tx.select({ name: plantUnits.name }).from(plantUnits).where(eq(plantUnits.siteId, siteId));
      issues.push(...checkNormallyIdle({ name: input.name ?? unit.name, normallyIdle: input.normallyIdle }, new Set(names.map((n) => n.name)), ['normallyIdle']));
    }
    if (input.fuel) issues.push(...checkUnit({ name: unit.name, kind: unit.kind, parameters: {}, fuel: input.fuel, ports: [], links: [] }, [], ctx));
    rejectIssues(issues, 'The change is not valid');
    const name = input.name ?? unit.name;
    await tx
      .update(plantUnits)
      .set({ name, description: input.description === undefined ? unit.description : input.description, parameters, fuel, normallyIdle, updatedAt: new Date() })
      .where(eq(plantUnits.id, unitId));
    if (name !== unit.name && unit.kind === 'boiler') await renameFuelSource(tx, siteId, unit.name, name);
    if (name !== unit.name) await renameIdleCondition(tx, siteId, unit.name, name);
    if (input.normallyIdle !== undefined && JSON.stringify(normallyIdle) !== JSON.stringify(unit.normallyIdle)) await queueUnitRuleCheck(siteId, [unitId]);
    if (JSON.stringify(parameters) !== JSON.stringify(unit.parameters) || JSON.stringify(fuel) !== JSON.stringify(unit.fuel)) {
      const span = await dataSpan(tx, siteId);
      if (span) await recompute({ siteId, fromMs: span.fromMs, toMs: span.toMs, unitIds: [unitId] });
    }
    return getUnit(tx, siteId, unitId);
  });
}

/** Flue-gas ports name their boiler; keep them pointing at it when it is renamed. */
async function renameFuelSource(tx: Tx, siteId: string, from: string, to: string) {
  const rows = await tx
    .select({ id: plantPorts.id, fluid: plantPorts.fluid })
    .from(plantPorts)
    .innerJoin(plantUnits, eq(plantUnits.id, plantPorts.unitId))
    .where(and(eq(plantUnits.siteId, siteId), sql`${plantPorts.fluid}->>'fuelFrom' = ${from}`));
  for (const r of rows) await tx.update(plantPorts).set({ fluid: { kind: 'flue-gas', fuelFrom: to } }).where(eq(plantPorts.id, r.id));
}

/** Normally-idle declarations name the units they wait for; keep them pointing at a renamed unit. */
async function renameIdleCondition(tx: Tx, siteId: string, from: string, to: string) {
  const rows = await tx
    .select({ id: plantUnits.id, normallyIdle: plantUnits.normallyIdle })
    .from(plantUnits)
    .where(and(eq(plantUnits.siteId, siteId), sql`${plantUnits.normallyIdle}->'whileRunning' ? ${from}`));
  for (const r of rows) {
    const d = r.normallyIdle!;
    await tx
      .update(plantUnits)
      .set({ normallyIdle: { ...d, whileRunning: d.whileRunning!.map((n) => (n === from ? to : n)) } })
      .where(eq(plantUnits.id, r.id));
  }
}

export async function deleteUnit(siteId: string, unitId: string) {
  await getUnit(db(), siteId, unitId);
  await db().delete(plantUnits).where(eq(plantUnits.id, unitId));
}

async function portChanged(tx: Tx, siteId: string, unitId: string, recompute: (r: { siteId: string; fromMs: number; toMs: number; unitIds: string[] }) => Promise<void>) {
  await tx.update(plantUnits).set({ updatedAt: new Date() }).where(eq(plantUnits.id, unitId));
  const span = await dataSpan(tx, siteId);
  if (span) await recompute({ siteId, fromMs: span.fromMs, toMs: span.toMs, unitIds: [unitId] });
}

export async function createPort(siteId: string, unitId: string, input: z.infer<typeof PortInput>) {
  return inTransaction(async (tx, recompute) => {
    const unit = await getUnit(tx, siteId, unitId);
    const ctx = await siteContext(tx, siteId);
    const port: PortModel = {
      name: input.name,
      slot: input.slot,
      ...(input.fluid ? { fluid: input.fluid } : {}),
      ...(input.boundaryT_K != null ? { boundaryT_K: input.boundaryT_K } : {}),
      ...(input.account ? { account: input.account } : {}),
    };
    rejectIssues(checkPort(unit.kind, port, [], ctx), 'The port is not valid');
    const slot = kindSpec(unit.kind).ports.find((s) => s.slot === input.slot)!;
    const existing = await tx.select().from(plantPorts).where(eq(plantPorts.unitId, unitId));
    if (existing.some((p) => p.name === input.name)) throw new AppError('CONFLICT', `Unit '${unit.name}' has a port named '${input.name}' already.`);
    if (slot.max !== null && existing.filter((p) => p.slot === slot.slot).length >= slot.max) {
      throw new AppError('CONFLICT', `A ${unit.kind} has at most ${slot.max} '${slot.slot}' port${slot.max === 1 ? '' : 's'}.`);
    }
    const [row] = await tx
      .insert(plantPorts)
      .values({
        unitId,
        name: input.name,
        slot: slot.slot,
        role: slot.role,
        stream: slot.stream,
        fluid: input.fluid ?? null,
        boundaryT_K: input.boundaryT_K ?? null,
        account: input.account ?? null,
        position: existing.reduce((m, p) => Math.max(m, p.position + 1), 0),
      })
      .returning();
    await portChanged(tx, siteId, unitId, recompute);
    return row!;
  });
}

export async function updatePort(siteId: string, unitId: string, portId: string, input: z.infer<typeof PortUpdateInput>) {
  return inTransaction(async (tx, recompute) => {
    const unit = await getUnit(tx, siteId, unitId);
    if (!isId(portId)) throw new AppError('NOT_FOUND', 'No such port on this unit.');
    const [row] = await tx.select().from(plantPorts).where(and(eq(plantPorts.id, portId), eq(plantPorts.unitId, unitId))).limit(1);
    if (!row) throw new AppError('NOT_FOUND', 'No such port on this unit.');
    const next = {
      name: input.name ?? row.name,
      fluid: input.fluid === undefined ? row.fluid : input.fluid,
      boundaryT_K: input.boundaryT_K === undefined ? row.boundaryT_K : input.boundaryT_K,
      account: input.account === undefined ? row.account : input.account,
    };
    const port: PortModel = {
      name: next.name,
      slot: row.slot,
      ...(next.fluid ? { fluid: next.fluid } : {}),
      ...(next.boundaryT_K != null ? { boundaryT_K: next.boundaryT_K } : {}),
      ...(next.account ? { account: next.account as PortModel['account'] } : {}),
    };
    rejectIssues(checkPort(unit.kind, port, [], await siteContext(tx, siteId)), 'The port is not valid');
    if (next.name !== row.name) {
      const clash = await tx.select({ id: plantPorts.id }).from(plantPorts).where(and(eq(plantPorts.unitId, unitId), eq(plantPorts.name, next.name)));
      if (clash.length) throw new AppError('CONFLICT', `Unit '${unit.name}' has a port named '${next.name}' already.`);
    }
    await tx.update(plantPorts).set(next).where(eq(plantPorts.id, portId));
    await portChanged(tx, siteId, unitId, recompute);
  });
}

export async function deletePort(siteId: string, unitId: string, portId: string) {
  return inTransaction(async (tx, recompute) => {
    await getUnit(tx, siteId, unitId);
    if (!isId(portId)) throw new AppError('NOT_FOUND', 'No such port on this unit.');
    const out = await tx.delete(plantPorts).where(and(eq(plantPorts.id, portId), eq(plantPorts.unitId, unitId))).returning({ id: plantPorts.id });
    if (!out.length) throw new AppError('NOT_FOUND', 'No such port on this unit.');
    await portChanged(tx, siteId, unitId, recompute);
  });
}

// ---- the site as a model: ./plant-site-model.ts -----------------------------------------------

export { siteModel, siteStatus, siteOverview, unitDetail, type ModelIds } from './plant-site-model';

/**
 * Tags of a site that have no current link (created by ingest when a file brings a new tag), with
 * an optional search on name and description. The site's dead-state temperature tag is in use (the
 * site reads T0 from it), so it is not listed.
 */
export async function unlinkedTags(siteId: string, search?: string, limit = 200) {
  const now = new Date();
  const current = db()
    .select({ one: sql`1` })
    .from(tagLinks)
    .where(and(eq(tagLinks.tagId, tags.id), lte(tagLinks.validFrom, now), or(isNull(tagLinks.validTo), gt(tagLinks.validTo, now))));
  const deadStateTag = db()
    .select({ one: sql`1` })
    .from(sites)
    .where(and(eq(sites.id, tags.siteId), eq(sites.t0TagId, tags.id)));
  const q = search?.trim();
  return db()
    .select({ id: tags.id, name: tags.name, unitHint: tags.unitHint, description: tags.description, firstSeenAt: tags.firstSeenAt })
    .from(tags)
    .where(
      and(
        eq(tags.siteId, siteId),
        notExists(current),
        notExists(deadStateTag),
        q ? or(ilike(tags.name, `%${q.replace(/[%_\\]/g, '\\$&')}%`), ilike(tags.description, `%${q.replace(/[%_\\]/g, '\\$&')}%`)) : undefined,
      ),
    )
    .orderBy(asc(tags.name))
    .limit(limit);
}

/** Every tag of a site (for choosing one), with whether it has a current link. */
export async function siteTags(siteId: string, search?: string, limit = 200) {
  const q = search?.trim();
  return db()
    .select({ id: tags.id, name: tags.name, unitHint: tags.unitHint, description: tags.description })
    .from(tags)
    .where(and(eq(tags.siteId, siteId), q ? ilike(tags.name, `%${q.replace(/[%_\\]/g, '\\$&')}%`) : undefined))
    .orderBy(asc(tags.name))
    .limit(limit);
}

export { openEndMs };
