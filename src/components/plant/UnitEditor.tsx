import { zodResolver } from '@hookform/resolvers/zod';
import { useCallback, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FLUID_LABELS, LINK_QUANTITIES, kindSpec, type FluidKind, type LinkQuantity, type ParamSpec } from '~/lib/plant/kinds';
import { shownUnit, type DisplayUnits } from '~/lib/units/display';
import { FUEL_TYPES, type FuelDefinition, type Fluid } from '~/lib/plant/model';
import { Field, Notice, parseComposition, readSI, showComposition, showInstant, showSI } from './common';
import { call, messageOf, type Message } from '~/components/api';
import LinkForm, { targetsOf, type TagJson, type UnitJson } from './LinkForm';
import { PortInput } from '~/lib/plant/inputs';

interface LinkRow {
  id: string;
  portId: string | null;
  portName: string | null;
  quantity: LinkQuantity;
  tagName: string;
  engUnit: string;
  basis: 'dry' | 'wet' | null;
  uncertaintyMode: 'absolute' | 'relative';
  uncertainty: number;
  validMin: number | null;
  validMax: number | null;
  validFrom: string;
  validTo: string | null;
}

export interface UnitPageData {
  site: { id: string; name: string; timeZone: string };
  unit: UnitJson;
  history: LinkRow[];
  tags: TagJson[];
  boilers: string[];
  prices: string[];
  /** The site's display units; parameters of power, mass flow and temperature are shown in them. */
  display?: DisplayUnits;
}

const holdsNow = (l: LinkRow, now = Date.now()) => Date.parse(l.validFrom) <= now && (l.validTo === null || Date.parse(l.validTo) > now);

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

