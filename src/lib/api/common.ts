/**
 * Pieces the answer schemas of /api/v1 share (src/lib/api/*.ts): one file per area, each schema being
 * both the documented answer (spec.answers, from which /api/v1/openapi.json is generated) and the type
 * the route must return (src/server/answer.ts).
 */
import { z } from 'zod';

export const Id = z.uuid();
export const Instant = z.iso.datetime({ offset: true }).describe('An ISO 8601 instant (UTC, with Z).');
export const Currency = z.string().describe('ISO 4217 code, e.g. EUR');
/** A figure that may be absent (not computed, no data). */
export const Num = z.number().nullable();
