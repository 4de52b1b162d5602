/**
 * The checks of a plant model file that a schema cannot express, per part (composition, parameter,
 * port, link): every problem with its JSON path. The whole file's check is checkModel (./model.ts);
 * the shapes checked are in ./model-schema.ts.
 */
import { jsonPath } from '~/lib/zod-words';
import { SPECIES_NAMES } from '../thermo/gas';
import { canConvert } from '../units/convert';
import { figures } from '../format';
import type { FluidKind } from '../kinds';
import { LINK_QUANTITIES, allowedQuantities, kindSpec, type UnitKind } from './kinds';
import { BEGINNING_MS, COMPOSITION_SUM_TOLERANCE, type Composition, type LinkModel, type ModelIssue, type PortModel } from './model-schema';

/** True when the runtime knows the IANA zone. */
export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: tz });
    return tz.length > 0;
  } catch {
    return false;
  }
}

const SPECIES = new Set<string>(SPECIES_NAMES);

/** Problems of a composition: unknown species, or a sum off 1. */
export function checkComposition(c: Composition, at: readonly PropertyKey[]): ModelIssue[] {
  const out: ModelIssue[] = [];
  let sum = 0;
  for (const [sp, x] of Object.entries(c)) {
    if (!SPECIES.has(sp)) out.push({ path: jsonPath([...at, sp]), message: `Unknown species '${sp}'. Known: ${SPECIES_NAMES.join(', ')}.` });
    sum += x;
  }
  if (Object.keys(c).length === 0) out.push({ path: jsonPath(at), message: 'Give at least one species with its mole fraction.' });
  else if (Math.abs(sum - 1) > COMPOSITION_SUM_TOLERANCE) {
    out.push({ path: jsonPath(at), message: `Mole fractions sum to ${figures(sum, 6)}; they must sum to 1 (within ${figures(COMPOSITION_SUM_TOLERANCE, 3)}).` });
  }
  return out;
}

/** Problems of one parameter value against the catalogue. */
export function checkParameter(kind: UnitKind, key: string, value: number | string, at: readonly PropertyKey[]): ModelIssue[] {
  const spec = kindSpec(kind).params.find((s) => s.key === key);
  const path = jsonPath(at);
  if (!spec) {
    return [{ path, message: `A ${kind} has no parameter '${key}'. Its parameters: ${kindSpec(kind).params.map((s) => s.key).join(', ')}.` }];
  }
  if (spec.type === 'choice') {
    return typeof value === 'string' && spec.choices.includes(value)
      ? []
      : [{ path, message: `'${key}' is one of ${spec.choices.map((c) => `'${c}'`).join(', ')}.` }];
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) return [{ path, message: `'${key}' is a number in SI (${spec.quantity}).` }];
  if (spec.min !== undefined && value < spec.min) return [{ path, message: `'${key}' must be at least ${spec.min} (SI).` }];
  if (spec.max !== undefined && value > spec.max) return [{ path, message: `'${key}' must be at most ${spec.max} (SI).` }];
  return [];
}

/** Problems of a port's fluid and extras against its slot. */
export function checkPort(kind: UnitKind, port: PortModel, at: readonly PropertyKey[], ctx: { boilers: ReadonlySet<string> }): ModelIssue[] {
  const spec = kindSpec(kind);
  const slot = spec.ports.find((s) => s.slot === port.slot);
  if (!slot) {
    const slots = spec.ports.map((s) => s.slot);
    return [
      {
        path: jsonPath([...at, 'slot']),
        message: slots.length ? `A ${kind} has no port slot '${port.slot}'. Its slots: ${slots.join(', ')}.` : `A ${kind} has no ports.`,
      },
    ];
  }
  const out: ModelIssue[] = [];
  if (slot.stream === 'heat') {
    if (port.fluid) out.push({ path: jsonPath([...at, 'fluid']), message: `'${port.slot}' is a heat port: it carries no fluid.` });
  } else {
    if (port.boundaryT_K !== undefined) out.push({ path: jsonPath([...at, 'boundaryT_K']), message: 'Only heat ports have a boundary temperature.' });
    if (port.fluid) {
      if (!slot.fluids.includes(port.fluid.kind)) {
        out.push({ path: jsonPath([...at, 'fluid', 'kind']), message: `A ${kind}'s ${port.slot} carries ${slot.fluids.join(', ')}, not ${port.fluid.kind}.` });
      }
      if (port.fluid.kind === 'fuel-gas' || port.fluid.kind === 'gas-mixture') {
        out.push(...checkComposition(port.fluid.moleFractions, [...at, 'fluid', 'moleFractions']));
      }
      if (port.fluid.kind === 'flue-gas' && port.fluid.fuelFrom !== undefined && !ctx.boilers.has(port.fluid.fuelFrom)) {
        out.push({ path: jsonPath([...at, 'fluid', 'fuelFrom']), message: `'${port.fluid.fuelFrom}' is not a boiler of this site.` });
      }
    }
  }
  if (port.account !== undefined && kind !== 'control-volume') {
    out.push({ path: jsonPath([...at, 'account']), message: 'Only ports of a generic control volume are designated fuel, product or loss.' });
  }
  return out;
}

