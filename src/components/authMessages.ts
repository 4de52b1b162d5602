import { authMessage } from '~/lib/auth-words';

export { authMessage };

export async function postAuth(path: string, body: unknown): Promise<{ ok: true; data: any } | { ok: false; message: string }> {
  const res = await fetch(`/api/auth${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  const data = await res.json().catch(() => ({}));
  if (res.ok) return { ok: true, data };
  return { ok: false, message: authMessage(data?.code, res.status, data?.message) };
}
