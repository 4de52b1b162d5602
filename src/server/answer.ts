import type { z } from 'zod';

/**
 * A JSON answer typed by the zod schema that describes it in the OpenAPI document (spec.answers):
 * the value must have the schema's type, so the handler and the document cannot drift apart. The
 * value is not parsed again at run time; the contract test (tests/api/contract.test.ts) checks real
 * answers against the document.
 */
export function answer<S extends z.ZodType>(_schema: S, value: z.output<S>, init?: ResponseInit): Response {
  return Response.json(value, init);
}
