import { useForm } from 'react-hook-form';
import { kindSpec, type ParamSpec } from '~/lib/plant/kinds';
import { shownUnit, type DisplayUnits } from '~/lib/units/display';
import { call, messageOf, type Message } from '~/components/api';
import { Field, readSI, showSI } from '../common';
import { FORM_GRID, type UnitPageData } from './types';

/** The unit a parameter is typed in: the site's display unit for power, mass flow and temperature, else the catalogue's. */
function paramUnit(spec: ParamSpec, display?: DisplayUnits): string {
  if (spec.type !== 'number') return '';
  if (display && (spec.quantity === 'power' || spec.quantity === 'massFlow' || spec.quantity === 'temperature')) return display[spec.quantity];
  return spec.displayUnit;
}

function paramText(spec: ParamSpec, value: number | string | undefined, display?: DisplayUnits): string {
  if (value === undefined) return '';
  return spec.type === 'number' ? showSI(value as number, paramUnit(spec, display), spec.quantity) : String(value);
}

function paramLabel(s: ParamSpec, display?: DisplayUnits): string {
  return `${s.label}${s.type === 'number' ? ` [${shownUnit(paramUnit(s, display))}]` : ''}${s.type === 'number' && s.required ? ' *' : ''}`;
}

/** The unit's parameters in their display units; read-only for those who may not edit. */
export default function ParametersForm({ data, canEdit, onSaved }: { data: UnitPageData; canEdit: boolean; onSaved: (m: Message) => void }) {
  const specs = kindSpec(data.unit.kind).params;
  const form = useForm<Record<string, string>>({
    defaultValues: Object.fromEntries(specs.map((s) => [s.key, paramText(s, data.unit.parameters[s.key], data.display)])),
  });
  async function save(v: Record<string, string>) {
    const parameters: Record<string, number | string | null> = {};
    for (const s of specs) {
      const text = (v[s.key] ?? '').trim();
      if (s.type === 'choice') parameters[s.key] = text;
      else {
        const si = readSI(text, paramUnit(s, data.display), s.quantity);
        if (si !== null && Number.isNaN(si)) {
          form.setError(s.key, { message: 'A number.' });
          return;
        }
        parameters[s.key] = si;
      }
    }
    try {
      await call(`/api/sites/${data.site.id}/units/${data.unit.id}`, 'PATCH', { parameters });
      onSaved({ ok: true, text: 'Parameters saved.' });
    } catch (e) {
      onSaved(messageOf(e));
    }
  }
  return (
    <form onSubmit={form.handleSubmit(save)} noValidate aria-label="Parameters" className="space-y-3">
      <fieldset disabled={!canEdit} className={FORM_GRID}>
        {specs.map((s) => (
          <Field key={s.key} id={`param-${s.key}`} label={paramLabel(s, data.display)} error={form.formState.errors[s.key]?.message}>
            {s.type === 'choice' ? (
              <select id={`param-${s.key}`} className="field" {...form.register(s.key)}>
                {s.choices.map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </select>
            ) : (
              <input id={`param-${s.key}`} className="field" inputMode="decimal" readOnly={!canEdit} {...form.register(s.key)} />
            )}
            {(s.note || s.source) && (
              <p className="mt-1 text-xs text-ink-faint">
                {s.note}
                {s.note && s.source ? '; ' : ''}
                {s.source ? `default: ${s.source}` : ''}
              </p>
            )}
          </Field>
        ))}
      </fieldset>
      {canEdit && (
        <button className="btn btn-primary" type="submit">
          Save parameters
        </button>
      )}
    </form>
  );
}
