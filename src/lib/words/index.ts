/**
 * The word catalogue: every code and identifier that Lossline keeps in its API and database, with the
 * label and sentence a person reads and the kind of number it carries. The API keeps the codes; every
 * screen, mail, PDF and report for people shows these words (docs/design.md, "Words, not codes").
 *
 * `wordsFor(code)` finds the entry of any code; `inputWords('steam in.T_K')` names an entry of the
 * balance's input vector; `CODE_PATTERN` matches a code or identifier left in visible text (for the
 * end-to-end checks of every page). tests/words/catalogue.test.ts enumerates the codes from their
 * source lists and fails when one has no entry.
 */
import { INGEST_ERROR_CATALOGUE, INGEST_ERROR_CODES, type IngestErrorCode } from '../ingest/errors';
import { APP_ERROR_WORDS, BALANCE_ERROR_WORDS, ENGINE_PROBLEM_WORDS, HOUR_REASON_WORDS, INGEST_WARNING_WORDS, PLANT_STATUS_WORDS, UNIT_ERROR_WORDS } from './codes';
import { BASELINE_TERM_WORDS, FIGURE_WORDS, INPUT_WORDS, PARAMETER_WORDS } from './identifiers';
import * as S from './states';
import { code, type WordEntry } from './types';

export type { WordEntry, WordQuantity } from './types';
export * from './codes';
export * from './identifiers';
export * from './states';

const INGEST_ERROR_LABELS: Record<IngestErrorCode, string> = {
  EMPTY_FILE: 'empty file',
  BINARY_FILE: 'not a text file',
  HEADER_ONLY: 'header without rows',
  NO_TIME_COLUMN: 'no time column',
  NO_VALUE_COLUMNS: 'no value columns',
  DUPLICATE_HEADERS: 'repeated column names',
  RECORD_TOO_LONG: 'row too long',
  UNTERMINATED_QUOTE: 'quote never closed',
  DATE_ORDER_UNDECIDED: 'day and month order unclear',
  INVALID_PROFILE: 'layout not valid',
  INVALID_TIME_ZONE: 'time zone not known',
  INVALID_OPTIONS: 'reading options not valid',
  BLANK_LINES: 'blank lines only',
  NO_NUMBERS: 'no numbers',
  MOSTLY_REJECTED: 'most values rejected',
  LAYOUT_QUESTION: 'layout needs your answer',
  TIMES_OUTSIDE_WINDOW: 'times outside the window',
  BAD_TAG_NAME: 'unusable tag name',
  HASH_MISMATCH: 'file changed on the way',
  SIZE_MISMATCH: 'file size differs',
  UNSTORABLE_TEXT: 'text that cannot be stored',
  READER_FAULT: 'fault while reading',
};

/** Codes that stop a file (src/lib/ingest/errors.ts), with the catalogue's sentence. */
export const INGEST_ERROR_WORDS = Object.fromEntries(INGEST_ERROR_CODES.map((c) => [c, code(INGEST_ERROR_LABELS[c], INGEST_ERROR_CATALOGUE[c])])) as Record<IngestErrorCode, WordEntry>;

/** Every UPPER_SNAKE code, by domain (one code may sit in two domains with the same meaning). */
export const CODE_DOMAINS = {
  hourReason: HOUR_REASON_WORDS,
  engineProblem: ENGINE_PROBLEM_WORDS,
  balanceError: BALANCE_ERROR_WORDS,
  plantStatus: PLANT_STATUS_WORDS,
  unitError: UNIT_ERROR_WORDS,
  ingestWarning: INGEST_WARNING_WORDS,
  ingestError: INGEST_ERROR_WORDS,
  appError: APP_ERROR_WORDS,
} as const satisfies Record<string, Record<string, WordEntry>>;

