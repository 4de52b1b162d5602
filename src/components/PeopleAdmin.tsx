import { zodResolver } from '@hookform/resolvers/zod';
import { useCallback, useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { InviteInput } from '~/lib/people';
import { ROLES, ROLE_LABELS, type Role } from '../lib/roles';
import { call } from '~/components/api';
import { GridTable, ACTIONS } from '~/components/ui/GridTable';
import { Field, FormInput, Options, SubmitCell } from '~/components/ui/Field';

interface Person {
  id: string;
  name: string;
  email: string;
  role: Role;
  deactivated: boolean;
  pending: boolean;
  sites: 'all' | string[];
}

interface SiteRef {
  id: string;
  name: string;
}

/** Which sites a person may use: every site (later ones too) or the ones ticked. Admins: always all. */
function SitesCell({ person, sites, onChange }: { person: Person; sites: SiteRef[]; onChange: (v: 'all' | string[]) => void }) {
  if (person.role === 'admin') return <span className="text-sm text-ink-soft">every site (admin)</span>;
  const every = person.sites === 'all';
  const listed = every ? sites.map((s) => s.id) : (person.sites as string[]);
  const summary = every ? 'every site' : listed.length === 0 ? 'no site yet' : sites.filter((s) => listed.includes(s.id)).map((s) => s.name).join(', ');
  return (
    <details>
      <summary className="cursor-pointer text-sm" aria-label={`Sites of ${person.name}`}>{summary}</summary>
      <fieldset className="mt-2 space-y-1 text-sm">
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={every} onChange={(e) => onChange(e.target.checked ? 'all' : listed)} />
          Every site, including sites added later
        </label>
        {sites.map((s) => (
          <label key={s.id} className="flex items-center gap-2">
            <input
              type="checkbox"
              disabled={every}
              checked={listed.includes(s.id)}
              onChange={(e) => onChange(e.target.checked ? [...listed, s.id] : listed.filter((id) => id !== s.id))}
            />
            {s.name}
          </label>
        ))}
      </fieldset>
    </details>
  );
}

interface TableProps {
  people: Person[];
  sites: SiteRef[];
  selfId: string;
  patch: (id: string, body: { role?: Role; deactivated?: boolean; sites?: 'all' | string[] }) => void;
  resend: (p: Person) => void;
}

/** Everyone with an account: role, sites, state, and the buttons of each row, named with the person. */
function PeopleTable({ people, sites, selfId, patch, resend }: TableProps) {
  return (
    <div className="overflow-x-auto">
    <GridTable columns={['Name', 'E-mail', 'Role', 'Sites', 'Account', ACTIONS]}>
      {people.map((p) => (
        <tr key={p.id} data-testid={`person-${p.email}`}>
          <td>{p.name}</td>
          <td>{p.email}</td>
          <td>
            <select
              aria-label={`Role of ${p.name}`}
              className="field py-0.5"
              value={p.role}
              onChange={(e) => patch(p.id, { role: e.target.value as Role })}
            >
              <Options choices={ROLES.map((r) => [r, ROLE_LABELS[r]] as const)} />
            </select>
          </td>
          <td>
            <SitesCell person={p} sites={sites} onChange={(v) => patch(p.id, { sites: v })} />
          </td>
          <td>{p.deactivated ? 'deactivated' : p.pending ? 'invited, no password yet' : 'active'}</td>
          <td className="whitespace-nowrap text-right">
            {p.pending && !p.deactivated && (
              <button className="btn mr-2" type="button" aria-label={`Resend the invitation to ${p.name}`} onClick={() => resend(p)}>
                Resend invitation
              </button>
            )}
            {p.id !== selfId && (
              <button
                className="btn"
                type="button"
                aria-label={`${p.deactivated ? 'Reactivate' : 'Deactivate'} ${p.name}`}
                onClick={() => patch(p.id, { deactivated: !p.deactivated })}
              >
                {p.deactivated ? 'Reactivate' : 'Deactivate'}
              </button>
            )}
          </td>
        </tr>
      ))}
    </GridTable>
    </div>
  );
}

/** The server's rules for an invitation (the sites are set apart, after it). */
const InviteForm = InviteInput.pick({ name: true, email: true, role: true });
type InviteForm = z.infer<typeof InviteForm>;

type Said = { ok: boolean; text: string } | null;
type PersonPatch = { role?: Role; deactivated?: boolean; sites?: 'all' | string[] };

/** The people list, read on mount and after each change; the outcome of each change in `message`. */
function usePeople() {
  const [people, setPeople] = useState<Person[] | null>(null);
  const [message, setMessage] = useState<Said>(null);

  const load = useCallback(async () => {
    const data = await call('/api/admin/users', 'GET');
    setPeople(data.users);
  }, []);
  useEffect(() => {
    load().catch((e) => setMessage({ ok: false, text: e.message }));
  }, [load]);

  /** Runs a change, says `text` of its answer, runs `done`, and reads the list again (or says why it failed). */
  async function change<T>(send: () => Promise<T>, text: (out: T) => string, done?: () => void): Promise<void> {
    try {
      const out = await send();
      setMessage({ ok: true, text: text(out) });
      done?.();
      await load();
    } catch (e) {
      setMessage({ ok: false, text: (e as Error).message });
    }
  }
  const patch = (id: string, body: PersonPatch) => void change(() => call(`/api/admin/users/${id}`, 'PATCH', body), () => 'Saved.');
  const resend = (p: Person) =>
    void change(
      () => call<{ sentTo: string }>(`/api/admin/users/${p.id}/resend`, 'POST', {}),
      (out) => `Invitation sent again to ${out.sentTo}; the earlier link no longer works.`,
    );
  return { people, message, change, patch, resend };
}

/** Invite someone: name, e-mail and role, checked by the server's own rules. */
function InviteSection({ onInvite }: { onInvite: (values: InviteForm, sent: () => void) => Promise<void> }) {
  const form = useForm<InviteForm>({ resolver: zodResolver(InviteForm), defaultValues: { name: '', email: '', role: 'operator' } });
  const invite = (values: InviteForm) => onInvite(values, () => form.reset({ name: '', email: '', role: values.role }));
  return (
    <section className="card">
      <h2 className="mb-3">Invite someone</h2>
      <form onSubmit={form.handleSubmit(invite)} className="grid gap-3 sm:grid-cols-4" noValidate>
        <FormInput form={form} name="name" id="invite-name" label="Name" />
        <FormInput form={form} name="email" id="invite-email" label="E-mail" type="email" />
        <Field id="invite-role" label="Role">
          <select id="invite-role" className="field" {...form.register('role')}>
            <Options choices={ROLES.map((r) => [r, ROLE_LABELS[r]] as const)} />
          </select>
        </Field>
        <SubmitCell busy={form.formState.isSubmitting}>Send invitation</SubmitCell>
      </form>
    </section>
  );
}

/** The people page: invite someone, and everyone's role, sites and account. */
export default function PeopleAdmin({ selfId, sites = [] }: { selfId: string; sites?: SiteRef[] }) {
  const { people, message, change, patch, resend } = usePeople();
  const onInvite = (values: InviteForm, sent: () => void) => change(() => call('/api/admin/users', 'POST', values), () => `Invitation sent to ${values.email}.`, sent);
  return (
    <div className="space-y-6">
      <InviteSection onInvite={onInvite} />
      {message && (
        <p role={message.ok ? 'status' : 'alert'} className={message.ok ? 'notice-ok' : 'notice-error'}>{message.text}</p>
      )}
      <section className="card">
        <h2 className="mb-3">People</h2>
        {!people ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : (
          <PeopleTable people={people} sites={sites} selfId={selfId} patch={patch} resend={resend} />
        )}
      </section>
    </div>
  );
}
