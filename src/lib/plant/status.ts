/**
 * What a unit still lacks to compute, and what conflicts in its links. Pure: takes the unit as in the
 * model file (with its current links only) plus what is known of the tags, returns lists the screens
 * show and the engine can refuse on.
 */
import { canConvert } from '../units/convert';
import { quantityList, type Quantity } from '../units/quantities';
import { parseUnit } from '../units/parse';
import { LINK_QUANTITIES, kindSpec, measurementsFor, type LinkQuantity, type MeasurementSpec } from './kinds';
import type { LinkModel, UnitModel } from './model';

export type MissingCode =
  | 'MISSING_PORT'
  | 'MISSING_FLUID'
  | 'MISSING_MEASUREMENT'
  | 'MISSING_PARAMETER'
  | 'MISSING_FUEL'
  | 'MISSING_BOUNDARY_T'
  | 'MISSING_FUEL_SOURCE';
export type ConflictCode =
  | 'TAG_ON_TWO_QUANTITIES'
  | 'TAG_HINT_OTHER_QUANTITY'
  | 'UNIT_CANNOT_CONVERT'
  | 'UNIT_DIFFERS_FROM_HINT'
  | 'DUPLICATE_MEASUREMENT'
  | 'LINK_NOT_IN_CATALOGUE';

export interface StatusItem<C extends string = string> {
  readonly code: C;
  readonly message: string;
  /** Port name, when the item concerns a port. */
  readonly port?: string;
  /** Port slot (for a missing port), or the slot of `port`. */
  readonly slot?: string;
  /** Quantities that would satisfy a missing measurement, or the link's quantity. */
  readonly quantities?: readonly LinkQuantity[];
  /** Parameter key, for a missing parameter. */
  readonly parameter?: string;
  /** Tag name, for a conflict about a tag. */
  readonly tag?: string;
}

export interface UnitStatus {
  /** True when nothing is missing and nothing conflicts. */
  readonly complete: boolean;
  readonly missing: readonly StatusItem<MissingCode>[];
  readonly conflicts: readonly StatusItem<ConflictCode>[];
}

/** What is known of the site around the unit. */
export interface StatusContext {
  /** unitHint of each tag by name (the unit text the export carried), or null. */
  readonly tagHints: ReadonlyMap<string, string | null>;
  /** Every current link of the site, to find one tag on two quantities. */
  readonly siteLinks: readonly { unit: string; port?: string; quantity: LinkQuantity; tag: string }[];
  /** Names of the site's boilers (sources of flue-gas composition). */
  readonly boilers: ReadonlySet<string>;
}

/** Quantities of src/lib/units a unit text belongs to ('degC' -> temperature, temperatureDifference). */
export function quantitiesOfUnitText(unitText: string): Quantity[] {
  return quantityList.map((q) => q.quantity).filter((q) => canConvert(unitText, q));
}

function satisfied(m: MeasurementSpec, links: readonly LinkModel[], port: string | undefined): LinkModel[] {
  return links.filter((l) => l.port === port && m.anyOf.includes(l.quantity));
}

/** What one step of the status found, in the order the screens list it. */
interface Notes {
  readonly missing: StatusItem<MissingCode>[];
  readonly conflicts: StatusItem<ConflictCode>[];
}

type Spec = ReturnType<typeof kindSpec>;
type Slot = Spec['ports'][number];
type Port = UnitModel['ports'][number];

/**
 * Completeness and conflicts of one unit.
 *
 * @param unit the unit with its ports, parameters, fuel and its current links (no ended versions)
 * @param ctx tag hints, the site's current links, the site's boilers
 */
export function unitStatus(unit: UnitModel, ctx: StatusContext): UnitStatus {
  const spec = kindSpec(unit.kind);
  /** The links some measurement of the catalogue takes (filled by the port and unit steps). */
  const linksUsed = new Set<LinkModel>();
  const steps: Notes[] = [portCountNotes(unit, spec)];
  for (const port of unit.ports) {
    const slot = spec.ports.find((s) => s.slot === port.slot);
    if (slot) steps.push(portNotes(unit, port, slot, ctx, linksUsed));
  }
  steps.push(unitMeasurementNotes(unit, spec, linksUsed), unusedLinkNotes(unit, linksUsed), parameterNotes(unit, spec));
  for (const l of unit.links) steps.push(linkNotes(unit, l, ctx));
  const missing = steps.flatMap((n) => n.missing);
  const conflicts = steps.flatMap((n) => n.conflicts);
  return { complete: missing.length === 0 && conflicts.length === 0, missing, conflicts };
}