/** Every identifier and stored word, by domain. */
export const IDENTIFIER_DOMAINS = {
  figure: FIGURE_WORDS,
  input: INPUT_WORDS,
  parameter: PARAMETER_WORDS,
  baselineTerm: BASELINE_TERM_WORDS,
  hourState: S.HOUR_STATE_WORDS,
  uploadState: S.UPLOAD_STATE_WORDS,
  noticeStatus: S.NOTICE_STATUS_WORDS,
  noticeKind: S.NOTICE_KIND_WORDS,
  noticeLife: S.NOTICE_LIFE_WORDS,
  noticeTrend: S.NOTICE_TREND_WORDS,
  closeOutcome: S.CLOSE_OUTCOME_WORDS,
  priorReason: S.PRIOR_REASON_WORDS,
  balanceRole: S.BALANCE_ROLE_WORDS,
  portDirection: S.PORT_DIRECTION_WORDS,
  unitKind: S.UNIT_KIND_WORDS,
  slot: S.SLOT_WORDS,
  fluid: S.FLUID_WORDS,
  linkQuantity: S.LINK_QUANTITY_WORDS,
  quantity: S.QUANTITY_WORDS,
} as const satisfies Record<string, Record<string, WordEntry>>;

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

/** The entry of a code or identifier in any domain (codes first), or undefined. */
export function wordsFor(key: string): WordEntry | undefined {
  for (const d of Object.values(CODE_DOMAINS)) if (has(d, key)) return (d as Record<string, WordEntry>)[key];
  for (const d of Object.values(IDENTIFIER_DOMAINS)) if (has(d, key)) return (d as Record<string, WordEntry>)[key];
  return undefined;
}

/** The label of a code or identifier; a key without an entry shows as "other" rather than as a code. */
export function labelOf(key: string, fallback = 'other'): string {
  return wordsFor(key)?.label ?? fallback;
}

/** The sentence of a code or identifier, or ''. */
export function sentenceOf(key: string): string {
  return wordsFor(key)?.sentence ?? '';
}

/**
 * An entry of the balance's input vector in words: 'steam in.T_K' gives 'steam in: temperature' and
 * the quantity 'temperature'; 'generatorEfficiency' gives 'generator efficiency'.
 */
export function inputWords(name: string): { label: string; quantity: WordEntry['quantity'] } {
  const dot = name.lastIndexOf('.');
  const [port, id] = dot > 0 ? [name.slice(0, dot), name.slice(dot + 1)] : [null, name];
  const e = (has(INPUT_WORDS, id) ? (INPUT_WORDS as Record<string, WordEntry>)[id] : undefined) ?? wordsFor(id);
  const label = e?.label ?? 'value';
  return { label: port ? `${port}: ${label}` : label, quantity: e?.quantity ?? 'none' };
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Stored words whose hyphenated form is also plain English and may stand in text. */
const ENGLISH_HYPHENS = new Set(['flue-gas', 'motor-generator', 'let-down-valve', 'fuel-gas']);

/**
 * The codes and identifiers a person must never read: every UPPER_SNAKE code, every identifier with
 * an underscore, a camelCase hump, a caret or a star, and the hyphenated stored words that are no
 * English. Plain words ('open', 'load', 'turbine') are left out: they are words already.
 */
export function catalogueKeys(): string[] {
  const keys = new Set<string>();
  for (const d of Object.values(CODE_DOMAINS)) for (const k of Object.keys(d)) keys.add(k);
  for (const d of Object.values(IDENTIFIER_DOMAINS))
    for (const k of Object.keys(d)) {
      const coded = /_|[a-z][A-Z]|[\^*]/.test(k) || (k.includes('-') && !ENGLISH_HYPHENS.has(k));
      if (coded) keys.add(k);
    }
  return [...keys].sort((a, b) => b.length - a.length);
}

/**
 * Matches in visible text: a catalogue code or identifier as a whole word, an engine identifier with
 * an SI suffix (`xyz_W`, `abc_kg_per_s`), a slot count ("1..1", "0..n"), "[SI]", or a number in
 * e-notation ("-9.19541e-12"). Tag names (upper case with underscores, "HM_HP_TI202") are not codes
 * and do not match unless they equal one.
 */
export const CODE_PATTERN = new RegExp(
  [
    `(?<![\\w-])(?:${catalogueKeys().map(escape).join('|')})(?![\\w-])`,
    '\\b[a-z][A-Za-z0-9]*_(?:W|K|Pa|kg_per_s|J_per_kg|J_per_kgK|W_per_K|pct|per_h|m)\\b',
    '\\b\\d+\\.\\.(?:\\d+|n)\\b',
    '\\[SI\\]',
    '-?\\d(?:\\.\\d+)?e[+-]\\d+\\b',
  ].join('|'),
);

/** The first code or identifier found in a text, or null. */
export function findCode(text: string): string | null {
  return CODE_PATTERN.exec(text)?.[0] ?? null;
}
