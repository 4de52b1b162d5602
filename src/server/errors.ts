/**
 * Error codes of Lossline's HTTP API. A code never changes once published; the message says what
 * happened, why, and what to do. Every error body has one shape: { error: { code, message, issues? } }.
 */
export const ERROR_CODES = {
  UNAUTHENTICATED: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  METHOD_NOT_ALLOWED: 405,
  NO_POLICY: 500,
  VALIDATION_FAILED: 400,
  CONFLICT: 409,
  PAYLOAD_TOO_LARGE: 413,
  UNPROCESSABLE: 422,
  INTERNAL: 500,
} as const;

export type ErrorCode = keyof typeof ERROR_CODES;

export function apiError(code: ErrorCode, message: string, issues?: unknown, status?: number): Response {
  return Response.json({ error: { code, message, ...(issues ? { issues } : {}) } }, { status: status ?? ERROR_CODES[code] });
}
