import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { z } from 'zod';
import { FLUID_LABELS } from '~/lib/kinds';
import { kindSpec, type KindSpec } from '~/lib/plant/kinds';
import { PortInput } from '~/lib/plant/inputs';
import { call, messageOf, type Message } from '~/components/api';
import { Field, Notice, readSI } from '../common';
import { fluidOf } from './fluids';
import { slotCountWords } from './slot-words';
import { FORM_GRID, type UnitPageData } from './types';

const PortForm = z.object({
  name: PortInput.shape.name,
  slot: z.string().min(1, 'Choose a slot.').pipe(PortInput.shape.slot),
  fluid: z.string(),
  composition: z.string(),
  cp: z.string(),
  rho: z.string(),
  fuelFrom: z.string(),
  boundaryT: z.string(),
});
type PortForm = z.infer<typeof PortForm>;
type Slot = KindSpec['ports'][number];

/** The fields after the slot: the fluid of a matter port (and what it needs), or a heat port's boundary. */
function StreamFields({ form, slot, data }: { form: UseFormReturn<PortForm>; slot: Slot | undefined; data: UnitPageData }) {
  const fluid = form.watch('fluid');
  const err = form.formState.errors;
  if (slot?.stream === 'heat') {
    return (
      <Field id="port-tb" label="Boundary temperature [°C] (or link a tag)">
        <input id="port-tb" className="field" inputMode="decimal" {...form.register('boundaryT')} />
      </Field>
    );
  }
  if (slot?.stream !== 'matter') return null;
  return (
    <>
      <Field id="port-fluid" label="Fluid" error={err.fluid?.message}>
        <select id="port-fluid" className="field" {...form.register('fluid')}>
          {slot.fluids.map((f) => (
            <option key={f} value={f}>
              {FLUID_LABELS[f]}
            </option>
          ))}
        </select>
      </Field>
      {(fluid === 'fuel-gas' || fluid === 'gas-mixture') && (
        <div className="sm:col-span-2">
          <Field id="port-comp" label="Mole fractions">
            <input id="port-comp" className="field" placeholder="CH4=0.9, N2=0.1" {...form.register('composition')} />
          </Field>
        </div>
      )}
      {fluid === 'liquid' && (
        <>
          <Field id="port-cp" label="cp [kJ/(kg K)]">
            <input id="port-cp" className="field" inputMode="decimal" {...form.register('cp')} />
          </Field>
          <Field id="port-rho" label="Density [kg/m3]">
            <input id="port-rho" className="field" inputMode="decimal" {...form.register('rho')} />
          </Field>
        </>
      )}
      {fluid === 'flue-gas' && data.unit.kind !== 'boiler' && (
        <Field id="port-fuelfrom" label="Flue gas of boiler">
          <select id="port-fuelfrom" className="field" {...form.register('fuelFrom')}>
            <option value="">Choose…</option>
            {data.boilers.map((b) => (
              <option key={b}>{b}</option>
            ))}
          </select>
        </Field>
      )}
    </>
  );
}

/** A new port of the unit: its name, slot and fluid (or heat boundary). */
export default function AddPortForm({ data, onDone }: { data: UnitPageData; onDone: (m: Message) => void }) {
  const spec = kindSpec(data.unit.kind);
  const form = useForm<PortForm>({
    resolver: zodResolver(PortForm),
    defaultValues: { name: '', slot: spec.ports[0]?.slot ?? '', fluid: spec.ports[0]?.fluids[0] ?? '', composition: '', cp: '', rho: '', fuelFrom: '', boundaryT: '' },
  });
  const slot = spec.ports.find((s) => s.slot === form.watch('slot'));
  const [message, setMessage] = useState<Message>(null);
  async function add(v: PortForm) {
    const f = fluidOf(v);
    if (typeof f === 'string') return form.setError('fluid', { message: f });
    const boundary = v.boundaryT.trim() === '' ? null : readSI(v.boundaryT, 'degC', 'temperature');
    try {
      await call(`/api/sites/${data.site.id}/units/${data.unit.id}/ports`, 'POST', {
        name: v.name,
        slot: v.slot,
        ...(slot?.stream === 'matter' ? { fluid: f } : {}),
        ...(slot?.stream === 'heat' && boundary !== null ? { boundaryT_K: boundary } : {}),
      });
      form.reset({ ...form.getValues(), name: '' });
      onDone({ ok: true, text: `Port ${v.name} added.` });
    } catch (e) {
      setMessage(messageOf(e));
    }
  }
  const onSlot = (e: { target: { value: string } }) => form.setValue('fluid', spec.ports.find((s) => s.slot === e.target.value)?.fluids[0] ?? '');
  return (
    <form onSubmit={form.handleSubmit(add)} noValidate aria-label="Add a port" className="mt-3 space-y-2 border-t border-paper-edge pt-3">
      <div className={FORM_GRID}>
        <Field id="port-name" label="Port name" error={form.formState.errors.name?.message}>
          <input id="port-name" className="field" {...form.register('name')} />
        </Field>
        <Field id="port-slot" label="Slot" error={form.formState.errors.slot?.message}>
          <select id="port-slot" className="field" {...form.register('slot', { onChange: onSlot })}>
            {spec.ports.map((s) => (
              <option key={s.slot} value={s.slot}>
                {s.label} ({s.role === 'in' ? 'into the unit' : 'out of the unit'}, {slotCountWords(s.min, s.max)})
              </option>
            ))}
          </select>
        </Field>
        <StreamFields form={form} slot={slot} data={data} />
      </div>
      <Notice message={message} />
      <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
        Add port
      </button>
    </form>
  );
}
