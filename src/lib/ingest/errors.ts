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
  'BLANK_LINES',
  'NO_NUMBERS',
  'MOSTLY_REJECTED',
  'LAYOUT_QUESTION',
  'TIMES_OUTSIDE_WINDOW',
  'BAD_TAG_NAME',
  'HASH_MISMATCH',
  'SIZE_MISMATCH',
  'UNSTORABLE_TEXT',
  'READER_FAULT',
] as const;

export type IngestErrorCode = (typeof INGEST_ERROR_CODES)[number];

/**
 * The catalogue: every code that can stop a file, with what it means in one line. The message of
 * each error adds the facts of the file at hand (lines, names, counts, examples).
 */
export const INGEST_ERROR_CATALOGUE: Record<IngestErrorCode, string> = {
  EMPTY_FILE: 'The file holds no text (0 bytes or blank lines only).',
  BINARY_FILE: 'The file is not text (a spreadsheet, archive or image).',
  HEADER_ONLY: 'The file has header lines but no data rows.',
  NO_TIME_COLUMN: 'No column holds times.',
  NO_VALUE_COLUMNS: 'No column holds values.',
  DUPLICATE_HEADERS: 'Two columns have the same name.',
  RECORD_TOO_LONG: 'A record is longer than 1 MiB (not a CSV export, a wrong separator or a quote never closed).',
  UNTERMINATED_QUOTE: 'A quote is opened and never closed.',
  DATE_ORDER_UNDECIDED: 'The dates read both day-first and month-first.',
  INVALID_PROFILE: 'The layout given for the file is not valid.',
  INVALID_TIME_ZONE: "The site's time zone is not known.",
  INVALID_OPTIONS: 'The reading options are not valid.',
  BLANK_LINES: 'The start of the file holds only blank lines where data should be.',
  NO_NUMBERS: 'Rows have times but no value cell holds a number (NaN, error words).',
  MOSTLY_REJECTED: 'Most values of the file were rejected: the layout (decimal mark, columns) does not fit the file.',
  LAYOUT_QUESTION: 'The layout is not certain for this file: a person must answer a question before it is read.',
  TIMES_OUTSIDE_WINDOW: "Every row's time lies outside the accepted window.",
  BAD_TAG_NAME: 'A tag name is too long or holds control characters.',
  HASH_MISMATCH: 'The stored bytes do not match the SHA-256 declared for them.',
  SIZE_MISMATCH: 'The stored file does not have the size or type declared for it.',
  UNSTORABLE_TEXT: 'The file holds text the database cannot store.',
  READER_FAULT: 'The reader failed on this file (a fault in Lossline, not in the file).',
};

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