/** Ports: counts per slot and in all, and the fuel a kind cannot do without. */
function portCountNotes(unit: UnitModel, spec: Spec): Notes {
  const missing: StatusItem<MissingCode>[] = [];
  for (const slot of spec.ports) {
    const n = unit.ports.filter((p) => p.slot === slot.slot).length;
    if (n < slot.min) {
      missing.push({
        code: 'MISSING_PORT',
        slot: slot.slot,
        message: slot.min - n === 1 ? `Add a ${slot.label.toLowerCase()} port.` : `Add ${slot.min - n} more ${slot.label.toLowerCase()} ports (at least ${slot.min}).`,
      });
    }
  }
  if (unit.ports.length < spec.minPorts && !spec.ports.some((s) => s.min > 0)) {
    missing.push({ code: 'MISSING_PORT', message: `A ${spec.label.toLowerCase()} needs at least ${spec.minPorts} port${spec.minPorts === 1 ? '' : 's'}.` });
  }
  if (spec.needsFuel && !unit.fuel) missing.push({ code: 'MISSING_FUEL', message: 'Define the fuel (composition, or type and heating value).' });
  return { missing, conflicts: [] };
}

/** One port: its fluid, the boiler its flue gas comes from, and each measurement its slot asks for. */
function portNotes(unit: UnitModel, port: Port, slot: Slot, ctx: StatusContext, linksUsed: Set<LinkModel>): Notes {
  const missing: StatusItem<MissingCode>[] = [];
  const conflicts: StatusItem<ConflictCode>[] = [];
  if (slot.stream === 'matter' && !port.fluid) {
    missing.push({ code: 'MISSING_FLUID', port: port.name, slot: port.slot, message: `Say which fluid port '${port.name}' carries.` });
  }
  if (port.fluid?.kind === 'flue-gas') {
    const source = port.fluid.fuelFrom ?? (unit.kind === 'boiler' ? unit.name : undefined);
    if (!source || (source !== unit.name && !ctx.boilers.has(source))) {
      missing.push({ code: 'MISSING_FUEL_SOURCE', port: port.name, slot: port.slot, message: `Say which boiler's fuel makes the flue gas at '${port.name}'.` });
    }
  }
  for (const m of measurementsFor(slot, port.fluid?.kind ?? null)) {
    const n = portMeasurementNotes(unit, port, slot, m, linksUsed);
    missing.push(...n.missing);
    conflicts.push(...n.conflicts);
  }
  return { missing, conflicts };
}

/** One measurement of a port: linked once, not twice; a heat port's boundary temperature given or linked. */
function portMeasurementNotes(unit: UnitModel, port: Port, slot: Slot, m: MeasurementSpec, linksUsed: Set<LinkModel>): Notes {
  const missing: StatusItem<MissingCode>[] = [];
  const conflicts: StatusItem<ConflictCode>[] = [];
  const hits = satisfied(m, unit.links, port.name);
  hits.forEach((h) => linksUsed.add(h));
  if (hits.length > 1) {
    conflicts.push({
      code: 'DUPLICATE_MEASUREMENT',
      port: port.name,
      slot: port.slot,
      quantities: hits.map((h) => h.quantity),
      message: `Port '${port.name}' has ${hits.length} links for its ${m.label} (${hits.map((h) => h.tag).join(', ')}); keep one.`,
    });
  }
  const boundaryGiven = slot.stream === 'heat' && m.key === 'T' && port.boundaryT_K !== undefined;
  if (hits.length === 0 && m.need === 'required') {
    missing.push({
      code: 'MISSING_MEASUREMENT',
      port: port.name,
      slot: port.slot,
      quantities: m.anyOf,
      message: `Link a ${m.label} tag at '${port.name}'${m.anyOf.length > 1 ? ` (${m.anyOf.map((q) => LINK_QUANTITIES[q].label).join(' or ')})` : ''}.`,
    });
  }
  if (slot.stream === 'heat' && m.key === 'T' && hits.length === 0 && !boundaryGiven) {
    missing.push({
      code: 'MISSING_BOUNDARY_T',
      port: port.name,
      slot: port.slot,
      quantities: ['temperature'],
      message: `Give heat port '${port.name}' a boundary temperature, or link a temperature tag.`,
    });
  }
  return { missing, conflicts };
}

