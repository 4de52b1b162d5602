/**
 * The site as a plant model (the same shape as the model file, src/lib/plant/model.ts) with the ids
 * behind its names, each unit's completeness and conflicts, and the overview the screens and the
 * units API draw from it; and a site, or a unit with its site, by id. Sites, units and ports are edited in ./plant.ts
 * (which re-exports these); import and export of the file in ./plant-model.ts.
 */
import { and, asc, eq, gt, inArray, isNull, lte, or } from 'drizzle-orm';
import { BEGINNING_MS, type LinkModel, type PlantModel, type PortModel, type SiteModel, type UnitModel } from '~/lib/plant/model';
import type { UnitKind } from '~/lib/kinds';
import { unitStatus, type UnitStatus } from '~/lib/plant/status';
import { tidyNormallyIdle } from '~/lib/plant/idle';
import type { LinkVersion } from '~/lib/plant/link-version';
import { db } from '../db/client';
import { plantPorts, plantUnits, sites, tagLinks, tags } from '../db/schema';
import { AppError } from '../errors';
import type { Reader } from '../db/tx';
import { isId } from '../access';
import { siteDisplay } from './display-units';
import { readTagLimits } from './plant-tag-limits';
import { resolvedSelect } from './plant-links';

/** A site by id (NOT_FOUND for an unknown or malformed id). */
export async function getSite(siteId: string, r: Reader = db()) {
  if (!isId(siteId)) throw new AppError('NOT_FOUND', 'No such site.');
  const [site] = await r.select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  return site;
}

