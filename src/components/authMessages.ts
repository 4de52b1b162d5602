import { ApiError, call } from './api';
import { authMessage } from '~/lib/auth-words';

export { authMessage };

/** A POST to better-auth through the islands' one data client; a refusal comes back in plain words. */
export async function postAuth(path: string, body: unknown): Promise<{ ok: true; data: any } | { ok: false; message: string }> {
  try {
    return { ok: true, data: await call(`/api/auth${path}`, 'POST', body) };
  } catch (e) {
    if (!(e instanceof ApiError)) throw e;
    return { ok: false, message: authMessage(e.code === 'UNKNOWN' ? undefined : e.code, e.status, e.serverMessage) };
  }
}
