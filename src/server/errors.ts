import { BaselineError } from '~/lib/analytics/baseline';
import { BalanceInputError } from '~/lib/equipment/errors';
import { IngestError } from '~/lib/ingest/errors';
import { NoConvergenceError, ThermoRangeError } from '~/lib/thermo/errors';
import { UnitError } from '~/lib/units/errors';
import type { Issue } from '~/lib/zod-words';
import { isOneOf } from '~/lib/one-of';

/**
 * Error codes of Lossline's HTTP API: a small closed list. A code never changes once published; the
 * message says what happened, why, and what to do. Every error body has one shape:
 * { error: { code, message, issues? } }, issues being [{ path, message }].
 */
export const ERROR_CODES = [
  'VALIDATION_FAILED',
  'UNAUTHENTICATED',
  'FORBIDDEN',
  'NOT_FOUND',
  'METHOD_NOT_ALLOWED',
  'CONFLICT',
  'PAYLOAD_TOO_LARGE',
  'UNPROCESSABLE',
  'RATE_LIMITED',
  'INTERNAL',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

/** The HTTP status each code answers with. */
export const ERROR_STATUS: Record<ErrorCode, number> = {
  VALIDATION_FAILED: 400,
  UNAUTHENTICATED: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  METHOD_NOT_ALLOWED: 405,
  CONFLICT: 409,
  PAYLOAD_TOO_LARGE: 413,
  UNPROCESSABLE: 422,
  RATE_LIMITED: 429,
  INTERNAL: 500,
};

export type { Issue };

/** The one error a service or endpoint throws on purpose; the endpoint wrapper answers it in the API's shape. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly issues?: readonly Issue[],
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export function isErrorCode(code: unknown): code is ErrorCode {
  return isOneOf(ERROR_CODES, code);
}

export function apiError(code: ErrorCode, message: string, issues?: readonly Issue[], status?: number): Response {
  return Response.json({ error: { code, message, ...(issues && issues.length ? { issues } : {}) } }, { status: status ?? ERROR_STATUS[code] });
}

/**
 * The domain errors of src/lib (which may not import the server) as an AppError, or null for an
 * error that is not one of them. A unit text is a person's input (400); the others say the input
 * cannot be worked with (422).
 */
export function fromDomainError(err: unknown): AppError | null {
  if (err instanceof AppError) return err;
  if (err instanceof UnitError) return new AppError('VALIDATION_FAILED', err.message);
  if (err instanceof IngestError || err instanceof BaselineError || err instanceof BalanceInputError) return new AppError('UNPROCESSABLE', err.message);
  if (err instanceof ThermoRangeError || err instanceof NoConvergenceError) return new AppError('UNPROCESSABLE', err.message);
  return null;
}