function ParametersForm({ data, canEdit, onSaved }: { data: UnitPageData; canEdit: boolean; onSaved: (m: Message) => void }) {
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
      <fieldset disabled={!canEdit} className="grid gap-3 sm:grid-cols-3">
        {specs.map((s) => (
          <Field
            key={s.key}
            id={`param-${s.key}`}
            label={`${s.label}${s.type === 'number' ? ` [${shownUnit(paramUnit(s, data.display))}]` : ''}${s.type === 'number' && s.required ? ' *' : ''}`}
            error={form.formState.errors[s.key]?.message}
          >
            {s.type === 'choice' ? (
              <select id={`param-${s.key}`} className="field" {...form.register(s.key)}>
                {s.choices.map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </select>
            ) : (
              <input id={`param-${s.key}`} className="field" inputMode="decimal" {...form.register(s.key)} />
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

const FuelForm = z.object({
  by: z.enum(['composition', 'heating-value']),
  composition: z.string(),
  fuelType: z.enum(FUEL_TYPES),
  lhv: z.string(),
  price: z.string(),
});
type FuelForm = z.infer<typeof FuelForm>;

function FuelEditor({ data, canEdit, onSaved }: { data: UnitPageData; canEdit: boolean; onSaved: (m: Message) => void }) {
  const fuel = data.unit.fuel as FuelDefinition | undefined;
  const form = useForm<FuelForm>({
    resolver: zodResolver(FuelForm),
    defaultValues: {
      by: fuel?.by === 'heating-value' ? 'heating-value' : 'composition',
      composition: fuel?.by === 'composition' ? showComposition(fuel.moleFractions) : '',
      fuelType: fuel?.by === 'heating-value' ? fuel.fuelType : 'natural-gas',
      lhv: fuel && 'LHV_J_per_kg' in fuel ? String(fuel.LHV_J_per_kg / 1e6) : '',
      price: fuel?.price ?? '',
    },
  });
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
      <fieldset disabled={!canEdit} className="grid gap-3 sm:grid-cols-3">
        <Field id="fuel-by" label="Fuel given by">
          <select id="fuel-by" className="field" {...form.register('by')}>
            <option value="composition">gas composition (mole fractions)</option>
            <option value="heating-value">type and lower heating value</option>
          </select>
        </Field>
        {by === 'composition' ? (
          <Field id="fuel-comp" label="Mole fractions" error={err.composition?.message}>
            <input id="fuel-comp" className="field" placeholder="CH4=0.93, C2H6=0.04, N2=0.03" {...form.register('composition')} />
          </Field>
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
              <input id="fuel-lhv" className="field" inputMode="decimal" {...form.register('lhv')} />
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

function fluidOf(v: PortForm): Fluid | null | string {
  switch (v.fluid as FluidKind | '') {
    case '':
      return null;
    case 'fuel-gas':
    case 'gas-mixture': {
      const c = parseComposition(v.composition);
      return c ? ({ kind: v.fluid, moleFractions: c } as Fluid) : 'Write species=fraction pairs, e.g. CH4=0.9, N2=0.1.';
    }
    case 'liquid': {
      const cp = Number(v.cp) * 1000;
      const rho = Number(v.rho);
      return cp > 0 && rho > 0 ? { kind: 'liquid', cp_J_per_kgK: cp, rho_kg_per_m3: rho } : 'Give cp [kJ/(kg K)] and density [kg/m3].';
    }
    case 'flue-gas':
      return v.fuelFrom ? { kind: 'flue-gas', fuelFrom: v.fuelFrom } : { kind: 'flue-gas' };
    default:
      return { kind: v.fluid } as Fluid;
  }
}

function describeFluid(f: Fluid | undefined): string {
  if (!f) return '—';
  switch (f.kind) {
    case 'fuel-gas':
    case 'gas-mixture':
      return `${FLUID_LABELS[f.kind]}: ${showComposition(f.moleFractions)}`;
    case 'liquid':
      return `liquid, cp ${f.cp_J_per_kgK / 1000} kJ/(kg K), ${f.rho_kg_per_m3} kg/m3`;
    case 'flue-gas':
      return f.fuelFrom ? `flue gas of ${f.fuelFrom}` : 'flue gas';
    default:
      return FLUID_LABELS[f.kind];
  }
}

function AddPort({ data, onDone }: { data: UnitPageData; onDone: (m: Message) => void }) {
  const spec = kindSpec(data.unit.kind);
  const form = useForm<PortForm>({
    resolver: zodResolver(PortForm),
    defaultValues: { name: '', slot: spec.ports[0]?.slot ?? '', fluid: spec.ports[0]?.fluids[0] ?? '', composition: '', cp: '', rho: '', fuelFrom: '', boundaryT: '' },
  });
  const slotName = form.watch('slot');
  const fluid = form.watch('fluid');
  const slot = spec.ports.find((s) => s.slot === slotName);
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
  const err = form.formState.errors;
  return (
    <form onSubmit={form.handleSubmit(add)} noValidate aria-label="Add a port" className="mt-3 space-y-2 border-t border-paper-edge pt-3">
      <div className="grid gap-3 sm:grid-cols-4">
        <Field id="port-name" label="Port name" error={err.name?.message}>
          <input id="port-name" className="field" {...form.register('name')} />
        </Field>
        <Field id="port-slot" label="Slot" error={err.slot?.message}>
          <select
            id="port-slot"
            className="field"
            {...form.register('slot', { onChange: (e) => form.setValue('fluid', spec.ports.find((s) => s.slot === e.target.value)?.fluids[0] ?? '') })}
          >
            {spec.ports.map((s) => (
              <option key={s.slot} value={s.slot}>
                {s.label} ({s.role === 'in' ? 'into the unit' : 'out of the unit'}, {slotCountWords(s.min, s.max)})
              </option>
            ))}
          </select>
        </Field>
        {slot?.stream === 'matter' && (
          <Field id="port-fluid" label="Fluid" error={err.fluid?.message}>
            <select id="port-fluid" className="field" {...form.register('fluid')}>
              {slot.fluids.map((f) => (
                <option key={f} value={f}>
                  {FLUID_LABELS[f]}
                </option>
              ))}
            </select>
          </Field>
        )}
        {slot?.stream === 'heat' && (
          <Field id="port-tb" label="Boundary temperature [°C] (or link a tag)">
            <input id="port-tb" className="field" inputMode="decimal" {...form.register('boundaryT')} />
          </Field>
        )}
        {(fluid === 'fuel-gas' || fluid === 'gas-mixture') && slot?.stream === 'matter' && (
          <Field id="port-comp" label="Mole fractions">
            <input id="port-comp" className="field" placeholder="CH4=0.9, N2=0.1" {...form.register('composition')} />
          </Field>
        )}
        {fluid === 'liquid' && slot?.stream === 'matter' && (
          <>
            <Field id="port-cp" label="cp [kJ/(kg K)]">
              <input id="port-cp" className="field" inputMode="decimal" {...form.register('cp')} />
            </Field>
            <Field id="port-rho" label="Density [kg/m3]">
              <input id="port-rho" className="field" inputMode="decimal" {...form.register('rho')} />
            </Field>
          </>
        )}
        {fluid === 'flue-gas' && data.unit.kind !== 'boiler' && slot?.stream === 'matter' && (
          <Field id="port-fuelfrom" label="Flue gas of boiler">
            <select id="port-fuelfrom" className="field" {...form.register('fuelFrom')}>
              <option value="">Choose…</option>
              {data.boilers.map((b) => (
                <option key={b}>{b}</option>
              ))}
            </select>
          </Field>
        )}
      </div>
      <Notice message={message} />
      <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
        Add port
      </button>
    </form>
  );
}

/** One unit: what it lacks, its ports and fluids, its tag links and their versions, its parameters. */
export default function UnitEditor({ initial, canEdit }: { initial: UnitPageData; canEdit: boolean }) {
  const [data, setData] = useState<UnitPageData>(initial);
  const [message, setMessage] = useState<Message>(null);
  const [linkForm, setLinkForm] = useState<{ target?: string; tag?: string; unit?: string; changing?: boolean; key: number } | null>(null);
  const [showHistory, setShowHistory] = useState(false);
  const { site, unit } = data;
  const spec = kindSpec(unit.kind);
  const tz = site.timeZone;

  const reload = useCallback(async () => {
    const [u, t] = await Promise.all([
      call<{ unit: UnitJson; history: LinkRow[] }>(`/api/sites/${site.id}/units/${unit.id}`),
      call<{ tags: TagJson[] }>(`/api/sites/${site.id}/tags`),
    ]);
    setData((d) => ({ ...d, unit: u.unit, history: u.history, tags: t.tags }));
  }, [site.id, unit.id]);

  const done = async (m: Message) => {
    setMessage(m);
    setLinkForm(null);
    await reload();
  };
  async function removePort(id: string, name: string) {
    if (!window.confirm(`Remove port ${name}? Its tag links go with it.`)) return;
    try {
      await call(`/api/sites/${site.id}/units/${unit.id}/ports/${id}`, 'DELETE');
      await done({ ok: true, text: `Port ${name} removed.` });
    } catch (e) {
      setMessage(messageOf(e));
    }
  }
  async function endLink(l: LinkRow) {
    try {
      await call(`/api/sites/${site.id}/links/${l.id}`, 'DELETE');
      await done({ ok: true, text: `${l.tagName} no longer linked from now on; older hours keep it.` });
    } catch (e) {
      setMessage(messageOf(e));
    }
  }
  async function removeUnit() {
    if (!window.confirm(`Delete unit ${unit.name} with its ports and links?`)) return;
    try {
      await call(`/api/sites/${site.id}/units/${unit.id}`, 'DELETE');
      window.location.href = `/plant/${site.id}`;
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  const portOrder = new Map(unit.ports.map((p, i) => [p.id, i]));
  const current = data.history
    .filter((l) => holdsNow(l))
    .sort((a, b) => (portOrder.get(a.portId ?? '') ?? 99) - (portOrder.get(b.portId ?? '') ?? 99) || a.quantity.localeCompare(b.quantity));
  const targets = targetsOf(unit);
  const { missing, conflicts, complete } = unit.status;

  return (
    <div className="space-y-6">
      <section className="card" aria-label="Can it compute?">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2>Can it compute?</h2>
          <p data-testid="unit-status" className={complete ? 'font-medium text-teal-deep' : 'font-medium text-copper-deep'}>
            {complete ? '✓ Complete: the unit can be computed.' : `◇ Not yet: ${missing.length} missing, ${conflicts.length} conflicting.`}
          </p>
        </div>
        {missing.length > 0 && (
          <ul className="mt-2 space-y-1 text-sm" data-testid="missing">
            {missing.map((m, i) => {
              const target = m.quantities && m.code !== 'MISSING_PORT' ? targets.find((t) => t.missing && t.quantity === m.quantities![0] && (t.portId === null) === !m.port && (!m.port || unit.ports.find((p) => p.id === t.portId)?.name === m.port)) : undefined;
              return (
                <li key={i} className="flex items-center gap-2">
                  <span aria-hidden>◇</span>
                  <span>{m.message}</span>
                  {canEdit && target && (
                    <button type="button" className="btn py-0.5 text-xs" onClick={() => setLinkForm({ target: target.value, key: Date.now() })}>
                      Link a tag
                    </button>
                  )}
                </li>
              );
            })}
          </ul>
        )}
        {conflicts.length > 0 && (
          <ul className="mt-2 space-y-1 text-sm text-alert" data-testid="conflicts">
            {conflicts.map((c, i) => (
              <li key={i}>
                <span aria-hidden>▲ </span>
                {c.message}
              </li>
            ))}
          </ul>
        )}
      </section>

      <Notice message={message} />

      <section className="card">
        <div className="mb-3 flex items-baseline justify-between">
          <h2>Tag links</h2>
          {canEdit && (
            <button type="button" className="btn" onClick={() => setLinkForm({ key: Date.now() })}>
              Link a tag…
            </button>
          )}
        </div>
        {linkForm && (
          <div className="mb-3">
            <LinkForm
              key={linkForm.key}
              siteId={site.id}
              timeZone={tz}
              units={[unit]}
              tags={data.tags}
              fixed={{ unitId: unit.id, target: linkForm.target, tag: linkForm.tag, unit: linkForm.unit }}
              changing={linkForm.changing}
              onCancel={() => setLinkForm(null)}
              onDone={(text) => done({ ok: true, text })}
            />
          </div>
        )}
        {current.length === 0 ? (
          <p className="text-sm text-ink-faint">No tag is linked now.</p>
        ) : (
          <table className="grid-table" data-testid="links-table">
            <thead>
              <tr>
                <th>At</th>
                <th>Quantity</th>
                <th>Tag</th>
                <th>Unit</th>
                <th>Uncertainty</th>
                <th>Valid range</th>
                <th>Valid from</th>
                <th></th>
              </tr>
            </thead>
            <tbody>
              {current.map((l) => (
                <tr key={l.id} data-testid={`link-${l.tagName}`}>
                  <td>{l.portName ?? 'unit'}</td>
                  <td>
                    {LINK_QUANTITIES[l.quantity].label}
                    {l.basis ? ` (${l.basis})` : ''}
                  </td>
                  <td className="font-mono text-xs">{l.tagName}</td>
                  <td>{l.engUnit}</td>
                  <td>{l.uncertaintyMode === 'relative' ? `${l.uncertainty} %` : `${l.uncertainty} ${l.engUnit}`}</td>
                  <td>{l.validMin !== null || l.validMax !== null ? `${l.validMin ?? '…'} to ${l.validMax ?? '…'}` : ''}</td>
                  <td>{showInstant(l.validFrom, tz)}</td>
                  <td className="whitespace-nowrap text-right">
                    {canEdit && (
                      <>
                        <button
                          type="button"
                          className="btn py-0.5 text-xs"
                          onClick={() => setLinkForm({ target: `${l.portId ?? ''}|${l.quantity}`, tag: undefined, unit: l.engUnit, changing: true, key: Date.now() })}
                        >
                          Change…
                        </button>{' '}
                        <button type="button" className="btn py-0.5 text-xs" onClick={() => endLink(l)}>
                          End
                        </button>
                      </>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <button type="button" className="btn mt-3 text-xs" onClick={() => setShowHistory(!showHistory)}>
          {showHistory ? 'Hide' : 'Show'} every version ({data.history.length})
        </button>
        {showHistory && (
          <table className="grid-table mt-2" data-testid="history-table">
            <thead>
              <tr>
                <th>At</th>
                <th>Quantity</th>
                <th>Tag</th>
                <th>Unit</th>
                <th>From</th>
                <th>Until</th>
              </tr>
            </thead>
            <tbody>
              {data.history.map((l) => (
                <tr key={l.id} className={l.validTo !== null && l.validTo === l.validFrom ? 'text-ink-faint line-through' : ''}>
                  <td>{l.portName ?? 'unit'}</td>
                  <td>{LINK_QUANTITIES[l.quantity].label}</td>
                  <td className="font-mono text-xs">{l.tagName}</td>
                  <td>{l.engUnit}</td>
                  <td>{showInstant(l.validFrom, tz)}</td>
                  <td>{l.validTo ? showInstant(l.validTo, tz) : 'open'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <p className="mt-2 text-xs text-ink-faint">
          Times in {tz}. Changing a link starts a new version; hours before it keep the old one, and only the hours it touches are recomputed.
        </p>
      </section>

      <section className="card">
        <h2 className="mb-3">Ports</h2>
        {unit.ports.length === 0 ? (
          <p className="text-sm text-ink-faint">No port yet.</p>
        ) : (
          <table className="grid-table" data-testid="ports-table">
            <thead>
              <tr>
                <th>Port</th>
                <th>Slot</th>
                <th>Fluid / boundary</th>
                <th></th>
              </tr>
            </thead>
            <tbody>
              {unit.ports.map((p) => {
                const slot = spec.ports.find((s) => s.slot === p.slot);
                return (
                  <tr key={p.id} data-testid={`port-${p.name}`}>
                    <td>{p.name}</td>
                    <td>
                      {slot?.label ?? p.slot} ({slot?.role})
                    </td>
                    <td>{slot?.stream === 'heat' ? (p.boundaryT_K ? `Tb ${showSI(p.boundaryT_K, 'degC', 'temperature')} °C` : 'Tb from a tag') : describeFluid(p.fluid as Fluid | undefined)}</td>
                    <td className="text-right">
                      {canEdit && (
                        <button type="button" className="btn py-0.5 text-xs" onClick={() => removePort(p.id, p.name)}>
                          Remove
                        </button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
        {canEdit && spec.ports.length > 0 && <AddPort data={data} onDone={done} />}
      </section>

      {spec.needsFuel && (
        <section className="card">
          <h2 className="mb-3">Fuel</h2>
          <FuelEditor key={JSON.stringify(unit.fuel ?? null)} data={data} canEdit={canEdit} onSaved={done} />
        </section>
      )}

      <section className="card">
        <h2 className="mb-3">Parameters</h2>
        <ParametersForm key={JSON.stringify(unit.parameters)} data={data} canEdit={canEdit} onSaved={done} />
      </section>

      <section className="card text-sm text-ink-soft">
        <h2 className="mb-2 text-ink">{spec.label}: how it is balanced</h2>
        <p>
          Fuel: {spec.fuel}. Product: {spec.product}.
        </p>
        {canEdit && (
          <button type="button" className="btn btn-danger mt-3" onClick={removeUnit}>
            Delete this unit
          </button>
        )}
      </section>
    </div>
  );
}

/** How many ports of a slot a unit may have, in words: "exactly one", "one or more", "any number". */
export function slotCountWords(min: number, max: number | null): string {
  const n = (k: number) => ['none', 'one', 'two', 'three'][k] ?? String(k);
  if (max === null) return min === 0 ? 'any number' : `${n(min)} or more`;
  if (min === max) return `exactly ${n(min)}`;
  return min === 0 ? `at most ${n(max)}` : `${n(min)} to ${n(max)}`;
}
