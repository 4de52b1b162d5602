/**
 * The plant model file in and out (format in src/lib/plant/model.ts, documented in
 * docs/plant-model.md). An import replaces the site's model with the file's in one transaction: any
 * problem is reported with its JSON path and nothing changes. Units, ports and link versions that the
 * file leaves as they are keep their rows; each unit that changed gets a recompute of the hours the
 * change touches.
 */
import { eq, inArray } from 'drizzle-orm';
import {
  checkModel,
  linkInterval,
  type LinkModel,
  type ModelIssue,
  type PlantModel,
  type UnitModel,
} from '~/lib/plant/model';
import { defaultParameters, kindSpec } from '~/lib/plant/kinds';
import { defaultUncertainty } from '~/lib/plant/uncertainty';
import { db } from '../db/client';
import { plantPorts, plantUnits, sites, tagLinks, tags } from '../db/schema';
import { dataSpan, ensureTag, getSite, resolveAtmosphere, siteModel } from './plant';
import { AppError } from '../errors';
import { inTransaction, openEndMs, type RecomputeRequest, type Tx } from './plant-tx';
import { queueUnitRuleCheck } from './unit-rules';
import { writeTagLimits } from './plant-tag-limits';
import { HOUR_MS } from '~/lib/time';

/** The site's model file. */
export async function exportModel(siteId: string): Promise<PlantModel> {
  return (await siteModel(db(), siteId, 'all')).model;
}

function invalid(issues: ModelIssue[]): never {
  throw new AppError('VALIDATION_FAILED', `The model file has ${issues.length} problem${issues.length === 1 ? '' : 's'}; nothing was changed.`, issues);
}

/** Fills defaults the file may leave out, so a stored unit always carries its full parameters and uncertainties. */
function normaliseUnit(u: UnitModel): UnitModel {
  return {
    ...u,
    parameters: { ...defaultParameters(u.kind), ...u.parameters },
    links: u.links.map((l) => ({ ...l, uncertainty: l.uncertainty ?? defaultUncertainty(l.quantity, l.unit) })),
  };
}

/** JSON with object keys sorted at every level, for comparing models whatever order jsonb kept. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_k, v) =>
    v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : v,
  );
}

const linkSignature = (l: LinkModel) => canonicalJson([l.port ?? null, l.quantity, l.tag, l.unit, l.basis ?? null, l.uncertainty ?? null, l.validMin ?? null, l.validMax ?? null, l.validFrom ?? null]);

/**
 * The earliest instant from which two versions of a unit's links differ, or null when equal.
 * A version only in one of them differs from its validFrom; the same version with another end
 * differs from the earlier end.
 */
export function firstLinkDifferenceMs(before: readonly LinkModel[], after: readonly LinkModel[]): number | null {
  let first = Infinity;
  const afterBySig = new Map<string, LinkModel[]>();
  for (const l of after) afterBySig.set(linkSignature(l), [...(afterBySig.get(linkSignature(l)) ?? []), l]);
  const matched = new Set<LinkModel>();
  for (const b of before) {
    const candidates = afterBySig.get(linkSignature(b)) ?? [];
    const a = candidates.find((c) => !matched.has(c));
    if (!a) {
      first = Math.min(first, linkInterval(b)[0]);
      continue;
    }
    matched.add(a);
    const [, bTo] = linkInterval(b);
    const [, aTo] = linkInterval(a);
    if (bTo !== aTo) first = Math.min(first, bTo, aTo);
  }
  for (const a of after) if (!matched.has(a)) first = Math.min(first, linkInterval(a)[0]);
  return first === Infinity ? null : first;
}

/**
 * What to recompute after the model of a site changed from `before` to `after`; `limitTags` names the
 * tags whose own spread limit or coverage changed (every hour of a unit that links one is judged again).
 */