/** The measurements of the unit itself (shaft power, ...): linked once, not twice. */
function unitMeasurementNotes(unit: UnitModel, spec: Spec, linksUsed: Set<LinkModel>): Notes {
  const missing: StatusItem<MissingCode>[] = [];
  const conflicts: StatusItem<ConflictCode>[] = [];
  for (const m of spec.unitMeasurements) {
    const hits = satisfied(m, unit.links, undefined);
    hits.forEach((h) => linksUsed.add(h));
    if (hits.length > 1) {
      conflicts.push({ code: 'DUPLICATE_MEASUREMENT', quantities: hits.map((h) => h.quantity), message: `The unit has ${hits.length} links for its ${m.label}; keep one.` });
    }
    if (hits.length === 0 && m.need === 'required') {
      missing.push({ code: 'MISSING_MEASUREMENT', quantities: m.anyOf, message: `Link a ${m.label} tag of the unit.` });
    }
  }
  return { missing, conflicts };
}

/** Links no measurement of the catalogue takes (run after the port and unit steps have marked theirs). */
function unusedLinkNotes(unit: UnitModel, linksUsed: ReadonlySet<LinkModel>): Notes {
  const conflicts: StatusItem<ConflictCode>[] = [];
  for (const l of unit.links) {
    if (!linksUsed.has(l)) {
      conflicts.push({
        code: 'LINK_NOT_IN_CATALOGUE',
        port: l.port,
        quantities: [l.quantity],
        tag: l.tag,
        message: `Tag ${l.tag} is linked as ${LINK_QUANTITIES[l.quantity].label}${l.port ? ` at '${l.port}'` : ''}, which this port or unit does not take (was its fluid changed?).`,
      });
    }
  }
  return { missing: [], conflicts };
}

/** Parameters without a default that the kind cannot do without. */
function parameterNotes(unit: UnitModel, spec: Spec): Notes {
  const missing: StatusItem<MissingCode>[] = [];
  for (const p of spec.params) {
    if (p.type === 'number' && p.required && unit.parameters[p.key] === undefined) {
      missing.push({ code: 'MISSING_PARAMETER', parameter: p.key, message: `Set the parameter '${p.label}'.` });
    }
  }
  return { missing, conflicts: [] };
}

/** Conflicts of one link's unit and tag: a unit of another quantity, the export's unit text, the tag linked elsewhere as another quantity. */
function linkNotes(unit: UnitModel, l: LinkModel, ctx: StatusContext): Notes {
  const conflicts: StatusItem<ConflictCode>[] = [];
  const q = LINK_QUANTITIES[l.quantity].quantity;
  const where = l.port ? ` at '${l.port}'` : '';
  if (!canConvert(l.unit, q)) {
    conflicts.push({ code: 'UNIT_CANNOT_CONVERT', port: l.port, tag: l.tag, quantities: [l.quantity], message: `Tag ${l.tag}${where}: '${l.unit}' cannot be converted to ${q}.` });
  }
  const hint = ctx.tagHints.get(l.tag) ?? null;
  if (hint && parseUnit(hint) !== null) {
    if (!canConvert(hint, q)) {
      const its = quantitiesOfUnitText(hint);
      conflicts.push({
        code: 'TAG_HINT_OTHER_QUANTITY',
        port: l.port,
        tag: l.tag,
        quantities: [l.quantity],
        message: `Tag ${l.tag} comes with unit '${hint}' (${its.join(' or ') || 'another quantity'}) but is linked as ${LINK_QUANTITIES[l.quantity].label}${where}.`,
      });
    } else if (canConvert(l.unit, q) && parseUnit(hint) !== parseUnit(l.unit)) {
      conflicts.push({
        code: 'UNIT_DIFFERS_FROM_HINT',
        port: l.port,
        tag: l.tag,
        quantities: [l.quantity],
        message: `Tag ${l.tag}${where}: the export says '${hint}' but the link says '${l.unit}'; check which is right (gauge or absolute?).`,
      });
    }
  }
  const elsewhere = ctx.siteLinks.filter(
    (o) => o.tag === l.tag && LINK_QUANTITIES[o.quantity].quantity !== q && !(o.unit === unit.name && o.port === l.port && o.quantity === l.quantity),
  );
  if (elsewhere.length) {
    const o = elsewhere[0]!;
    conflicts.push({
      code: 'TAG_ON_TWO_QUANTITIES',
      port: l.port,
      tag: l.tag,
      quantities: [l.quantity],
      message: `Tag ${l.tag} is linked as ${LINK_QUANTITIES[l.quantity].label}${where} and as ${LINK_QUANTITIES[o.quantity].label} of '${o.unit}'${o.port ? ` at '${o.port}'` : ''}.`,
    });
  }
  return { missing: [], conflicts };
}
