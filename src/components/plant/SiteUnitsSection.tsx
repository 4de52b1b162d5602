import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { UNIT_KINDS } from '~/lib/kinds';
import { kindSpec } from '~/lib/plant/kinds';
import { UnitCreateInput } from '~/lib/plant/inputs';
import { counted } from '~/lib/counts';
import { Field, FormInput, Options, SubmitCell } from '~/components/ui/Field';
import { call, messageOf, type Message } from '~/components/api';
import type { UnitJson } from './LinkForm';
import { GridTable, num } from '~/components/ui/GridTable';

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

/** The site's units with what each lacks. */
function UnitsTable({ siteId, units }: { siteId: string; units: UnitJson[] }) {
  return (
    <GridTable testId="units-table" columns={['Unit', 'Kind', num('Ports'), num('Links'), 'Can compute?']}>
      {units.map((u) => (
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
    </GridTable>
  );
}

/** Adds a unit of a kind, with its required ports if asked. */
function AddUnitForm({ siteId, onMessage, onAdded }: { siteId: string; onMessage: (m: Message) => void; onAdded: () => Promise<void> }) {
  const unitForm = useForm<NewUnit>({ resolver: zodResolver(NewUnit), defaultValues: { name: '', kind: 'let-down-valve', withPorts: true } });
  const err = unitForm.formState.errors;

  async function addUnit(v: NewUnit) {
    try {
      await call(`/api/sites/${siteId}/units`, 'POST', v);
      onMessage({ ok: true, text: `Unit ${v.name} added.` });
      unitForm.reset({ name: '', kind: v.kind, withPorts: v.withPorts });
      await onAdded();
    } catch (e) {
      onMessage(messageOf(e));
    }
  }

  return (
    <form onSubmit={unitForm.handleSubmit(addUnit)} className="mt-4 grid gap-3 border-t border-paper-edge pt-3 sm:grid-cols-4" noValidate aria-label="Add a unit">
      <FormInput form={unitForm} name="name" id="u-name" label="Unit name" />
      <Field id="u-kind" label="Kind" error={err.kind?.message}>
        <select id="u-kind" className="field" {...unitForm.register('kind')}>
          <Options choices={UNIT_KINDS.map((k) => [k, kindSpec(k).label] as const)} />
        </select>
      </Field>
      <label className="flex items-end gap-2 pb-2 text-sm">
        <input type="checkbox" {...unitForm.register('withPorts')} /> with its required ports
      </label>
      <SubmitCell busy={unitForm.formState.isSubmitting}>Add unit</SubmitCell>
    </form>
  );
}

/** The Units card of the site page: the table, and for admins the form that adds one. */
export default function SiteUnitsSection({ siteId, units, canEdit, onMessage, onAdded }: { siteId: string; units: UnitJson[]; canEdit: boolean; onMessage: (m: Message) => void; onAdded: () => Promise<void> }) {
  return (
    <section className="card">
      <h2 className="mb-3">Units</h2>
      {units.length === 0 ? <p className="text-sm text-ink-faint">No unit yet.</p> : <UnitsTable siteId={siteId} units={units} />}
      {canEdit && <AddUnitForm siteId={siteId} onMessage={onMessage} onAdded={onAdded} />}
    </section>
  );
}
