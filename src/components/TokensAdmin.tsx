import { useState } from 'react';
import { call, useApi } from '~/components/api';
import { siteStamp } from '~/lib/site-time';
import { useConfirm } from '~/components/ConfirmDialog';
import { GridTable, ACTIONS } from '~/components/ui/GridTable';
import { SubmitCell } from '~/components/ui/Field';

interface Token {
  id: string;
  name: string;
  prefix: string;
  role: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** Site API tokens for scheduled exports: issued (secret shown once), listed, revoked. */
export default function TokensAdmin({ sites }: { sites: { id: string; name: string; timeZone?: string }[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const [name, setName] = useState('');
  const [role, setRole] = useState<'operator' | 'admin'>('operator');
  const [secret, setSecret] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  const list = useApi<{ tokens: Token[] }>(siteId ? `/api/sites/${siteId}/tokens` : null);
  const tokens = list.data?.tokens ?? [];
  const tz = sites.find((s) => s.id === siteId)?.timeZone ?? 'UTC';
  const load = list.reload;
  const { dialog, ask } = useConfirm();

  async function issue(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    const data = await call<{ token: string }>(`/api/sites/${siteId}/tokens`, 'POST', { name, role }).catch((e: Error) => setError(e.message));
    if (!data) return;
    setSecret(data.token);
    setName('');
    void load();
  }
  async function revoke({ id, name }: Token) {
    const body = 'Whatever sends files with it is refused from now on; a revoked token cannot be brought back.';
    if (!(await ask({ title: `Revoke the token “${name}”?`, body, confirm: 'Revoke the token', danger: true }))) return;
    await call(`/api/tokens/${id}`, 'DELETE').catch((e: Error) => setError(e.message));
    load();
  }

  return (
    <div className="space-y-6">
      {dialog}
      <div>
        <label className="label" htmlFor="tok-site">Site</label>
        <select id="tok-site" className="field max-w-sm" value={siteId} onChange={(e) => { setSiteId(e.target.value); setSecret(null); }}>
          {sites.map((s) => (<option key={s.id} value={s.id}>{s.name}</option>))}
        </select>
      </div>
      <form onSubmit={issue} className="card grid gap-3 sm:grid-cols-4">
        <div className="sm:col-span-2">
          <label className="label" htmlFor="tok-name">What uses it</label>
          <input id="tok-name" className="field" value={name} onChange={(e) => setName(e.target.value)} placeholder="nightly historian export" />
        </div>
        <div>
          <label className="label" htmlFor="tok-role">Allowed to</label>
          <select id="tok-role" className="field" value={role} onChange={(e) => setRole(e.target.value as 'operator' | 'admin')}>
            <option value="operator">send files</option>
            <option value="admin">send files and import the plant model</option>
          </select>
        </div>
        <SubmitCell>Issue token</SubmitCell>
      </form>
      {error && <p role="alert" className="notice-error">{error}</p>}
      {secret && (
        <div className="notice-ok" role="status">
          <p className="mb-1 font-medium">Copy this token now; it is shown only once.</p>
          <code data-testid="new-token" className="select-all break-all">{secret}</code>
        </div>
      )}
      <GridTable columns={['Name', 'Starts with', 'Allowed to send', <>Issued ({tz})</>, <>Last used ({tz})</>, ACTIONS]}>
        {tokens.map((t) => (
          <tr key={t.id}>
            <td>{t.name}</td>
            <td><code>{t.prefix}…</code></td>
            <td>{t.role === 'admin' ? 'files and model' : 'files'}</td>
            <td className="tabular-nums">{siteStamp(t.createdAt, tz)}</td>
            <td className="tabular-nums">{t.lastUsedAt ? siteStamp(t.lastUsedAt, tz) : 'never'}</td>
            <td className="text-right">{t.revokedAt ? 'revoked' : <button className="btn" type="button" aria-label={`Revoke ${t.name}`} onClick={() => revoke(t)}>Revoke</button>}</td>
          </tr>
        ))}
      </GridTable>
    </div>
  );
}
