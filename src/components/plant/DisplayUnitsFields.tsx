import type { UseFormRegister } from 'react-hook-form';
import { Field, Options } from '~/components/ui/Field';
import { DISPLAY_CHOICES, shownUnit, type DisplayUnits } from '~/lib/units/display';

/** The display-unit fields of the site settings form (values are the registry's unit names). */
export interface DisplayFields {
  duPower: DisplayUnits['power'];
  duMassFlow: DisplayUnits['massFlow'];
  duTemperature: DisplayUnits['temperature'];
  duPressure: DisplayUnits['pressure'];
  duLocale: string;
}

const LOCALES = [
  ['en-GB', '1,234.5 (en-GB)'],
  ['en-US', '1,234.5 (en-US)'],
  ['de-DE', '1.234,5 (de-DE)'],
  ['fr-FR', '1 234,5 (fr-FR)'],
  ['nl-NL', '1.234,5 (nl-NL)'],
  ['sv-SE', '1 234,5 (sv-SE)'],
] as const;

export const displayFieldValues = (u: DisplayUnits): DisplayFields => ({ duPower: u.power, duMassFlow: u.massFlow, duTemperature: u.temperature, duPressure: u.pressure, duLocale: u.locale });
export const displayUnitsOf = (v: DisplayFields): DisplayUnits => ({ power: v.duPower, massFlow: v.duMassFlow, temperature: v.duTemperature, pressure: v.duPressure, locale: v.duLocale });

/** Selects for the units the site's pages, mails and reports show numbers in. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function DisplayUnitsFields({ register, chosen }: { register: UseFormRegister<any>; chosen: boolean }) {
  const pick = (id: string, label: string, name: keyof DisplayFields, choices: readonly string[]) => (
    <Field id={id} label={label}>
      <select id={id} className="field" {...register(name)}>
        <Options choices={choices.map((c) => [c, shownUnit(c)] as const)} />
      </select>
    </Field>
  );
  return (
    <fieldset className="grid gap-3 sm:grid-cols-5" aria-describedby="du-note">
      <legend className="mb-1 text-sm font-semibold">Units on pages, mails and reports</legend>
      {pick('du-power', 'Power', 'duPower', DISPLAY_CHOICES.power)}
      {pick('du-mass', 'Mass flow', 'duMassFlow', DISPLAY_CHOICES.massFlow)}
      {pick('du-temp', 'Temperature', 'duTemperature', DISPLAY_CHOICES.temperature)}
      {pick('du-press', 'Pressure', 'duPressure', DISPLAY_CHOICES.pressure)}
      <Field id="du-locale" label="Numbers written as">
        <select id="du-locale" className="field" {...register('duLocale')}>
          <Options choices={LOCALES} />
        </select>
      </Field>
      <p id="du-note" className="text-xs text-ink-soft sm:col-span-5">
        {chosen ? 'Chosen for this site.' : 'Taken from the units of the linked tags until you save a choice.'} Values are stored in SI whatever is chosen here.
      </p>
    </fieldset>
  );
}
