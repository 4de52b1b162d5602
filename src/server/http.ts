import { canUseSite } from './access';
import { apiError, type ErrorCode } from './errors';

/** Errors a service throws on purpose carry an API error code. */
export interface CodedError extends Error {
  code: ErrorCode;
}

/** Runs an endpoint body, turning a service's coded error into the API's error shape. */
export async function answer(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (err) {
    const code = (err as Partial<CodedError>).code;
    if (typeof code === 'string' && /^[A-Z_]+$/.test(code)) return apiError(code as ErrorCode, (err as Error).message);
    throw err;
  }
}

export async function jsonBody(request: Request): Promise<unknown> {
  return request.json().catch(() => null);
}

/** True when the caller may act on this site: a person with access to it, or a token of this very site. */
export function siteAllowed(locals: App.Locals, siteId: string): boolean {
  return canUseSite(locals, siteId);
}

export const tokenForOtherSite = () => apiError('FORBIDDEN', 'This API token belongs to another site.');