/** A unit with its site, by the unit's id (NOT_FOUND for an unknown or malformed id). */
export async function unitWithSite(unitId: string | undefined, r: Reader = db()) {
  if (!isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit.');
  const [row] = await r.select({ unit: plantUnits, site: sites }).from(plantUnits).innerJoin(sites, eq(sites.id, plantUnits.siteId)).where(eq(plantUnits.id, unitId)).limit(1);
  if (!row) throw new AppError('NOT_FOUND', 'No such unit.');
  return row;
}

/** Ids behind the names of a model built from the database. */
export interface ModelIds {
  /** By unit name: the unit's id, its ports' ids by name, and its link versions' ids in the order of `links`. */
  units: Map<string, { id: string; ports: Map<string, string>; links: string[] }>;
}

/** A link version as the model file writes it. */
function linkModelOf(l: LinkVersion): LinkModel {
  return {
    ...(l.portName !== null ? { port: l.portName } : {}),
    quantity: l.quantity,
    tag: l.tagName,
    unit: l.engUnit,
    ...(l.basis ? { basis: l.basis } : {}),
    uncertainty: { mode: l.uncertaintyMode, value: l.uncertainty },
    ...(l.validMin !== null ? { validMin: l.validMin } : {}),
    ...(l.validMax !== null ? { validMax: l.validMax } : {}),
    ...(l.validFrom.getTime() !== BEGINNING_MS ? { validFrom: l.validFrom.toISOString() } : {}),
    ...(l.validTo ? { validTo: l.validTo.toISOString() } : {}),
  };
}

function sortedObject<T>(o: Record<string, T>): Record<string, T> {
  return Object.fromEntries(Object.entries(o).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * The site as a plant model file. links 'all': every version (superseded empty ones left out);
 * 'current': only those holding at `at` (default now), for the completeness check.
 */
export async function siteModel(r: Reader, siteId: string, links: 'all' | 'current' = 'all', at = new Date()): Promise<{ model: PlantModel; ids: ModelIds }> {
  const site = await getSite(siteId, r);
  let T0Tag: SiteModel['deadState']['T0Tag'];
  if (site.t0TagId) {
    const [t] = await r.select({ name: tags.name }).from(tags).where(eq(tags.id, site.t0TagId)).limit(1);
    if (t) T0Tag = { tag: t.name, unit: site.t0TagUnit ?? 'degC' };
  }
  const siteOut: SiteModel = {
    name: site.name,
    timeZone: site.timeZone,
    ...(site.elevation_m !== null ? { elevation_m: site.elevation_m } : {}),
    p_atm_Pa: site.p_atm_Pa,
    deadState: { T0_K: site.T0_K, p0_Pa: site.p0_Pa, ...(T0Tag ? { T0Tag } : {}) },
    currency: site.currency,
    prices: site.prices.map((p) => ({ name: p.name, kind: p.kind, price_per_MWh: p.price_per_MWh, currency: p.currency })),
  };
  const unitRows = await r.select().from(plantUnits).where(eq(plantUnits.siteId, siteId)).orderBy(asc(plantUnits.name));
  const unitIds = unitRows.map((u) => u.id);
  const portRows = unitIds.length
    ? await r.select().from(plantPorts).where(inArray(plantPorts.unitId, unitIds)).orderBy(asc(plantPorts.position), asc(plantPorts.name))
    : [];
  const linkWhere =
    links === 'current'
      ? and(eq(tagLinks.siteId, siteId), lte(tagLinks.validFrom, at), or(isNull(tagLinks.validTo), gt(tagLinks.validTo, at)))
      : and(eq(tagLinks.siteId, siteId), or(isNull(tagLinks.validTo), gt(tagLinks.validTo, tagLinks.validFrom)));
  const linkRows = await resolvedSelect(r).where(linkWhere);
  const portPosition = new Map(portRows.map((p) => [p.id, p.position]));
  const positionOf = (l: LinkVersion) => (l.portId === null ? -1 : (portPosition.get(l.portId) ?? -1));
  linkRows.sort(
    (a, b) =>
      positionOf(a) - positionOf(b) ||
      (a.portName ?? '').localeCompare(b.portName ?? '') ||
      a.quantity.localeCompare(b.quantity) ||
      a.validFrom.getTime() - b.validFrom.getTime(),
  );
  const ids: ModelIds = { units: new Map() };
  const units: UnitModel[] = unitRows.map((u) => {
    const ports = portRows.filter((p) => p.unitId === u.id);
    const links = linkRows.filter((l) => l.unitId === u.id);
    ids.units.set(u.name, { id: u.id, ports: new Map(ports.map((p) => [p.name, p.id])), links: links.map((l) => l.id) });
    return {
      name: u.name,
      kind: u.kind as UnitKind,
      ...(u.description ? { description: u.description } : {}),
      parameters: sortedObject(u.parameters),
      ...(u.fuel ? { fuel: u.fuel } : {}),
      ...(u.normallyIdle ? { normallyIdle: tidyNormallyIdle(u.normallyIdle) } : {}),
      ports: ports.map((p) => ({
        name: p.name,
        slot: p.slot,
        ...(p.fluid ? { fluid: p.fluid } : {}),
        ...(p.boundaryT_K !== null ? { boundaryT_K: p.boundaryT_K } : {}),
        ...(p.account ? { account: p.account as PortModel['account'] } : {}),
      })),
      links: links.map(linkModelOf),
    };
  });
  const named = new Set([...(T0Tag ? [T0Tag.tag] : []), ...units.flatMap((u) => u.links.map((l) => l.tag))]);
  const tagLimits = await readTagLimits(r, siteId, named);
  const model: PlantModel = { format: 'lossline-plant-model', version: 1, site: siteOut, units, ...(tagLimits.length ? { tags: tagLimits } : {}) };
  return { model, ids };
}

/** Each unit of a site with its completeness and conflicts now. */
export async function siteStatus(siteId: string, r: Reader = db()): Promise<Map<string, UnitStatus>> {
  const { model } = await siteModel(r, siteId, 'current');
  const tagRows = await r.select({ name: tags.name, unitHint: tags.unitHint }).from(tags).where(eq(tags.siteId, siteId));
  const tagHints = new Map(tagRows.map((t) => [t.name, t.unitHint]));
  const siteLinks = model.units.flatMap((u) => u.links.map((l) => ({ unit: u.name, port: l.port, quantity: l.quantity, tag: l.tag })));
  const boilers = new Set(model.units.filter((u) => u.kind === 'boiler').map((u) => u.name));
  return new Map(model.units.map((u) => [u.name, unitStatus(u, { tagHints, siteLinks, boilers })]));
}

/** The site's units with ports, current links and status, for the screens. */
export async function siteOverview(siteId: string) {
  const r = db();
  const site = await getSite(siteId, r);
  const { model, ids } = await siteModel(r, siteId, 'current');
  const status = await siteStatus(siteId, r);
  return {
    site,
    /** The site's settings as the model file writes them (ambient tag by name). */
    settings: model.site,
    /** The units its pages show numbers in. */
    display: await siteDisplay(siteId, r),
    units: model.units.map((u) => ({
      id: ids.units.get(u.name)!.id,
      ...u,
      ports: u.ports.map((p) => ({ id: ids.units.get(u.name)!.ports.get(p.name)!, ...p })),
      links: u.links.map((l, i) => ({ id: ids.units.get(u.name)!.links[i]!, ...l })),
      status: status.get(u.name)!,
    })),
  };
}

/** One unit with its ports, current links (with ids) and status. */
export async function unitDetail(siteId: string, unitId: string) {
  const overview = await siteOverview(siteId);
  const unit = overview.units.find((u) => u.id === unitId);
  if (!unit) throw new AppError('NOT_FOUND', 'No such unit at this site.');
  return { site: overview.site, unit, unitNames: overview.units.map((u) => ({ id: u.id, name: u.name, kind: u.kind })) };
}

