/**
 * The plant model file: one JSON document with a site, its units, their ports and their versioned tag
 * links, so a plant is kept under version control and set up in one step. Documented in
 * docs/plant-model.md. Pure: the schema (zod, ./model-schema.ts) plus the checks a schema cannot
 * express (./model-checks.ts per part, checkUnit and checkModel here), every problem reported with its
 * JSON path ('$.units[2].links[0].unit'). Import the model from this file.
 */
import { jsonPath, humanErrorMap, humanIssues } from '~/lib/zod-words';
import { canConvert } from '../units/convert';
import { figures } from '../format';
import { kindSpec } from './kinds';
import { checkTagLimits } from './tag-limits';
import { COMPOSITION_SUM_TOLERANCE, PlantModelSchema, type ModelIssue, type PlantModel, type PortModel, type UnitModel } from './model-schema';
import { isTimeZone, checkComposition, checkParameter, checkPort, checkLink, linkKey, linkInterval, type LinkTarget } from './model-checks';

export * from './model-schema';
export { isTimeZone, checkComposition, checkParameter, checkPort, checkLink, linkKey, linkInterval, type LinkTarget } from './model-checks';

/** Problems of one unit: parameters, fuel, ports and links (paths under `at`). */
export function checkUnit(unit: UnitModel, at: readonly PropertyKey[], ctx: { boilers: ReadonlySet<string>; priceNames: ReadonlySet<string> }): ModelIssue[] {
  const out: ModelIssue[] = [];
  const spec = kindSpec(unit.kind);
  for (const [key, value] of Object.entries(unit.parameters)) out.push(...checkParameter(unit.kind, key, value, [...at, 'parameters', key]));
  if (unit.fuel) {
    if (!spec.needsFuel) out.push({ path: jsonPath([...at, 'fuel']), message: `A ${unit.kind} has no fuel definition; only a boiler does.` });
    if (unit.fuel.by === 'composition') out.push(...checkComposition(unit.fuel.moleFractions, [...at, 'fuel', 'moleFractions']));
    if (unit.fuel.by === 'ultimate') {
      const sum = Object.values(unit.fuel.ultimate).reduce<number>((a, b) => a + (b ?? 0), 0);
      if (Math.abs(sum - 1) > COMPOSITION_SUM_TOLERANCE) {
        out.push({ path: jsonPath([...at, 'fuel', 'ultimate']), message: `Mass fractions sum to ${figures(sum, 6)}; they must sum to 1 (moisture and ash included).` });
      }
    }
    if (unit.fuel.price !== undefined && !ctx.priceNames.has(unit.fuel.price)) {
      out.push({ path: jsonPath([...at, 'fuel', 'price']), message: `No price named '${unit.fuel.price}' in the site's prices.` });
    }
  }
  const ports = new Map<string, PortModel>();
  const perSlot = new Map<string, number>();
  unit.ports.forEach((port, i) => {
    const pAt = [...at, 'ports', i];
    if (ports.has(port.name)) out.push({ path: jsonPath([...pAt, 'name']), message: `Port name '${port.name}' is used twice in unit '${unit.name}'.` });
    ports.set(port.name, port);
    out.push(...checkPort(unit.kind, port, pAt, ctx));
    const n = (perSlot.get(port.slot) ?? 0) + 1;
    perSlot.set(port.slot, n);
    const slot = spec.ports.find((s) => s.slot === port.slot);
    if (slot && slot.max !== null && n > slot.max) {
      out.push({ path: jsonPath([...pAt, 'slot']), message: `A ${unit.kind} has at most ${slot.max} '${port.slot}' port${slot.max === 1 ? '' : 's'}.` });
    }
  });
  const versions = new Map<string, { i: number; from: number; to: number }[]>();
  unit.links.forEach((link, i) => {
    const lAt = [...at, 'links', i];
    let target: LinkTarget = { kind: unit.kind, slot: null, fluid: null };
    if (link.port !== undefined) {
      const port = ports.get(link.port);
      if (!port) {
        out.push({ path: jsonPath([...lAt, 'port']), message: `Unit '${unit.name}' has no port '${link.port}'.` });
        return;
      }
      target = { kind: unit.kind, slot: port.slot, fluid: port.fluid?.kind ?? null };
    }
    out.push(...checkLink(target, link, lAt));
    const [from, to] = linkInterval(link);
    const key = linkKey(link);
    const list = versions.get(key) ?? [];
    for (const v of list) {
      if (from < v.to && v.from < to) {
        out.push({
          path: jsonPath([...lAt, 'validFrom']),
          message: `This ${link.quantity} link${link.port ? ` at '${link.port}'` : ''} overlaps in time with links[${v.i}]; versions of one link follow each other.`,
        });
        break;
      }
    }
    list.push({ i, from, to });
    versions.set(key, list);
  });
  return out;
}