async function recomputeFor(tx: Tx, siteId: string, before: PlantModel | null, after: PlantModel, ids: Map<string, string>, limitTags: ReadonlySet<string>): Promise<RecomputeRequest[]> {
  const span = await dataSpan(tx, siteId);
  if (!span) return []; // no tag hours yet: nothing to recompute
  const end = Math.max(openEndMs(), span.toMs);
  const physics = (m: PlantModel) => canonicalJson([m.site.p_atm_Pa, m.site.deadState]);
  if (before && physics(before) !== physics(after)) return [{ siteId, fromMs: span.fromMs, toMs: span.toMs }];
  const out: RecomputeRequest[] = [];
  for (const unit of after.units) {
    const id = ids.get(unit.name)!;
    const old = before?.units.find((u) => u.name === unit.name);
    const shape = (u: UnitModel) => canonicalJson([u.kind, u.parameters, u.fuel ?? null, u.ports]);
    if ((old && shape(old) !== shape(unit)) || unit.links.some((l) => limitTags.has(l.tag))) {
      out.push({ siteId, fromMs: span.fromMs, toMs: span.toMs, unitIds: [id] });
      continue;
    }
    const from = firstLinkDifferenceMs(old?.links ?? [], unit.links);
    if (from !== null) out.push({ siteId, fromMs: from, toMs: Math.max(end, from + HOUR_MS), unitIds: [id] });
  }
  return out;
}

/** What a model write did, by id: for the answer of the model PUT (ModelPutAnswer, src/lib/api/model.ts). */
export interface ModelChanges {
  created: { units: string[]; ports: string[]; links: string[]; tags: string[] };
  changed: { units: string[]; ports: string[]; tags: string[] };
  removed: { units: string[]; ports: string[]; links: string[] };
  renamed: { what: 'site'; id: string; from: string; to: string; message: string }[];
  /** Every unit of the model by name, with its id and its ports' ids by name. */
  unitIds: Record<string, { id: string; ports: Record<string, string> }>;
}

const noChanges = (): ModelChanges => ({
  created: { units: [], ports: [], links: [], tags: [] },
  changed: { units: [], ports: [], tags: [] },
  removed: { units: [], ports: [], links: [] },
  renamed: [],
  unitIds: {},
});

/** The tag of a site by name, created when missing; a tag created here is listed in `changes`. */
async function tagOf(tx: Tx, siteId: string, name: string, changes: ModelChanges): Promise<string> {
  const made = await tx.insert(tags).values({ siteId, name }).onConflictDoNothing().returning({ id: tags.id });
  if (made[0]) {
    changes.created.tags.push(made[0].id);
    return made[0].id;
  }
  return ensureTag(tx, siteId, name);
}

async function writeSite(tx: Tx, siteId: string, s: PlantModel['site'], changes: ModelChanges) {
  const [prior] = await tx.select({ name: sites.name }).from(sites).where(eq(sites.id, siteId)).limit(1);
  if (prior && prior.name !== s.name) {
    changes.renamed.push({ what: 'site', id: siteId, from: prior.name, to: s.name, message: `The site '${prior.name}' is now named '${s.name}' (the file's site.name).` });
  }
  await tx
    .update(sites)
    .set({
      name: s.name,
      timeZone: s.timeZone,
      elevation_m: s.elevation_m ?? null,
      p_atm_Pa: resolveAtmosphere(s),
      T0_K: s.deadState.T0_K,
      p0_Pa: s.deadState.p0_Pa,
      t0TagId: s.deadState.T0Tag ? await tagOf(tx, siteId, s.deadState.T0Tag.tag, changes) : null,
      t0TagUnit: s.deadState.T0Tag?.unit ?? null,
      currency: s.currency,
      prices: s.prices,
      updatedAt: new Date(),
    })
    .where(eq(sites.id, siteId));
}

type UnitRow = typeof plantUnits.$inferSelect;

/** The unit's row: updated when the file's unit of that name and kind exists, else created. */
async function writeUnit(tx: Tx, siteId: string, unit: UnitModel, prior: UnitRow | undefined, changes: ModelChanges): Promise<string> {
  const values = { description: unit.description ?? null, parameters: unit.parameters, fuel: unit.fuel ?? null, normallyIdle: unit.normallyIdle ?? null };
  if (prior) {
    const was = { description: prior.description, parameters: prior.parameters, fuel: prior.fuel, normallyIdle: prior.normallyIdle };
    if (canonicalJson(was) !== canonicalJson(values)) {
      changes.changed.units.push(prior.id);
      await tx.update(plantUnits).set({ ...values, updatedAt: new Date() }).where(eq(plantUnits.id, prior.id));
    }
    return prior.id;
  }
  const [row] = await tx.insert(plantUnits).values({ siteId, name: unit.name, kind: unit.kind, ...values }).returning({ id: plantUnits.id });
  changes.created.units.push(row!.id);
  return row!.id;
}