/** Where a link points, resolved against its unit: the slot and fluid of its port (or the unit itself). */
export interface LinkTarget {
  readonly kind: UnitKind;
  readonly slot: string | null;
  readonly fluid: FluidKind | null;
}

/** Problems of one link against its target: quantity allowed there, unit converts, basis, range, dates. */
export function checkLink(target: LinkTarget, link: LinkModel, at: readonly PropertyKey[]): ModelIssue[] {
  const out: ModelIssue[] = [];
  const slot = target.slot === null ? null : (kindSpec(target.kind).ports.find((s) => s.slot === target.slot) ?? null);
  const allowed = allowedQuantities(target.kind, slot, target.fluid);
  if (!allowed.includes(link.quantity)) {
    const where = target.slot === null ? `a ${target.kind} itself` : `a ${target.kind}'s ${target.slot} port${target.fluid ? ` (${target.fluid})` : ''}`;
    out.push({
      path: jsonPath([...at, 'quantity']),
      message: allowed.length
        ? `${where} takes no ${link.quantity} link; it takes ${allowed.join(', ')}.`
        : `${where} takes no links${target.slot === null ? '; link its ports instead' : ''}.`,
    });
  }
  const q = LINK_QUANTITIES[link.quantity].quantity;
  if (!canConvert(link.unit, q)) {
    out.push({ path: jsonPath([...at, 'unit']), message: `'${link.unit}' is not a unit Lossline converts for ${LINK_QUANTITIES[link.quantity].label} (${q}).` });
  }
  const needsBasis = 'needsBasis' in LINK_QUANTITIES[link.quantity];
  if (needsBasis && !link.basis) out.push({ path: jsonPath([...at, 'basis']), message: "O2 needs its basis: 'dry' (extractive analyser) or 'wet' (in-situ probe)." });
  if (!needsBasis && link.basis) out.push({ path: jsonPath([...at, 'basis']), message: 'Only O2 links have a dry/wet basis.' });
  if (link.validMin !== undefined && link.validMax !== undefined && !(link.validMin < link.validMax)) {
    out.push({ path: jsonPath([...at, 'validMax']), message: 'validMax must be greater than validMin.' });
  }
  if (link.uncertainty?.mode === 'relative' && link.uncertainty.value > 100) {
    out.push({ path: jsonPath([...at, 'uncertainty', 'value']), message: 'A relative uncertainty is in percent of reading: at most 100.' });
  }
  const from = link.validFrom ? Date.parse(link.validFrom) : BEGINNING_MS;
  if (link.validTo !== undefined && !(Date.parse(link.validTo) > from)) {
    out.push({ path: jsonPath([...at, 'validTo']), message: 'validTo must be later than validFrom.' });
  }
  return out;
}

/** The key that makes versions of one link: same unit, same port (or none), same quantity. */
export function linkKey(link: { port?: string | null; quantity: string }): string {
  return `${link.port ?? ''}\u0000${link.quantity}`;
}

/** Half-open interval [from, to) of a link in ms; to = Infinity while current. */
export function linkInterval(link: Pick<LinkModel, 'validFrom' | 'validTo'>): [number, number] {
  return [link.validFrom ? Date.parse(link.validFrom) : BEGINNING_MS, link.validTo ? Date.parse(link.validTo) : Infinity];
}
