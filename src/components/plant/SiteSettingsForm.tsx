import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useFieldArray, useForm, type UseFormReturn } from 'react-hook-form';
import { SiteSettingsFormSchema, siteSettingsPatch, siteSettingsValues, type SiteSettingsFormValues as Settings } from '~/lib/plant/site-settings-form';
import { FormInput } from '~/components/ui/Field';
import { call, messageOf, type Message } from '~/components/api';
import { DisplayUnitsFields } from './DisplayUnitsFields';
import type { Overview } from './site-overview';

/** The site's name, clock, atmosphere, dead state and currency. */
function SettingsFields({ form, canEdit, elevationOnly, setElevationOnly }: { form: UseFormReturn<Settings>; canEdit: boolean; elevationOnly: boolean; setElevationOnly: (on: boolean) => void }) {
  return (
    <fieldset disabled={!canEdit} className="grid gap-3 sm:grid-cols-4">
      <FormInput form={form} name="name" id="s-name" label="Name" />
      <FormInput form={form} name="timeZone" id="s-tz" label="Time zone (IANA)" />
      <FormInput form={form} name="elevation" id="s-elev" label="Elevation [m]" inputMode="decimal" />
      <FormInput form={form} name="pAtm" id="s-patm" label="Atmospheric pressure [kPa]" inputMode="decimal" disabled={elevationOnly}>
        {canEdit && (
          <label className="mt-1 flex items-center gap-1 text-xs text-ink-soft">
            <input type="checkbox" checked={elevationOnly} onChange={(e) => setElevationOnly(e.target.checked)} /> from the elevation (standard atmosphere)
          </label>
        )}
      </FormInput>
      <FormInput form={form} name="T0" id="s-t0" label="Dead state T0 [°C] (fallback when a tag is set)" inputMode="decimal" />
      <FormInput form={form} name="p0" id="s-p0" label="Dead state p0 [kPa]" inputMode="decimal" />
      <FormInput form={form} name="t0Tag" id="s-t0tag" label="T0 from ambient tag (optional)" />
      <FormInput form={form} name="t0TagUnit" id="s-t0unit" label="Its unit" />
      <FormInput form={form} name="currency" id="s-cur" label="Currency" />
    </fieldset>
  );
}

/** The energy prices: one row each, added and removed by admins. */
function PricesFields({ form, canEdit }: { form: UseFormReturn<Settings>; canEdit: boolean }) {
  const prices = useFieldArray({ control: form.control, name: 'prices' });
  const err = form.formState.errors;
  return (
    <div>
      <h3 className="mb-1 text-sm font-semibold">Energy prices (fuels per MWh LHV; electricity per MWh)</h3>
      {prices.fields.length === 0 && <p className="text-xs text-ink-faint">No price yet: destruction is then not costed.</p>}
      <fieldset disabled={!canEdit} className="space-y-2">
        {prices.fields.map((f, i) => (
          <div key={f.id} className="grid gap-2 sm:grid-cols-5">
            <input aria-label={`Price ${i + 1} name`} className="field" placeholder="name" {...form.register(`prices.${i}.name`)} />
            <select aria-label={`Price ${i + 1} kind`} className="field" {...form.register(`prices.${i}.kind`)}>
              <option value="fuel">fuel</option>
              <option value="electricity">electricity</option>
            </select>
            <input aria-label={`Price ${i + 1} per MWh`} className="field" inputMode="decimal" {...form.register(`prices.${i}.price`)} />
            <input aria-label={`Price ${i + 1} currency`} className="field" {...form.register(`prices.${i}.currency`)} />
            {canEdit && (
              <button type="button" className="btn" onClick={() => prices.remove(i)}>
                Remove
              </button>
            )}
            {err.prices?.[i] && <p className="text-xs text-alert sm:col-span-5">{Object.values(err.prices[i]!).map((e) => (e as { message?: string })?.message).join(' ')}</p>}
          </div>
        ))}
      </fieldset>
      {canEdit && (
        <button type="button" className="btn mt-2" onClick={() => prices.append({ name: '', kind: 'fuel', price: '', currency: form.getValues('currency') })}>
          Add a price
        </button>
      )}
    </div>
  );
}

/** The site settings form (admins edit, everyone reads); `onSaved` gets the outcome's message. */
export default function SiteSettingsForm({ overview, canEdit, onSaved }: { overview: Overview; canEdit: boolean; onSaved: (m: Message) => void }) {
  const form = useForm<Settings>({ resolver: zodResolver(SiteSettingsFormSchema), defaultValues: siteSettingsValues(overview.settings, overview.display.units) });
  const [elevationOnly, setElevationOnly] = useState(false);

  async function save(v: Settings) {
    try {
      await call(`/api/sites/${overview.site.id}`, 'PATCH', siteSettingsPatch(v, elevationOnly));
      onSaved({ ok: true, text: 'Site saved.' });
    } catch (e) {
      onSaved(messageOf(e));
    }
  }

  return (
    <form onSubmit={form.handleSubmit(save)} noValidate className="space-y-3" aria-label="Site settings">
      <SettingsFields form={form} canEdit={canEdit} elevationOnly={elevationOnly} setElevationOnly={setElevationOnly} />
      <fieldset disabled={!canEdit}>
        <DisplayUnitsFields register={form.register} chosen={overview.display.chosen} />
      </fieldset>
      <PricesFields form={form} canEdit={canEdit} />
      {canEdit && (
        <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
          Save site
        </button>
      )}
    </form>
  );
}
