/**
 * The success answer of an /api/v1 route, typed by the zod schema the route declares in
 * `spec.answers` (src/lib/api/): the value must be of the schema's type, so the route and its
 * documented answer cannot drift apart at compile time; the route tests parse every answer with the
 * same schema at run time.
 */
import type { z } from 'zod';

export function answer<S extends z.ZodType>(_schema: S, value: z.input<S>, init?: ResponseInit): Response {
  return Response.json(value, init);
}
