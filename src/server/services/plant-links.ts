/**
 * Tag links and their versions. A link binds a tag to a quantity at a port (or of the unit); the
 * versions of one link (same unit, port and quantity) follow each other in time, half-open
 * [validFrom, validTo). A change never edits a version in place: it closes the version that holds at
 * the change's instant and inserts a new one, so older hours keep the links valid then. Each change
 * queues a recompute of exactly the hours it affects, for its unit only.
 */
import { and, asc, eq, gt, isNull, lt, lte, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { BEGINNING_MS, checkLink, type LinkModel, type LinkTarget } from '~/lib/plant/model';
import type { FluidKind } from '~/lib/kinds';
import { LINK_QUANTITY_NAMES, type LinkQuantity, type UnitKind } from '~/lib/plant/kinds';
import type { LinkVersion } from '~/lib/plant/link-version';
import { defaultUncertainty } from '~/lib/plant/uncertainty';
import { db } from '../db/client';
import { plantPorts, plantUnits, tagLinks, tags } from '../db/schema';
import { AppError } from '../errors';
import { inTransaction, openEndMs, type Tx } from './plant-tx';
import type { Reader } from '../db/tx';
import { HOUR_MS, MINUTE_MS } from '~/lib/time';

const instant = z.union([z.iso.datetime({ offset: true }), z.number().int()]).transform((v) => new Date(v));

/** A new link, or a change of one (a new version from validFrom). */
export const LinkInput = z.strictObject({
  unitId: z.string().uuid(),
  /** Port of the unit; null or left out for a measurement of the unit itself. */
  portId: z.string().uuid().nullable().optional(),
  quantity: z.enum(LINK_QUANTITY_NAMES as [LinkQuantity, ...LinkQuantity[]]),
  /** The tag, by id or by name (a name the site does not know yet creates the tag). */
  tagId: z.string().uuid().optional(),
  tag: z.string().trim().min(1).max(200).optional(),
  /** Engineering unit of the tag. */
  unit: z.string().trim().min(1, 'Give the engineering unit of the tag.').max(40),
  basis: z.enum(['dry', 'wet']).nullable().optional(),
  /** Left out: the default of the quantity (common practice, src/lib/plant/uncertainty.ts). */
  uncertainty: z.strictObject({ mode: z.enum(['absolute', 'relative']), value: z.number().finite().min(0) }).optional(),
  validMin: z.number().finite().nullable().optional(),
  validMax: z.number().finite().nullable().optional(),
  /** First instant the version holds; left out: from the start when the link is new, else now. */
  validFrom: instant.optional(),
});
export type LinkInput = z.infer<typeof LinkInput>;

/** A link version with the names around it, as the engine reads it (instants as Date). */
export type ResolvedLink = LinkVersion & {
  /** The tag's own spread limit and least coverage (the model file's tags[]); null: the unit's. */
  tagSpreadLimit: number | null;
  tagMinCoverage: number | null;
};

/** Tag link versions as ResolvedLink rows (joined with their unit, tag and port); add the where. */
export function resolvedSelect(r: Reader) {
  return r
    .select({
      id: tagLinks.id,
      unitId: tagLinks.unitId,
      unitName: plantUnits.name,
      unitKind: plantUnits.kind,
      portId: tagLinks.portId,
      portName: plantPorts.name,
      portSlot: plantPorts.slot,
      quantity: tagLinks.quantity,
      tagId: tagLinks.tagId,
      tagName: tags.name,
      engUnit: tagLinks.engUnit,
      basis: tagLinks.basis,
      uncertaintyMode: tagLinks.uncertaintyMode,
      uncertainty: tagLinks.uncertainty,
      validMin: tagLinks.validMin,
      validMax: tagLinks.validMax,
      validFrom: tagLinks.validFrom,
      validTo: tagLinks.validTo,
      tagSpreadLimit: tags.spreadLimit,
      tagMinCoverage: tags.minCoverage,
    })
    .from(tagLinks)
    .innerJoin(plantUnits, eq(plantUnits.id, tagLinks.unitId))
    .innerJoin(tags, eq(tags.id, tagLinks.tagId))
    .leftJoin(plantPorts, eq(plantPorts.id, tagLinks.portId));
}

/** The links of a site that hold at an instant (validFrom <= t < validTo). */
export async function linksValidAt(siteId: string, at: Date, r: Reader = db()): Promise<ResolvedLink[]> {
  return resolvedSelect(r)
    .where(and(eq(tagLinks.siteId, siteId), lte(tagLinks.validFrom, at), or(isNull(tagLinks.validTo), gt(tagLinks.validTo, at))))
    .orderBy(asc(plantUnits.name), asc(tagLinks.validFrom));
}

/**
 * Every link version of a site that holds at some instant of [from, to): the engine takes, per hour,
 * the versions whose interval contains the hour's start.
 */
export async function linksForRange(siteId: string, from: Date, to: Date, r: Reader = db()): Promise<ResolvedLink[]> {
  return resolvedSelect(r)
    .where(
      and(
        eq(tagLinks.siteId, siteId),
        lt(tagLinks.validFrom, to),
        or(isNull(tagLinks.validTo), gt(tagLinks.validTo, from)),
        or(isNull(tagLinks.validTo), gt(tagLinks.validTo, tagLinks.validFrom)),
      ),
    )
    .orderBy(asc(plantUnits.name), asc(tagLinks.validFrom));
}

/** Every version of the links of a unit (superseded ones included), newest first, for its history. */
export async function linkHistory(siteId: string, unitId: string, r: Reader = db()) {
  const rows = await resolvedSelect(r)
    .where(and(eq(tagLinks.siteId, siteId), eq(tagLinks.unitId, unitId)))
    .orderBy(sql`${tagLinks.validFrom} desc`, sql`${tagLinks.createdAt} desc`);
  return rows;
}

/** Current links of a unit (holding now), with ids, for the screens. */
export async function currentLinksOfUnit(siteId: string, unitId: string, now = new Date()) {
  const all = await linksValidAt(siteId, now);
  return all.filter((l) => l.unitId === unitId);
}

async function resolveTag(tx: Tx, siteId: string, input: { tagId?: string; tag?: string }): Promise<{ id: string; name: string }> {
  if (input.tagId) {
    const [t] = await tx.select({ id: tags.id, name: tags.name }).from(tags).where(and(eq(tags.id, input.tagId), eq(tags.siteId, siteId))).limit(1);
    if (!t) throw new AppError('VALIDATION_FAILED', 'No such tag at this site.', [{ path: '$.tagId', message: 'No such tag at this site.' }]);
    return t;
  }
  if (input.tag) {
    await tx.insert(tags).values({ siteId, name: input.tag }).onConflictDoNothing();
    const [t] = await tx.select({ id: tags.id, name: tags.name }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, input.tag))).limit(1);
    return t!;
  }
  throw new AppError('VALIDATION_FAILED', 'Say which tag to link.', [{ path: '$.tagId', message: 'Give tagId or tag (a name).' }]);
}