/** Problems of a normally-idle declaration: the units it names must be other units of the site. */
export function checkNormallyIdle(unit: Pick<UnitModel, 'name' | 'normallyIdle'>, unitNames: ReadonlySet<string>, at: readonly PropertyKey[]): ModelIssue[] {
  const out: ModelIssue[] = [];
  unit.normallyIdle?.whileRunning?.forEach((n, j) => {
    if (n === unit.name) out.push({ path: jsonPath([...at, 'whileRunning', j]), message: 'A unit cannot be idle only while it runs itself; name another unit.' });
    else if (!unitNames.has(n)) out.push({ path: jsonPath([...at, 'whileRunning', j]), message: `No unit named '${n}' at this site.` });
  });
  return out;
}

export type ModelCheck = { ok: true; model: PlantModel; issues: [] } | { ok: false; issues: ModelIssue[] };

/**
 * Parses and checks a plant model file. Every problem is reported with its JSON path; the model is
 * returned only when there are none.
 */
export function checkModel(input: unknown): ModelCheck {
  const parsed = PlantModelSchema.safeParse(input, { error: humanErrorMap });
  if (!parsed.success) return { ok: false, issues: humanIssues(parsed.error, 'body') };
  const model = parsed.data;
  const issues: ModelIssue[] = [];
  if (!isTimeZone(model.site.timeZone)) {
    issues.push({ path: '$.site.timeZone', message: `'${model.site.timeZone}' is not an IANA time zone (e.g. Europe/Berlin, America/Chicago, UTC).` });
  }
  const priceNames = new Set<string>();
  model.site.prices.forEach((p, i) => {
    if (priceNames.has(p.name)) issues.push({ path: jsonPath(['site', 'prices', i, 'name']), message: `Price name '${p.name}' is used twice.` });
    priceNames.add(p.name);
  });
  if (model.site.deadState.T0Tag && !canConvert(model.site.deadState.T0Tag.unit, 'temperature')) {
    issues.push({ path: '$.site.deadState.T0Tag.unit', message: `'${model.site.deadState.T0Tag.unit}' is not a temperature unit.` });
  }
  const boilers = new Set(model.units.filter((u) => u.kind === 'boiler').map((u) => u.name));
  const names = new Set<string>();
  model.units.forEach((unit, i) => {
    if (names.has(unit.name)) issues.push({ path: jsonPath(['units', i, 'name']), message: `Unit name '${unit.name}' is used twice.` });
    names.add(unit.name);
    issues.push(...checkUnit(unit, ['units', i], { boilers, priceNames }));
  });
  const allNames = new Set(model.units.map((u) => u.name));
  model.units.forEach((unit, i) => issues.push(...checkNormallyIdle(unit, allNames, ['units', i, 'normallyIdle'])));
  issues.push(...checkTagLimits(model));
  return issues.length ? { ok: false, issues } : { ok: true, model, issues: [] };
}

export { jsonPath };
