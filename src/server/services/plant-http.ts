import type { z } from 'zod';
import { jsonPath } from '~/lib/plant/model';
import { apiError } from '../errors';
import { PlantRuleError } from './plant-tx';

/** Maps a plant-model rule error to the API's error body; anything else is rethrown. */
export function plantErrorResponse(err: unknown): Response {
  if (err instanceof PlantRuleError) return apiError(err.code, err.message, err.issues);
  throw err;
}

/** Parses a JSON body with a schema; a failure answers 400 with each issue's JSON path. */
export async function parseBody<T extends z.ZodType>(request: Request, schema: T): Promise<{ ok: true; data: z.infer<T> } | { ok: false; response: Response }> {
  const body = await request.json().catch(() => undefined);
  if (body === undefined) return { ok: false, response: apiError('VALIDATION_FAILED', 'The request body is not JSON.', [{ path: '$', message: 'Send a JSON body.' }]) };
  const parsed = schema.safeParse(body);
  if (parsed.success) return { ok: true, data: parsed.data };
  const issues = parsed.error.issues.flatMap((i) =>
    i.code === 'unrecognized_keys'
      ? i.keys.map((k) => ({ path: jsonPath([...i.path, k]), message: `Unknown field '${k}'.` }))
      : [{ path: jsonPath(i.path), message: i.message }],
  );
  return { ok: false, response: apiError('VALIDATION_FAILED', `${issues[0]?.path}: ${issues[0]?.message}`, issues) };
}

/** A site API token may only act on its own site. */
export function tokenSiteMismatch(locals: App.Locals, siteId: string | undefined): Response | null {
  if (locals.apiToken && locals.apiToken.siteId !== siteId) {
    return apiError('FORBIDDEN', 'This API token belongs to another site.');
  }
  return null;
}
