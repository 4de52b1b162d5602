import { zodResolver } from '@hookform/resolvers/zod';
import { useCallback, useEffect, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { z } from 'zod';
import { UNIT_KINDS } from '~/lib/kinds';
import { kindSpec } from '~/lib/plant/kinds';
import { Currency, SiteInput, UnitCreateInput } from '~/lib/plant/inputs';
import { type EnergyPrice, type SiteModel } from '~/lib/plant/model';
import { canConvert } from '~/lib/units';
import { Field, Notice, readSI, showSI } from './common';
import { call, messageOf, type Message } from '~/components/api';
import LinkForm, { type TagJson, type UnitJson } from './LinkForm';
import { DisplayUnitsFields, displayFieldValues, displayUnitsOf } from './DisplayUnitsFields';
import { DISPLAY_CHOICES, DisplayUnitsSchema, type DisplayUnits } from '~/lib/units/display';
import { counted } from '~/lib/counts';

interface Overview {
  site: { id: string; name: string; timeZone: string };
  settings: SiteModel;
  display: { units: DisplayUnits; chosen: boolean };
  units: UnitJson[];
}

const num = (what: string, min: number, max: number) =>
  z.string().refine((v) => v.trim() !== '' && Number.isFinite(Number(v)) && Number(v) >= min && Number(v) <= max, `${what}: a number from ${min} to ${max}.`);
const optNum = (what: string, min: number, max: number) =>
  z.string().refine((v) => v.trim() === '' || (Number.isFinite(Number(v)) && Number(v) >= min && Number(v) <= max), `${what}: a number from ${min} to ${max}, or empty.`);

const Settings = z
  .object({
    name: SiteInput.shape.name,
    timeZone: SiteInput.shape.timeZone,
    elevation: optNum('Elevation [m]', -500, 6000),
    pAtm: optNum('Atmospheric pressure [kPa]', 20, 120),
    T0: num('T0 [degC]', -50, 60),
    p0: num('p0 [kPa]', 20, 120),
    t0Tag: z.string().trim(),
    t0TagUnit: z.string().trim(),
    currency: Currency,
    duPower: z.enum(DISPLAY_CHOICES.power),
    duMassFlow: z.enum(DISPLAY_CHOICES.massFlow),
    duTemperature: z.enum(DISPLAY_CHOICES.temperature),
    duPressure: z.enum(DISPLAY_CHOICES.pressure),
    duLocale: DisplayUnitsSchema.shape.locale,
    prices: z.array(
      z.object({
        name: z.string().trim().min(1, 'Name the price.'),
        kind: z.enum(['fuel', 'electricity']),
        price: num('Price per MWh', 0, 1e6),
        currency: z.string().trim().regex(/^[A-Z]{3}$/, 'Three capital letters.'),
      }),
    ),
  })
  .refine((v) => v.t0Tag === '' || canConvert(v.t0TagUnit, 'temperature'), { path: ['t0TagUnit'], message: 'A temperature unit (degC, K, degF).' });
type Settings = z.infer<typeof Settings>;

function settingsValues(s: SiteModel, display: Overview['display']): Settings {
  return {
    ...displayFieldValues(display.units),
    name: s.name,
    timeZone: s.timeZone,
    elevation: s.elevation_m === undefined ? '' : String(s.elevation_m),
    pAtm: showSI(s.p_atm_Pa, 'kPa', 'pressure'),
    T0: showSI(s.deadState.T0_K, 'degC', 'temperature'),
    p0: showSI(s.deadState.p0_Pa, 'kPa', 'pressure'),
    t0Tag: s.deadState.T0Tag?.tag ?? '',
    t0TagUnit: s.deadState.T0Tag?.unit ?? 'degC',
    currency: s.currency,
    prices: s.prices.map((p) => ({ name: p.name, kind: p.kind, price: String(p.price_per_MWh), currency: p.currency })),
  };
}

function SettingsForm({ overview, canEdit, onSaved }: { overview: Overview; canEdit: boolean; onSaved: (m: Message) => void }) {
  const form = useForm<Settings>({ resolver: zodResolver(Settings), defaultValues: settingsValues(overview.settings, overview.display) });
  const prices = useFieldArray({ control: form.control, name: 'prices' });
  const err = form.formState.errors;
  const [elevationOnly, setElevationOnly] = useState(false);

  async function save(v: Settings) {
    try {
      await call(`/api/sites/${overview.site.id}`, 'PATCH', {
        name: v.name,
        timeZone: v.timeZone,
        elevation_m: v.elevation.trim() === '' ? null : Number(v.elevation),
        p_atm_Pa: elevationOnly || v.pAtm.trim() === '' ? null : readSI(v.pAtm, 'kPa', 'pressure'),
        T0_K: readSI(v.T0, 'degC', 'temperature'),
        p0_Pa: readSI(v.p0, 'kPa', 'pressure'),
        T0Tag: v.t0Tag === '' ? null : { tag: v.t0Tag, unit: v.t0TagUnit },
        currency: v.currency,
        prices: v.prices.map((p): EnergyPrice => ({ name: p.name, kind: p.kind, price_per_MWh: Number(p.price), currency: p.currency })),
        displayUnits: displayUnitsOf(v),
      });
      onSaved({ ok: true, text: 'Site saved.' });
    } catch (e) {
      onSaved(messageOf(e));
    }
  }

  return (
    <form onSubmit={form.handleSubmit(save)} noValidate className="space-y-3" aria-label="Site settings">
      <fieldset disabled={!canEdit} className="grid gap-3 sm:grid-cols-4">
        <Field id="s-name" label="Name" error={err.name?.message}>
          <input id="s-name" className="field" {...form.register('name')} />
        </Field>
        <Field id="s-tz" label="Time zone (IANA)" error={err.timeZone?.message}>
          <input id="s-tz" className="field" {...form.register('timeZone')} />
        </Field>
        <Field id="s-elev" label="Elevation [m]" error={err.elevation?.message}>
          <input id="s-elev" className="field" inputMode="decimal" {...form.register('elevation')} />
        </Field>
        <Field id="s-patm" label="Atmospheric pressure [kPa]" error={err.pAtm?.message}>
          <input id="s-patm" className="field" inputMode="decimal" {...form.register('pAtm')} disabled={elevationOnly} />
          {canEdit && (
            <label className="mt-1 flex items-center gap-1 text-xs text-ink-soft">
              <input type="checkbox" checked={elevationOnly} onChange={(e) => setElevationOnly(e.target.checked)} /> from the elevation (standard atmosphere)
            </label>
          )}
        </Field>
        <Field id="s-t0" label="Dead state T0 [°C] (fallback when a tag is set)" error={err.T0?.message}>
          <input id="s-t0" className="field" inputMode="decimal" {...form.register('T0')} />
        </Field>
        <Field id="s-p0" label="Dead state p0 [kPa]" error={err.p0?.message}>
          <input id="s-p0" className="field" inputMode="decimal" {...form.register('p0')} />
        </Field>
        <Field id="s-t0tag" label="T0 from ambient tag (optional)" error={err.t0Tag?.message}>
          <input id="s-t0tag" className="field" {...form.register('t0Tag')} />
        </Field>
        <Field id="s-t0unit" label="Its unit" error={err.t0TagUnit?.message}>
          <input id="s-t0unit" className="field" {...form.register('t0TagUnit')} />
        </Field>
        <Field id="s-cur" label="Currency" error={err.currency?.message}>
          <input id="s-cur" className="field" {...form.register('currency')} />
        </Field>
      </fieldset>
      <fieldset disabled={!canEdit}>
        <DisplayUnitsFields register={form.register} chosen={overview.display.chosen} />
      </fieldset>
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
      {canEdit && (
        <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
          Save site
        </button>
      )}
    </form>
  );
}

const NewUnit = UnitCreateInput.pick({ name: true, kind: true }).extend({ withPorts: z.boolean() });
type NewUnit = z.infer<typeof NewUnit>;

function StatusCell({ unit }: { unit: UnitJson }) {
  const { complete, missing, conflicts } = unit.status;
  if (complete) return <span className="font-medium text-teal-deep">✓ complete</span>;
  return (
    <span className="text-copper-deep">
      {missing.length > 0 && <span>◇ {missing.length} missing</span>}
      {missing.length > 0 && conflicts.length > 0 && ' · '}
      {conflicts.length > 0 && <span>▲ {counted(conflicts.length, 'conflict', 'conflicts')}</span>}
    </span>
  );
}

/** A site: its settings, units with what each lacks, unlinked tags, and the model file. */
export default function SitePanel({ initial, canEdit }: { initial: Overview; canEdit: boolean }) {
  const siteId = initial.site.id;
  const [overview, setOverview] = useState<Overview>(initial);
  const [message, setMessage] = useState<Message>(null);
  const [search, setSearch] = useState('');
  const [unlinked, setUnlinked] = useState<TagJson[] | null>(null);
  const [allTags, setAllTags] = useState<TagJson[]>([]);
  const [linking, setLinking] = useState<string | null>(null);
  const unitForm = useForm<NewUnit>({ resolver: zodResolver(NewUnit), defaultValues: { name: '', kind: 'let-down-valve', withPorts: true } });

  const reload = useCallback(async () => {
    setOverview(await call<Overview>(`/api/sites/${siteId}`));
  }, [siteId]);
  const loadTags = useCallback(async () => {
    const q = encodeURIComponent(search);
    const [u, a] = await Promise.all([call<{ tags: TagJson[] }>(`/api/sites/${siteId}/tags?unlinked=1&q=${q}`), call<{ tags: TagJson[] }>(`/api/sites/${siteId}/tags`)]);
    setUnlinked(u.tags);
    setAllTags(a.tags);
  }, [siteId, search]);
  useEffect(() => {
    const t = setTimeout(() => loadTags().catch((e) => setMessage(messageOf(e))), 200);
    return () => clearTimeout(t);
  }, [loadTags]);

  async function addUnit(v: NewUnit) {
    try {
      await call(`/api/sites/${siteId}/units`, 'POST', v);
      setMessage({ ok: true, text: `Unit ${v.name} added.` });
      unitForm.reset({ name: '', kind: v.kind, withPorts: v.withPorts });
      await reload();
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  async function importFile(file: File | undefined) {
    if (!file) return;
    try {
      const out = await call<{ units: number }>(`/api/v1/sites/${siteId}/model`, 'PUT', await file.text());
      setMessage({ ok: true, text: `Model replaced from ${file.name}: ${counted(out.units, 'unit', 'units')}.` });
      await reload();
      await loadTags();
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  const err = unitForm.formState.errors;
  return (
    <div className="space-y-6">
      <Notice message={message} />
      <section className="card">
        <h2 className="mb-3">Units</h2>
        {overview.units.length === 0 ? (
          <p className="text-sm text-ink-faint">No unit yet.</p>
        ) : (
          <table className="grid-table" data-testid="units-table">
            <thead>
              <tr>
                <th>Unit</th>
                <th>Kind</th>
                <th className="num">Ports</th>
                <th className="num">Links</th>
                <th>Can compute?</th>
              </tr>
            </thead>
            <tbody>
              {overview.units.map((u) => (
                <tr key={u.id} data-testid={`unit-${u.name}`}>
                  <td>
                    <a href={`/plant/${siteId}/units/${u.id}`}>{u.name}</a>
                  </td>
                  <td>{kindSpec(u.kind).label}</td>
                  <td className="num">{u.ports.length}</td>
                  <td className="num">{u.links.length}</td>
                  <td>
                    <StatusCell unit={u} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {canEdit && (
          <form onSubmit={unitForm.handleSubmit(addUnit)} className="mt-4 grid gap-3 border-t border-paper-edge pt-3 sm:grid-cols-4" noValidate aria-label="Add a unit">
            <Field id="u-name" label="Unit name" error={err.name?.message}>
              <input id="u-name" className="field" {...unitForm.register('name')} />
            </Field>
            <Field id="u-kind" label="Kind" error={err.kind?.message}>
              <select id="u-kind" className="field" {...unitForm.register('kind')}>
                {UNIT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {kindSpec(k).label}
                  </option>
                ))}
              </select>
            </Field>
            <label className="flex items-end gap-2 pb-2 text-sm">
              <input type="checkbox" {...unitForm.register('withPorts')} /> with its required ports
            </label>
            <div className="flex items-end">
              <button className="btn btn-primary" type="submit" disabled={unitForm.formState.isSubmitting}>
                Add unit
              </button>
            </div>
          </form>
        )}
      </section>

      <section className="card">
        <h2 className="mb-1">Unlinked tags</h2>
        <p className="mb-3 text-sm text-ink-soft">Tags from uploaded files that no unit uses yet.</p>
        <input aria-label="Search tags" className="field mb-3 max-w-sm" placeholder="Search name or description" value={search} onChange={(e) => setSearch(e.target.value)} />
        {!unlinked ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : unlinked.length === 0 ? (
          <p className="text-sm text-ink-faint">{search ? 'No unlinked tag matches.' : 'Every tag is linked.'}</p>
        ) : (
          <table className="grid-table" data-testid="unlinked-tags">
            <thead>
              <tr>
                <th>Tag</th>
                <th>Unit in the export</th>
                <th>Description</th>
                <th></th>
              </tr>
            </thead>
            <tbody>
              {unlinked.map((t) => (
                <tr key={t.id} data-testid={`unlinked-${t.name}`}>
                  <td className="font-mono text-xs">{t.name}</td>
                  <td>{t.unitHint ?? ''}</td>
                  <td>{t.description ?? ''}</td>
                  <td className="text-right">
                    {canEdit && overview.units.length > 0 && (
                      <button type="button" className="btn" onClick={() => setLinking(linking === t.name ? null : t.name)}>
                        Link {t.name}…
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {linking && (
          <div className="mt-3">
            <LinkForm
              key={linking}
              siteId={siteId}
              timeZone={overview.site.timeZone}
              units={overview.units}
              tags={allTags}
              fixed={{ tag: linking }}
              onCancel={() => setLinking(null)}
              onDone={async (text) => {
                setLinking(null);
                setMessage({ ok: true, text });
                await reload();
                await loadTags();
              }}
            />
          </div>
        )}
      </section>

      <section className="card">
        <h2 className="mb-3">Site settings</h2>
        <SettingsForm key={JSON.stringify(overview.settings)} overview={overview} canEdit={canEdit} onSaved={async (m) => { setMessage(m); if (m?.ok) await reload(); }} />
      </section>

      <section className="card">
        <h2 className="mb-1">Model file</h2>
        <p className="mb-3 text-sm text-ink-soft">
          The whole model as one JSON file (<a href="/help/model-file">its format</a>), to keep under version control or set up a site in one step.
        </p>
        <div className="flex flex-wrap items-center gap-3">
          <a className="btn no-underline" href={`/api/v1/sites/${siteId}/model`} download>
            Download model file
          </a>
          {canEdit && (
            <label className="text-sm">
              Replace the model from a file (all or nothing):{' '}
              <input type="file" accept="application/json,.json" aria-label="Model file to import" onChange={(e) => importFile(e.target.files?.[0])} />
            </label>
          )}
        </div>
      </section>
    </div>
  );
}
