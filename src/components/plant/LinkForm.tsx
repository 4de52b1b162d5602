import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { UnitKind } from '~/lib/kinds';
import { LINK_QUANTITIES, kindSpec, measurementsFor, type LinkQuantity } from '~/lib/plant/kinds';
import type { Fluid, LinkModel, PortModel } from '~/lib/plant/model';
import type { UnitStatus } from '~/lib/plant/status';
import { defaultUncertainty } from '~/lib/plant/uncertainty';
import { canConvert, parseUnit, unitsFor } from '~/lib/units';
import { Field, Notice, wallTimeToIso } from './common';
import { call, messageOf, type Message } from '~/components/api';

export interface UnitJson {
  id: string;
  name: string;
  kind: UnitKind;
  description?: string;
  parameters: Record<string, number | string>;
  fuel?: unknown;
  ports: (PortModel & { id: string })[];
  links: LinkModel[];
  status: UnitStatus;
}
export interface TagJson {
  id: string;
  name: string;
  unitHint: string | null;
  description?: string | null;
}

export interface Target {
  value: string;
  portId: string | null;
  quantity: LinkQuantity;
  label: string;
  missing: boolean;
}

/** Every (port, quantity) a unit's catalogue entry takes, the still-missing ones first. */
export function targetsOf(unit: UnitJson): Target[] {
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

const Form = z
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
type Form = z.infer<typeof Form>;

/** The engineering unit to propose for a tag: its unit hint when it converts, else the first unit of the quantity. */
export function proposedUnit(hint: string | null | undefined, quantity: LinkQuantity): string {
  const q = LINK_QUANTITIES[quantity].quantity;
  if (hint && canConvert(hint, q)) return parseUnit(hint) ?? hint;
  return unitsFor(q)[0]!;
}

/**
 * Links a tag to a quantity at a port or of a unit, or changes a link (a new version from valid-from).
 * `fixed` preselects the unit, target or tag.
 */
export default function LinkForm({
  siteId,
  timeZone,
  units,
  tags,
  fixed,
  changing,
  onDone,
  onCancel,
}: {
  siteId: string;
  timeZone: string;
  units: UnitJson[];
  tags: TagJson[];
  fixed?: { unitId?: string; target?: string; tag?: string; unit?: string };
  /** True when this replaces a current link: valid-from then defaults to now, not the start. */
  changing?: boolean;
  onDone: (text: string) => void;
  onCancel?: () => void;
}) {
  const [message, setMessage] = useState<Message>(null);
  const firstUnit = fixed?.unitId ?? (units.length === 1 ? units[0]!.id : '');
  const form = useForm<Form>({
    resolver: zodResolver(Form),
    defaultValues: {
      unitId: firstUnit,
      target: fixed?.target ?? '',
      tag: fixed?.tag ?? '',
      unit: fixed?.unit ?? '',
      basis: '',
      uncertaintyMode: 'relative',
      uncertainty: '',
      validMin: '',
      validMax: '',
      validFrom: '',
    },
  });
  const unitId = form.watch('unitId');
  const target = form.watch('target');
  const tagName = form.watch('tag');
  const engUnit = form.watch('unit');
  const unit = units.find((u) => u.id === unitId);
  const targets = useMemo(() => (unit ? targetsOf(unit) : []), [unit]);
  const quantity = target ? (target.split('|')[1] as LinkQuantity) : null;
  const tag = tags.find((t) => t.name === tagName);

  // Pick the first missing target when the unit changes.
  useEffect(() => {
    if (!unit || fixed?.target) return;
    if (!targets.some((t) => t.value === form.getValues('target'))) form.setValue('target', targets[0]?.value ?? '');
  }, [unitId]); // eslint-disable-line react-hooks/exhaustive-deps
  // Propose the engineering unit from the tag's unit hint.
  useEffect(() => {
    if (!quantity) return;
    const current = form.getValues('unit');
    if (fixed?.unit && current === fixed.unit && canConvert(current, LINK_QUANTITIES[quantity].quantity)) return;
    if (current === '' || !canConvert(current, LINK_QUANTITIES[quantity].quantity) || tag) form.setValue('unit', proposedUnit(tag?.unitHint, quantity));
  }, [quantity, tag?.name]); // eslint-disable-line react-hooks/exhaustive-deps
  // Default uncertainty of the quantity, in the unit chosen (common practice).
  useEffect(() => {
    if (!quantity) return;
    const d = defaultUncertainty(quantity, engUnit);
    form.setValue('uncertaintyMode', d.mode);
    form.setValue('uncertainty', String(d.value));
  }, [quantity, engUnit]); // eslint-disable-line react-hooks/exhaustive-deps

  async function submit(v: Form) {
    const [portId, q] = v.target.split('|') as [string, LinkQuantity];
    let validFrom: string | undefined;
    if (v.validFrom.trim() !== '') {
      const iso = wallTimeToIso(v.validFrom, timeZone);
      if (!iso) {
        form.setError('validFrom', { message: 'A date and time, e.g. 2024-05-01T06:00.' });
        return;
      }
      validFrom = iso;
    }
    const known = tags.find((t) => t.name === v.tag);
    try {
      await call(`/api/sites/${siteId}/links`, 'POST', {
        unitId: v.unitId,
        portId: portId || null,
        quantity: q,
        ...(known ? { tagId: known.id } : { tag: v.tag }),
        unit: v.unit,
        ...(v.basis ? { basis: v.basis } : {}),
        uncertainty: { mode: v.uncertaintyMode, value: Number(v.uncertainty) },
        validMin: v.validMin.trim() === '' ? null : Number(v.validMin),
        validMax: v.validMax.trim() === '' ? null : Number(v.validMax),
        ...(validFrom ? { validFrom } : {}),
      });
      onDone(`Linked ${v.tag} as ${LINK_QUANTITIES[q].label}${portId ? ` at ${unit?.ports.find((p) => p.id === portId)?.name}` : ''} of ${unit?.name}.`);
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  const err = form.formState.errors;
  const p = `link-${fixed?.tag ?? fixed?.target ?? 'new'}`.replace(/[^\w-]/g, '_');
  return (
    <form onSubmit={form.handleSubmit(submit)} className="space-y-3 rounded border border-paper-edge bg-paper/60 p-3" noValidate aria-label="Link a tag">
      <div className="grid gap-3 sm:grid-cols-3">
        {!fixed?.unitId && (
          <Field id={`${p}-unit`} label="Unit" error={err.unitId?.message}>
            <select id={`${p}-unit`} className="field" {...form.register('unitId')}>
              <option value="">Choose…</option>
              {units.map((u) => (
                <option key={u.id} value={u.id}>
                  {u.name}
                </option>
              ))}
            </select>
          </Field>
        )}
        <Field id={`${p}-target`} label="Measures" error={err.target?.message}>
          <select id={`${p}-target`} className="field" {...form.register('target')} disabled={!unit}>
            <option value="">Choose…</option>
            {targets.map((t) => (
              <option key={t.value} value={t.value}>
                {t.label}
                {t.missing ? ' (missing)' : ''}
              </option>
            ))}
          </select>
        </Field>
        <Field id={`${p}-tag`} label="Tag" error={err.tag?.message}>
          <input id={`${p}-tag`} className="field" list={`${p}-tags`} autoComplete="off" {...form.register('tag')} readOnly={!!fixed?.tag} />
          <datalist id={`${p}-tags`}>
            {tags.map((t) => (
              <option key={t.id} value={t.name}>
                {t.unitHint ?? ''}
              </option>
            ))}
          </datalist>
        </Field>
        <Field id={`${p}-eng`} label={`Engineering unit${tag?.unitHint ? ` (export says ${tag.unitHint})` : ''}`} error={err.unit?.message}>
          <input id={`${p}-eng`} className="field" list={`${p}-units`} autoComplete="off" {...form.register('unit')} />
          <datalist id={`${p}-units`}>{quantity && unitsFor(LINK_QUANTITIES[quantity].quantity).map((u) => <option key={u} value={u} />)}</datalist>
        </Field>
        {quantity === 'o2Fraction' && (
          <Field id={`${p}-basis`} label="O2 basis" error={err.basis?.message}>
            <select id={`${p}-basis`} className="field" {...form.register('basis')}>
              <option value="">Choose…</option>
              <option value="dry">dry (extractive)</option>
              <option value="wet">wet (in situ)</option>
            </select>
          </Field>
        )}
        <Field id={`${p}-u`} label="Standard uncertainty" error={err.uncertainty?.message}>
          <div className="flex gap-1">
            <input id={`${p}-u`} className="field" inputMode="decimal" {...form.register('uncertainty')} />
            <select aria-label="Uncertainty given as" className="field w-36" {...form.register('uncertaintyMode')}>
              <option value="relative">% of reading</option>
              <option value="absolute">{engUnit || 'in the unit'}</option>
            </select>
          </div>
        </Field>
        <Field id={`${p}-min`} label={`Valid range from [${engUnit}]`} error={err.validMin?.message}>
          <input id={`${p}-min`} className="field" inputMode="decimal" {...form.register('validMin')} />
        </Field>
        <Field id={`${p}-max`} label={`to [${engUnit}]`} error={err.validMax?.message}>
          <input id={`${p}-max`} className="field" inputMode="decimal" {...form.register('validMax')} />
        </Field>
        <Field id={`${p}-from`} label={`Valid from (${timeZone})`} error={err.validFrom?.message}>
          <input
            id={`${p}-from`}
            className="field"
            type="datetime-local"
            placeholder={changing ? 'now' : 'from the start'}
            {...form.register('validFrom')}
          />
          <p className="mt-1 text-xs text-ink-faint">{changing ? 'Empty: from now. Older hours keep the current link.' : 'Empty: from the start.'}</p>
        </Field>
      </div>
      <Notice message={message} />
      <div className="flex gap-2">
        <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
          {changing ? 'Save as a new version' : 'Link tag'}
        </button>
        {onCancel && (
          <button className="btn" type="button" onClick={onCancel}>
            Cancel
          </button>
        )}
      </div>
    </form>
  );
}
