import { zodResolver } from '@hookform/resolvers/zod';
import { useCallback, useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ROLES, ROLE_LABELS, type Role } from '../lib/roles';

interface Person {
  id: string;
  name: string;
  email: string;
  role: Role;
  deactivated: boolean;
  pending: boolean;
}

const InviteForm = z.object({
  name: z.string().trim().min(1, 'Give the person a name.'),
  email: z.string().trim().email('That does not look like an e-mail address.'),
  role: z.enum(ROLES),
});
type InviteForm = z.infer<typeof InviteForm>;

async function call(url: string, method: string, body?: unknown) {
  const res = await fetch(url, {
    method,
    headers: body ? { 'content-type': 'application/json' } : undefined,
    body: body ? JSON.stringify(body) : undefined,
  });
  const data = await res.json().catch(() => ({}));
  if (!res.ok) throw new Error(data?.error?.message ?? `The server answered ${res.status}.`);
  return data;
}

export default function PeopleAdmin({ selfId }: { selfId: string }) {
  const [people, setPeople] = useState<Person[] | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const form = useForm<InviteForm>({ resolver: zodResolver(InviteForm), defaultValues: { name: '', email: '', role: 'operator' } });

  const load = useCallback(async () => {
    const data = await call('/api/admin/users', 'GET');
    setPeople(data.users);
  }, []);
  useEffect(() => {
    load().catch((e) => setMessage({ ok: false, text: e.message }));
  }, [load]);

  async function invite(values: InviteForm) {
    try {
      await call('/api/admin/users', 'POST', values);
      setMessage({ ok: true, text: `Invitation sent to ${values.email}.` });
      form.reset({ name: '', email: '', role: values.role });
      await load();
    } catch (e) {
      setMessage({ ok: false, text: (e as Error).message });
    }
  }
  async function patch(id: string, body: { role?: Role; deactivated?: boolean }) {
    try {
      await call(`/api/admin/users/${id}`, 'PATCH', body);
      setMessage({ ok: true, text: 'Saved.' });
      await load();
    } catch (e) {
      setMessage({ ok: false, text: (e as Error).message });
    }
  }

  const err = form.formState.errors;
  return (
    <div className="space-y-6">
      <section className="card">
        <h2 className="mb-3">Invite someone</h2>
        <form onSubmit={form.handleSubmit(invite)} className="grid gap-3 sm:grid-cols-4" noValidate>
          <div>
            <label className="label" htmlFor="invite-name">Name</label>
            <input id="invite-name" className="field" {...form.register('name')} />
            {err.name && <p className="mt-1 text-xs text-alert">{err.name.message}</p>}
          </div>
          <div>
            <label className="label" htmlFor="invite-email">E-mail</label>
            <input id="invite-email" type="email" className="field" {...form.register('email')} />
            {err.email && <p className="mt-1 text-xs text-alert">{err.email.message}</p>}
          </div>
          <div>
            <label className="label" htmlFor="invite-role">Role</label>
            <select id="invite-role" className="field" {...form.register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>{ROLE_LABELS[r]}</option>
              ))}
            </select>
          </div>
          <div className="flex items-end">
            <button className="btn btn-primary" type="submit" disabled={form.formState.isSubmitting}>
              Send invitation
            </button>
          </div>
        </form>
      </section>
      {message && (
        <p role={message.ok ? 'status' : 'alert'} className={message.ok ? 'notice-ok' : 'notice-error'}>{message.text}</p>
      )}
      <section className="card">
        <h2 className="mb-3">People</h2>
        {!people ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : (
          <table className="grid-table">
            <thead>
              <tr><th>Name</th><th>E-mail</th><th>Role</th><th>Account</th><th></th></tr>
            </thead>
            <tbody>
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
                      {ROLES.map((r) => (
                        <option key={r} value={r}>{ROLE_LABELS[r]}</option>
                      ))}
                    </select>
                  </td>
                  <td>{p.deactivated ? 'deactivated' : p.pending ? 'invited, no password yet' : 'active'}</td>
                  <td className="text-right">
                    {p.id !== selfId && (
                      <button className="btn" type="button" onClick={() => patch(p.id, { deactivated: !p.deactivated })}>
                        {p.deactivated ? 'Reactivate' : 'Deactivate'}
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