/**
 * Links a tag, or changes a link: a new version from validFrom. The version holding at validFrom is
 * closed there; the new one runs until the next later version starts (or the closed one's end), else
 * stays open. Queues a recompute of [validFrom, end of the new version) for this unit; open-ended
 * stops at the end of the current hour.
 *
 * @returns the new version and the recompute range it queued
 */
export async function setLink(siteId: string, input: LinkInput, createdBy: string | null) {
  return inTransaction(async (tx, recompute) => {
    // Serialise changes of one unit's links.
    const [unit] = await tx.select().from(plantUnits).where(and(eq(plantUnits.id, input.unitId), eq(plantUnits.siteId, siteId))).for('update').limit(1);
    if (!unit) throw new AppError('NOT_FOUND', 'No such unit at this site.');
    let target: LinkTarget = { kind: unit.kind as UnitKind, slot: null, fluid: null };
    const portId = input.portId ?? null;
    if (portId) {
      const [port] = await tx.select().from(plantPorts).where(and(eq(plantPorts.id, portId), eq(plantPorts.unitId, unit.id))).limit(1);
      if (!port) throw new AppError('VALIDATION_FAILED', 'No such port on this unit.', [{ path: '$.portId', message: 'No such port on this unit.' }]);
      target = { kind: unit.kind as UnitKind, slot: port.slot, fluid: (port.fluid?.kind ?? null) as FluidKind | null };
    }
    const tag = await resolveTag(tx, siteId, input);
    const versions = await tx
      .select()
      .from(tagLinks)
      .where(and(eq(tagLinks.unitId, unit.id), portId ? eq(tagLinks.portId, portId) : isNull(tagLinks.portId), eq(tagLinks.quantity, input.quantity)))
      .orderBy(asc(tagLinks.validFrom));
    const live = versions.filter((v) => v.validTo === null || v.validTo > v.validFrom);
    const t = input.validFrom ?? (live.length ? new Date(Math.floor(Date.now() / MINUTE_MS) * MINUTE_MS) : new Date(BEGINNING_MS));
    const uncertainty = input.uncertainty ?? defaultUncertainty(input.quantity, input.unit);
    const asModel: LinkModel = {
      quantity: input.quantity,
      tag: tag.name,
      unit: input.unit,
      ...(input.basis ? { basis: input.basis } : {}),
      uncertainty,
      ...(input.validMin != null ? { validMin: input.validMin } : {}),
      ...(input.validMax != null ? { validMax: input.validMax } : {}),
    };
    const issues = checkLink(target, asModel, []);
    if (issues.length) throw new AppError('VALIDATION_FAILED', issues[0]!.message, issues);

    const tMs = t.getTime();
    const covering = live.find((v) => v.validFrom.getTime() <= tMs && (v.validTo === null || v.validTo.getTime() > tMs));
    const next = live.find((v) => v.validFrom.getTime() > tMs);
    let newTo: Date | null = next ? next.validFrom : null;
    if (covering) {
      if (covering.validTo && (!newTo || covering.validTo < newTo)) newTo = covering.validTo;
      await tx.update(tagLinks).set({ validTo: t }).where(eq(tagLinks.id, covering.id));
    }
    const [row] = await tx
      .insert(tagLinks)
      .values({
        siteId,
        unitId: unit.id,
        portId,
        tagId: tag.id,
        quantity: input.quantity,
        engUnit: input.unit,
        basis: input.basis ?? null,
        uncertaintyMode: uncertainty.mode,
        uncertainty: uncertainty.value,
        validMin: input.validMin ?? null,
        validMax: input.validMax ?? null,
        validFrom: t,
        validTo: newTo,
        createdBy,
      })
      .returning();
    const range = { siteId, fromMs: tMs, toMs: newTo ? newTo.getTime() : Math.max(openEndMs(), tMs + HOUR_MS), unitIds: [unit.id] };
    await recompute(range);
    await tx.update(plantUnits).set({ updatedAt: new Date() }).where(eq(plantUnits.id, unit.id));
    return { link: row!, recompute: range };
  });
}

