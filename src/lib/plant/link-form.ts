/**
 * The link form of the plant pages (LinkForm): what a unit's tag can measure, the engineering unit to
 * propose, the check of the form, the POST body it sends and the sentence it says when done. Pure.
 */
import { z } from 'zod';
import type { UnitKind } from '../kinds';
import { canConvert, parseUnit, unitsFor } from '../units';
import { LINK_QUANTITIES, kindSpec, measurementsFor, type LinkQuantity } from './kinds';
import type { Fluid, PortModel } from './model';
import type { UnitStatus } from './status';

/** What the targets of a unit are read from: its kind, its ports and what its status says is missing. */
export interface LinkableUnit {
  id: string;
  name: string;
  kind: UnitKind;
  ports: (PortModel & { id: string })[];
  status: UnitStatus;
}

/** One (port, quantity) a tag can be linked to; `value` is 'portId|quantity' ('|quantity' for the unit). */
export interface Target {
  value: string;
  portId: string | null;
  quantity: LinkQuantity;
  label: string;
  missing: boolean;
}

/** Every (port, quantity) a unit's catalogue entry takes, the still-missing ones first. */
export function targetsOf(unit: LinkableUnit): Target[] {
  const spec = kindSpec(unit.kind);
  const missing = new Set(
    unit.status.missing
      .filter((m) => m.code === 'MISSING_MEASUREMENT' || m.code === 'MISSING_BOUNDARY_T')
      .flatMap((m) => (m.quantities ?? []).map((q) => `${m.port ?? ''}|${q}`)),
  );
  const out: Target[] = [];
  for (const port of unit.ports) {
    const slot = spec.ports.find((s) => s.slot === port.slot);
    if (!slot) continue;
    for (const m of measurementsFor(slot, (port.fluid as Fluid | undefined)?.kind ?? null)) {
      for (const q of m.anyOf) {
        const key = `${port.name}|${q}`;
        out.push({ value: `${port.id}|${q}`, portId: port.id, quantity: q, label: `${port.name} · ${LINK_QUANTITIES[q].label}`, missing: missing.has(key) });
      }
    }
  }
  for (const m of spec.unitMeasurements) {
    for (const q of m.anyOf) {
      out.push({ value: `|${q}`, portId: null, quantity: q, label: `unit · ${LINK_QUANTITIES[q].label}`, missing: missing.has(`|${q}`) });
    }
  }
  return out.sort((a, b) => Number(b.missing) - Number(a.missing));
}

/** The engineering unit to propose for a tag: its unit hint when it converts, else the first unit of the quantity. */
export function proposedUnit(hint: string | null | undefined, quantity: LinkQuantity): string {
  const q = LINK_QUANTITIES[quantity].quantity;
  if (hint && canConvert(hint, q)) return parseUnit(hint) ?? hint;
  return unitsFor(q)[0]!;
}

/** The quantity of a target value ('portId|quantity'), or null when none is chosen. */
export const targetQuantity = (target: string): LinkQuantity | null => (target ? ((target.split('|')[1] as LinkQuantity | undefined) ?? null) : null);

export const LinkFormSchema = z
  .object({
    unitId: z.string().min(1, 'Choose a unit.'),
    target: z.string().min(1, 'Choose what the tag measures.'),
    tag: z.string().trim().min(1, 'Choose a tag.'),
    unit: z.string().trim().min(1, 'Give the engineering unit.'),
    basis: z.enum(['', 'dry', 'wet']),
    uncertaintyMode: z.enum(['absolute', 'relative']),
    uncertainty: z.string().refine((v) => v.trim() !== '' && Number(v) >= 0, 'A number, 0 or more.'),
    validMin: z.string(),
    validMax: z.string(),
    validFrom: z.string(),
  })
  .superRefine((v, ctx) => {
    const q = v.target.split('|')[1] as LinkQuantity | undefined;
    if (q && !canConvert(v.unit, LINK_QUANTITIES[q].quantity)) {
      ctx.addIssue({ code: 'custom', path: ['unit'], message: `Not a unit of ${LINK_QUANTITIES[q].label}.` });
    }
    if (q === 'o2Fraction' && v.basis === '') ctx.addIssue({ code: 'custom', path: ['basis'], message: 'Say whether the analyser reads dry or wet.' });
    for (const k of ['validMin', 'validMax'] as const) {
      if (v[k].trim() !== '' && !Number.isFinite(Number(v[k]))) ctx.addIssue({ code: 'custom', path: [k], message: 'A number, or empty.' });
    }
  });
export type LinkFormValues = z.infer<typeof LinkFormSchema>;

/**
 * The POST body of /api/sites/{siteId}/links for the checked form: a known tag by its id, a new one
 * by its name; `validFrom` is the ISO instant of the form's wall time (left out: the server's default).
 */
export function linkRequestBody(v: LinkFormValues, knownTagId: string | undefined, validFrom: string | undefined) {
  const [portId, q] = v.target.split('|') as [string, LinkQuantity];
  return {
    unitId: v.unitId,
    portId: portId || null,
    quantity: q,
    ...(knownTagId ? { tagId: knownTagId } : { tag: v.tag }),
    unit: v.unit,
    ...(v.basis ? { basis: v.basis } : {}),
    uncertainty: { mode: v.uncertaintyMode, value: Number(v.uncertainty) },
    validMin: v.validMin.trim() === '' ? null : Number(v.validMin),
    validMax: v.validMax.trim() === '' ? null : Number(v.validMax),
    ...(validFrom ? { validFrom } : {}),
  };
}

/** What the form says once the link is stored: the tag, what it measures, where, and of which unit. */
export function linkedText(v: LinkFormValues, unit: Pick<LinkableUnit, 'name' | 'ports'> | undefined): string {
  const [portId, q] = v.target.split('|') as [string, LinkQuantity];
  return `Linked ${v.tag} as ${LINK_QUANTITIES[q].label}${portId ? ` at ${unit?.ports.find((p) => p.id === portId)?.name}` : ''} of ${unit?.name}.`;
}