/** Ports: update by name, add new, drop the rest (their links go with them). Answers their ids by name. */
async function writePorts(tx: Tx, unitId: string, unit: UnitModel, changes: ModelChanges): Promise<Map<string, string>> {
  const ports = await tx.select().from(plantPorts).where(eq(plantPorts.unitId, unitId));
  const portIds = new Map<string, string>();
  const wanted = new Set(unit.ports.map((p) => p.name));
  const dropPorts = ports.filter((p) => !wanted.has(p.name) || unit.ports.find((q) => q.name === p.name)!.slot !== p.slot);
  if (dropPorts.length) {
    await tx.delete(plantPorts).where(inArray(plantPorts.id, dropPorts.map((p) => p.id)));
    changes.removed.ports.push(...dropPorts.map((p) => p.id));
  }
  for (const [position, port] of unit.ports.entries()) {
    const slot = kindSpec(unit.kind).ports.find((s) => s.slot === port.slot)!;
    const values = { fluid: port.fluid ?? null, boundaryT_K: port.boundaryT_K ?? null, account: port.account ?? null, position };
    const prior = ports.find((p) => p.name === port.name && p.slot === port.slot);
    if (prior) {
      if (canonicalJson({ fluid: prior.fluid, boundaryT_K: prior.boundaryT_K, account: prior.account, position: prior.position }) !== canonicalJson(values)) {
        await tx.update(plantPorts).set(values).where(eq(plantPorts.id, prior.id));
        if (!dropPorts.includes(prior)) changes.changed.ports.push(prior.id);
      }
      portIds.set(port.name, prior.id);
    } else {
      const [row] = await tx
        .insert(plantPorts)
        .values({ unitId, name: port.name, slot: port.slot, role: slot.role, stream: slot.stream, ...values })
        .returning({ id: plantPorts.id });
      portIds.set(port.name, row!.id);
      changes.created.ports.push(row!.id);
    }
  }
  return portIds;
}

/** Links: keep rows equal to a version in the file, insert the others, delete what the file does not have. */
async function writeLinks(tx: Tx, siteId: string, unitId: string, unit: UnitModel, portIds: Map<string, string>, changes: ModelChanges) {
  const rows = await tx
    .select({ row: tagLinks, tagName: tags.name, portName: plantPorts.name })
    .from(tagLinks)
    .innerJoin(tags, eq(tags.id, tagLinks.tagId))
    .leftJoin(plantPorts, eq(plantPorts.id, tagLinks.portId))
    .where(eq(tagLinks.unitId, unitId));
  const unmatched = new Map(rows.map((r) => [r.row.id, r]));
  for (const link of unit.links) {
    const [fromMs, toMs] = linkInterval(link);
    const hit = [...unmatched.values()].find(({ row, tagName, portName }) => sameLink(row, tagName, portName, link, fromMs, toMs));
    if (hit) {
      unmatched.delete(hit.row.id);
      continue;
    }
    const [made] = await tx
      .insert(tagLinks)
      .values({
        siteId,
        unitId,
        portId: link.port !== undefined ? portIds.get(link.port)! : null,
        tagId: await tagOf(tx, siteId, link.tag, changes),
        quantity: link.quantity,
        engUnit: link.unit,
        basis: link.basis ?? null,
        uncertaintyMode: link.uncertainty!.mode,
        uncertainty: link.uncertainty!.value,
        validMin: link.validMin ?? null,
        validMax: link.validMax ?? null,
        validFrom: new Date(fromMs),
        validTo: toMs === Infinity ? null : new Date(toMs),
      })
      .returning({ id: tagLinks.id });
    changes.created.links.push(made!.id);
  }
  // Superseded empty versions are history, not in the file: keep them.
  const stale = [...unmatched.values()].filter(({ row }) => !(row.validTo && row.validTo.getTime() === row.validFrom.getTime())).map(({ row }) => row.id);
  if (stale.length) {
    await tx.delete(tagLinks).where(inArray(tagLinks.id, stale));
    changes.removed.links.push(...stale);
  }
}

function sameLink(row: typeof tagLinks.$inferSelect, tagName: string, portName: string | null, link: LinkModel, fromMs: number, toMs: number): boolean {
  return (
    tagName === link.tag &&
    (portName ?? undefined) === link.port &&
    row.quantity === link.quantity &&
    row.engUnit === link.unit &&
    (row.basis ?? undefined) === link.basis &&
    row.uncertaintyMode === link.uncertainty!.mode &&
    row.uncertainty === link.uncertainty!.value &&
    (row.validMin ?? undefined) === link.validMin &&
    (row.validMax ?? undefined) === link.validMax &&
    row.validFrom.getTime() === fromMs &&
    (row.validTo ? row.validTo.getTime() : Infinity) === toMs
  );
}

