import type { UseFormReturn } from 'react-hook-form';
import { LINK_QUANTITIES, type LinkQuantity } from '~/lib/plant/kinds';
import type { LinkFormValues, Target } from '~/lib/plant/link-form';
import { unitsFor } from '~/lib/units';
import { Field, Options } from '~/components/ui/Field';
import type { TagJson, UnitJson } from './link-json';

export interface LinkFieldsProps {
  form: UseFormReturn<LinkFormValues>;
  /** Prefix of the field ids (one form per tag or target on a page). */
  p: string;
  units: UnitJson[];
  tags: TagJson[];
  fixed?: { unitId?: string; target?: string; tag?: string; unit?: string };
  unit: UnitJson | undefined;
  targets: Target[];
  quantity: LinkQuantity | null;
  tag: TagJson | undefined;
}

/** The unit, what the tag measures, the tag and its engineering unit (and the O2 basis when it is an O2 reading). */
export function WhatFields({ form, p, units, tags, fixed, unit, targets, quantity, tag }: LinkFieldsProps) {
  const err = form.formState.errors;
  return (
    <>
      {!fixed?.unitId && (
        <Field id={`${p}-unit`} label="Unit" error={err.unitId?.message}>
          <select id={`${p}-unit`} className="field" {...form.register('unitId')}>
            <option value="">Choose…</option>
            <Options choices={units.map((u) => [u.id, u.name] as const)} />
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
    </>
  );
}

/** The standard uncertainty, the valid range in the engineering unit, and the valid-from time in the site's clock. */
export function TrustFields({ form, p, engUnit, timeZone, changing }: { form: UseFormReturn<LinkFormValues>; p: string; engUnit: string; timeZone: string; changing?: boolean }) {
  const err = form.formState.errors;
  return (
    <>
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
    </>
  );
}
