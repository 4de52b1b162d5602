/**
 * Typed errors of the ingest core. A fatal problem with a file stops the whole file and throws
 * {@link IngestError}; per-row problems never throw, they are counted in the read report instead.
 *
 * Every message says what happened, why, and what the operator can do, in the manner of an error
 * catalogue: the `code` is permanent once published, the message may be improved.
 */
export const INGEST_ERROR_CODES = [
  'EMPTY_FILE',
  'BINARY_FILE',
  'HEADER_ONLY',
  'NO_TIME_COLUMN',
  'NO_VALUE_COLUMNS',
  'DUPLICATE_HEADERS',
  'RECORD_TOO_LONG',
  'UNTERMINATED_QUOTE',
  'DATE_ORDER_UNDECIDED',
  'INVALID_PROFILE',
  'INVALID_TIME_ZONE',
  'INVALID_OPTIONS',
] as const;

export type IngestErrorCode = (typeof INGEST_ERROR_CODES)[number];

export class IngestError extends Error {
  readonly code: IngestErrorCode;
  /** 1-based physical line of the file where the problem was found, when known. */
  readonly line: number | null;
  /** Extra facts for the operator (duplicated names, the offending length ...). */
  readonly details: Record<string, unknown>;
  constructor(code: IngestErrorCode, message: string, details: Record<string, unknown> = {}, line: number | null = null) {
    super(message);
    this.name = 'IngestError';
    this.code = code;
    this.line = line;
    this.details = details;
  }
}