/** Writes a checked model into a site inside the transaction (site row already exists); says what it changed. */
async function writeModel(tx: Tx, siteId: string, model: PlantModel, recompute: (r: RecomputeRequest) => Promise<void>, before: PlantModel | null): Promise<ModelChanges> {
  const changes = noChanges();
  await writeSite(tx, siteId, model.site, changes);
  const existing = await tx.select().from(plantUnits).where(eq(plantUnits.siteId, siteId));
  const keep = new Set(model.units.map((u) => u.name));
  const gone = existing.filter((u) => !keep.has(u.name) || model.units.find((m) => m.name === u.name)!.kind !== u.kind);
  if (gone.length) {
    await tx.delete(plantUnits).where(inArray(plantUnits.id, gone.map((u) => u.id)));
    changes.removed.units.push(...gone.map((u) => u.id));
  }
  const unitIds = new Map<string, string>();
  for (const unit of model.units) {
    const id = await writeUnit(tx, siteId, unit, existing.find((u) => u.name === unit.name && u.kind === unit.kind), changes);
    unitIds.set(unit.name, id);
    const portIds = await writePorts(tx, id, unit, changes);
    await writeLinks(tx, siteId, id, unit, portIds, changes);
    changes.unitIds[unit.name] = { id, ports: Object.fromEntries(portIds) };
  }
  const limits = await writeTagLimits(tx, siteId, model, new Set(changes.created.tags));
  changes.changed.tags.push(...limits.changed);
  for (const r of await recomputeFor(tx, siteId, before, model, unitIds, limits.steadyTestTags)) await recompute(r);
  return changes;
}

function parseOrThrow(input: unknown): PlantModel {
  const checked = checkModel(input);
  if (!checked.ok) invalid(checked.issues);
  return { ...checked.model, units: checked.model.units.map(normaliseUnit) };
}

async function siteNameIssue(tx: Tx, name: string, exceptId: string | null): Promise<ModelIssue[]> {
  const rows = await tx.select({ id: sites.id }).from(sites).where(eq(sites.name, name));
  return rows.some((r) => r.id !== exceptId) ? [{ path: '$.site.name', message: `Another site is named '${name}'.` }] : [];
}

/**
 * Replaces a site's model with the file's. All or nothing: on any problem, AppError
 * VALIDATION_FAILED with every issue's JSON path, and the database is as before. Answers what it
 * did: the ids of what it created, changed and removed, every unit's id by name, and `renamed` when
 * the file's site.name renamed the site.
 */
export async function importModel(siteId: string, input: unknown) {
  const model = parseOrThrow(input);
  const out = await inTransaction(async (tx, recompute) => {
    await getSite(siteId, tx);
    const nameIssues = await siteNameIssue(tx, model.site.name, siteId);
    if (nameIssues.length) invalid(nameIssues);
    const before = (await siteModel(tx, siteId, 'all')).model;
    const queued: RecomputeRequest[] = [];
    const changes = await writeModel(tx, siteId, model, async (r) => {
      queued.push(r);
      await recompute(r);
    }, before);
    const idleChanged = model.units.some((u) => canonicalJson(u.normallyIdle ?? null) !== canonicalJson(before.units.find((b) => b.name === u.name)?.normallyIdle ?? null));
    return { siteId, units: model.units.length, recompute: queued, ...changes, idleChanged };
  });
  // a changed idle declaration is judged on the hours already computed (unit hours are not recomputed for it)
  const { idleChanged, ...result } = out;
  if (idleChanged) await queueUnitRuleCheck(siteId);
  return result;
}

/** Creates a new site from a model file (all or nothing). */
export async function createSiteFromModel(input: unknown) {
  const model = parseOrThrow(input);
  return inTransaction(async (tx, recompute) => {
    const nameIssues = await siteNameIssue(tx, model.site.name, null);
    if (nameIssues.length) invalid(nameIssues);
    const [row] = await tx.insert(sites).values({ name: model.site.name, timeZone: model.site.timeZone }).returning({ id: sites.id });
    const changes = await writeModel(tx, row!.id, model, recompute, null);
    return { siteId: row!.id, units: model.units.length, ...changes };
  });
}

