import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { LINK_QUANTITIES, type LinkQuantity } from '~/lib/plant/kinds';
import { LinkFormSchema, linkRequestBody, linkedText, proposedUnit, targetQuantity, targetsOf, type LinkFormValues, type Target } from '~/lib/plant/link-form';
import { defaultUncertainty } from '~/lib/plant/uncertainty';
import { canConvert } from '~/lib/units';
import { Notice, wallTimeToIso } from './common';
import { call, messageOf, type Message } from '~/components/api';
import { TrustFields, WhatFields } from './LinkFormFields';

export type { TagJson, UnitJson } from './link-json';
import type { TagJson, UnitJson } from './link-json';

export { proposedUnit, targetsOf, type Target } from '~/lib/plant/link-form';

type Form = LinkFormValues;
type Fixed = { unitId?: string; target?: string; tag?: string; unit?: string };

/**
 * Keeps the form's proposals in step: the first missing target when the unit changes, the engineering
 * unit from the tag's unit hint, and the quantity's default uncertainty in the unit chosen (common practice).
 */
function useLinkProposals(form: UseFormReturn<Form>, unit: UnitJson | undefined, targets: Target[], quantity: LinkQuantity | null, tag: TagJson | undefined, fixed: Fixed | undefined) {
  const unitId = form.watch('unitId');
  const engUnit = form.watch('unit');
  useEffect(() => {
    if (!unit || fixed?.target) return;
    if (!targets.some((t) => t.value === form.getValues('target'))) form.setValue('target', targets[0]?.value ?? '');
  }, [unitId]); // eslint-disable-line react-hooks/exhaustive-deps
  useEffect(() => {
    if (!quantity) return;
    const current = form.getValues('unit');
    if (fixed?.unit && current === fixed.unit && canConvert(current, LINK_QUANTITIES[quantity].quantity)) return;
    if (current === '' || !canConvert(current, LINK_QUANTITIES[quantity].quantity) || tag) form.setValue('unit', proposedUnit(tag?.unitHint, quantity));
  }, [quantity, tag?.name]); // eslint-disable-line react-hooks/exhaustive-deps
  useEffect(() => {
    if (!quantity) return;
    const d = defaultUncertainty(quantity, engUnit);
    form.setValue('uncertaintyMode', d.mode);
    form.setValue('uncertainty', String(d.value));
  }, [quantity, engUnit]); // eslint-disable-line react-hooks/exhaustive-deps
}

const emptyForm = (fixed: Fixed | undefined, firstUnit: string): Form => ({
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
});

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
  fixed?: Fixed;
  /** True when this replaces a current link: valid-from then defaults to now, not the start. */
  changing?: boolean;
  onDone: (text: string) => void;
  onCancel?: () => void;
}) {
  const [message, setMessage] = useState<Message>(null);
  const firstUnit = fixed?.unitId ?? (units.length === 1 ? units[0]!.id : '');
  const form = useForm<Form>({ resolver: zodResolver(LinkFormSchema), defaultValues: emptyForm(fixed, firstUnit) });
  const unitId = form.watch('unitId');
  const target = form.watch('target');
  const tagName = form.watch('tag');
  const engUnit = form.watch('unit');
  const unit = units.find((u) => u.id === unitId);
  const targets = useMemo(() => (unit ? targetsOf(unit) : []), [unit]);
  const quantity = targetQuantity(target);
  const tag = tags.find((t) => t.name === tagName);
  useLinkProposals(form, unit, targets, quantity, tag, fixed);

  async function submit(v: Form) {
    let validFrom: string | undefined;
    if (v.validFrom.trim() !== '') {
      const iso = wallTimeToIso(v.validFrom, timeZone);
      if (!iso) {
        form.setError('validFrom', { message: 'A date and time, e.g. 2024-05-01T06:00.' });
        return;
      }
      validFrom = iso;
    }
    try {
      await call(`/api/sites/${siteId}/links`, 'POST', linkRequestBody(v, tags.find((t) => t.name === v.tag)?.id, validFrom));
      onDone(linkedText(v, unit));
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  const p = `link-${fixed?.tag ?? fixed?.target ?? 'new'}`.replace(/[^\w-]/g, '_');
  return (
    <form onSubmit={form.handleSubmit(submit)} className="space-y-3 rounded border border-paper-edge bg-paper/60 p-3" noValidate aria-label="Link a tag">
      <div className="grid gap-3 sm:grid-cols-3">
        <WhatFields form={form} p={p} units={units} tags={tags} fixed={fixed} unit={unit} targets={targets} quantity={quantity} tag={tag} />
        <TrustFields form={form} p={p} engUnit={engUnit} timeZone={timeZone} changing={changing} />
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
