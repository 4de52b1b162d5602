import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FUEL_TYPES, type FuelDefinition } from '~/lib/plant/model';
import { call, messageOf, type Message } from '~/components/api';
import { Field, parseComposition, showComposition } from '../common';
import { FORM_GRID, type UnitPageData } from './types';

const FuelForm = z.object({
  by: z.enum(['composition', 'heating-value']),
  composition: z.string(),
  fuelType: z.enum(FUEL_TYPES),
  lhv: z.string(),
  price: z.string(),
});
type FuelForm = z.infer<typeof FuelForm>;

function defaults(fuel: FuelDefinition | undefined): FuelForm {
  return {
    by: fuel?.by === 'heating-value' ? 'heating-value' : 'composition',
    composition: fuel?.by === 'composition' ? showComposition(fuel.moleFractions) : '',
    fuelType: fuel?.by === 'heating-value' ? fuel.fuelType : 'natural-gas',
    lhv: fuel && 'LHV_J_per_kg' in fuel ? String(fuel.LHV_J_per_kg / 1e6) : '',
    price: fuel?.price ?? '',
  };
}

/** The fuel of a boiler: a gas composition, or a fuel type with its lower heating value; and its price. */
export default function FuelEditor({ data, canEdit, onSaved }: { data: UnitPageData; canEdit: boolean; onSaved: (m: Message) => void }) {
  const form = useForm<FuelForm>({ resolver: zodResolver(FuelForm), defaultValues: defaults(data.unit.fuel as FuelDefinition | undefined) });
  const by = form.watch('by');
  async function save(v: FuelForm) {
    let def: FuelDefinition;
    if (v.by === 'composition') {
      const c = parseComposition(v.composition);
      if (!c) return form.setError('composition', { message: 'Write species=fraction pairs, e.g. CH4=0.93, C2H6=0.04, N2=0.03.' });
      def = { by: 'composition', moleFractions: c, ...(v.price ? { price: v.price } : {}) };
    } else {
      const lhv = Number(v.lhv);
      if (!(lhv > 0)) return form.setError('lhv', { message: 'LHV in MJ/kg, greater than 0.' });
      def = { by: 'heating-value', fuelType: v.fuelType, LHV_J_per_kg: lhv * 1e6, ...(v.price ? { price: v.price } : {}) };
    }
    try {
      await call(`/api/sites/${data.site.id}/units/${data.unit.id}`, 'PATCH', { fuel: def });
      onSaved({ ok: true, text: 'Fuel saved.' });
    } catch (e) {
      onSaved(messageOf(e));
    }
  }
  const err = form.formState.errors;
  return (
    <form onSubmit={form.handleSubmit(save)} noValidate aria-label="Fuel" className="space-y-3">
      <fieldset disabled={!canEdit} className={FORM_GRID}>
        <Field id="fuel-by" label="Fuel given by">
          <select id="fuel-by" className="field" {...form.register('by')}>
            <option value="composition">gas composition (mole fractions)</option>
            <option value="heating-value">type and lower heating value</option>
          </select>
        </Field>
        {by === 'composition' ? (
          <div className="sm:col-span-2">
            <Field id="fuel-comp" label="Mole fractions" error={err.composition?.message}>
              <input id="fuel-comp" className="field" placeholder="CH4=0.93, C2H6=0.04, N2=0.03" readOnly={!canEdit} {...form.register('composition')} />
            </Field>
          </div>
        ) : (
          <>
            <Field id="fuel-type" label="Fuel type">
              <select id="fuel-type" className="field" {...form.register('fuelType')}>
                {FUEL_TYPES.map((t) => (
                  <option key={t}>{t}</option>
                ))}
              </select>
            </Field>
            <Field id="fuel-lhv" label="LHV [MJ/kg]" error={err.lhv?.message}>
              <input id="fuel-lhv" className="field" inputMode="decimal" readOnly={!canEdit} {...form.register('lhv')} />
            </Field>
          </>
        )}
        <Field id="fuel-price" label="Priced as">
          <select id="fuel-price" className="field" {...form.register('price')}>
            <option value="">(no price)</option>
            {data.prices.map((p) => (
              <option key={p}>{p}</option>
            ))}
          </select>
        </Field>
      </fieldset>
      {canEdit && (
        <button className="btn btn-primary" type="submit">
          Save fuel
        </button>
      )}
    </form>
  );
}