/**
 * Ends a link at an instant (the tag no longer measures it): the version holding then is closed.
 * Queues a recompute of [at, the version's former end or the end of the current hour) for its unit.
 */
export async function endLink(siteId: string, linkId: string, at: Date = new Date()) {
  if (!/^[0-9a-f-]{36}$/i.test(linkId) || !/^[0-9a-f-]{36}$/i.test(siteId)) throw new AppError('NOT_FOUND', 'No such link at this site.');
  return inTransaction(async (tx, recompute) => {
    const [row] = await tx.select().from(tagLinks).where(and(eq(tagLinks.id, linkId), eq(tagLinks.siteId, siteId))).for('update').limit(1);
    if (!row) throw new AppError('NOT_FOUND', 'No such link at this site.');
    const atMs = at.getTime();
    if (!(row.validFrom.getTime() <= atMs && (row.validTo === null || row.validTo.getTime() > atMs))) {
      throw new AppError('CONFLICT', 'This version does not hold at that instant; end the version that does.');
    }
    await tx.update(tagLinks).set({ validTo: at }).where(eq(tagLinks.id, linkId));
    const range = { siteId, fromMs: atMs, toMs: row.validTo ? row.validTo.getTime() : Math.max(openEndMs(), atMs + HOUR_MS), unitIds: [row.unitId] };
    await recompute(range);
    return { recompute: range };
  });
}
