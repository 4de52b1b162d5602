/**
 * The islands' one data client. `call` sends one request to Lossline's API; `useApi` reads JSON with
 * swr (cached per URL, fetched again when the URL changes). Both read the API's one error shape,
 * { error: { code, message, issues? } }, and give its message (and issues) to show.
 */
import useSWR from 'swr';

export interface Issue {
  path: string;
  message: string;
}

/** An error answer of the API: the server's words, its code and the issues (field by field). */
export class ApiError extends Error {
  constructor(
    message: string,
    readonly code: string = 'UNKNOWN',
    readonly status = 0,
    readonly issues: Issue[] = [],
    /** The server's own message, when it sent one. */
    readonly serverMessage?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type ErrorBody = { code?: string; message?: string; issues?: Issue[]; reason?: string };

/** The ApiError for a response that is not ok (Lossline's { error } shape, or better-auth's flat { code, message }). */
async function errorOf(res: Response): Promise<ApiError> {
  const data = (await res.json().catch(() => null)) as (ErrorBody & { error?: ErrorBody }) | null;
  const e = data?.error ?? data;
  // A refused sign-in names better-auth's own code as `reason` (src/server/auth.ts); the sign-in words go by it.
  return new ApiError(e?.message ?? `The server answered ${res.status}.`, e?.reason ?? e?.code, res.status, Array.isArray(e?.issues) ? e.issues : [], e?.message);
}

/** One request: a body is sent as JSON (a string as it is); the answer is read as JSON ({} when empty). */
export async function call<T = any>(url: string, method = 'GET', body?: unknown): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: body !== undefined ? { 'content-type': 'application/json' } : undefined,
    body: body !== undefined ? (typeof body === 'string' ? body : JSON.stringify(body)) : undefined,
  });
  if (!res.ok) throw await errorOf(res);
  return (await res.json().catch(() => ({}))) as T;
}

/**
 * A JSON GET (null: nothing to fetch yet): data, the error's words, loading, and reload.
 * `refreshMs` reads it again on a timer (a function of the latest data, or 0 for never).
 */
export function useApi<T>(
  url: string | null,
  options: { refreshMs?: number | ((latest: T | undefined) => number) } = {},
): { data: T | null; error: string | null; loading: boolean; reload: () => void } {
  const { data, error, isLoading, mutate } = useSWR<T, ApiError>(url, (u: string) => call<T>(u), {
    refreshInterval: options.refreshMs ?? 0,
    revalidateOnFocus: false,
    shouldRetryOnError: false,
    keepPreviousData: true,
  });
  return { data: data ?? null, error: error ? error.message : null, loading: isLoading, reload: () => void mutate() };
}

export type Message = { ok: boolean; text: string; issues?: Issue[] } | null;

/** What to show for an error: the server's words and, where it sent some, the issues. */
export function messageOf(e: unknown): Message {
  if (e instanceof ApiError) return { ok: false, text: e.message, issues: e.issues };
  return { ok: false, text: (e as Error).message };
}
