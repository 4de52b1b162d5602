/**
 * zod's findings in words a person reads (the API's errors, a plant model file's problems): "from: must be a date and time like 2025-05-12T06:00Z",
 * never a regular expression or a text of zod's own. Where a schema gave no message of its own, the
 * words come from `wordsFor`. A message that starts in lower case ("must be ...", "is required") is
 * said of the field and gets the field's name in front; one that starts otherwise ("Give the person a
 * name.") is a whole sentence and is kept as written.
 */
import type { z } from 'zod';

/** One problem with one field: where (a JSON path such as $.units[2].name, or a parameter's name) and what. */
export interface Issue {
  path: string;
  message: string;
}

type RawIssue = z.core.$ZodRawIssue;

const TYPE_WORDS: Record<string, string> = {
  string: 'must be text',
  number: 'must be a number',
  int: 'must be a whole number',
  boolean: 'must be true or false',
  object: 'must be an object of named fields',
  array: 'must be a list',
  date: 'must be a date',
  bigint: 'must be a whole number',
};

const FORMAT_WORDS: Record<string, string> = {
  datetime: 'must be a date and time like 2025-05-12T06:00Z',
  date: 'must be a date like 2025-05-12',
  time: 'must be a time of day like 06:00',
  uuid: 'must be an id (a UUID)',
  guid: 'must be an id (a UUID)',
  email: 'must be an e-mail address',
  url: 'must be a web address',
};

function sizeWords(kind: 'least' | 'most', origin: unknown, limit: unknown, inclusive: unknown): string {
  const n = Number(limit);
  if (origin === 'string') return kind === 'least' && n === 1 ? 'must not be empty' : `must have at ${kind} ${n} characters`;
  if (origin === 'array' || origin === 'set') return `must list at ${kind} ${n} entries`;
  if (origin === 'file') return `must be at ${kind} ${n} bytes`;
  if (inclusive === false) return kind === 'least' ? `must be more than ${n}` : `must be less than ${n}`;
  return `must be at ${kind} ${n}`;
}

function show(v: unknown): string {
  return typeof v === 'string' ? v : JSON.stringify(v);
}

/** The words for one issue zod found, without the field's name. */
function wordsFor(iss: RawIssue): string {
  const i = iss as RawIssue & Record<string, unknown>;
  switch (iss.code) {
    case 'invalid_type':
      return i.input === undefined ? 'is required' : (TYPE_WORDS[String(i.expected)] ?? `must be ${String(i.expected)}`);
    case 'invalid_format':
      return FORMAT_WORDS[String(i.format)] ?? 'is not in the expected form';
    case 'too_small':
      return sizeWords('least', i.origin, i.minimum, i.inclusive);
    case 'too_big':
      return sizeWords('most', i.origin, i.maximum, i.inclusive);
    case 'invalid_value': {
      const values = (i.values as unknown[] | undefined) ?? [];
      return values.length === 1 ? `must be ${show(values[0])}` : `must be one of ${values.map(show).join(', ')}`;
    }
    case 'not_multiple_of':
      return `must be a multiple of ${String(i.divisor)}`;
    case 'invalid_union':
      return 'does not match any of the allowed forms';
    case 'invalid_key':
    case 'invalid_element':
      return 'has an entry that is not allowed';
    case 'unrecognized_keys':
      return 'has fields that are not known here';
    default:
      return 'is not valid';
  }
}

/** The per-parse error map: zod uses it where a schema gave no message of its own. */
export const humanErrorMap = (iss: RawIssue) => wordsFor(iss);

/** Something in a message that reads like a regular expression (a pattern a person cannot act on). */
export const LOOKS_LIKE_REGEX = /\/\^|\$\/|\\[dDsSwWbB]|\(\?[:=!<]|\[\^|\]\{\d|\]\+|\]\*|\{\d+,\d*\}/;

/** Where an issue sits: the body's fields as JSON paths ($.units[2].name), a parameter by its name. */
export type Where = 'body' | 'query' | 'params';

function pathOf(where: Where, path: readonly PropertyKey[]): string {
  if (where === 'body') return jsonPath(path);
  return path.length ? path.map(String).join('.') : where === 'query' ? 'query' : 'path';
}

function labelOf(where: Where, path: readonly PropertyKey[]): string {
  if (!path.length) return where === 'body' ? 'The request body' : where === 'query' ? 'The query' : 'The path';
  return where === 'body' ? jsonPath(path).slice(2) : path.map(String).join('.');
}

/** zod's issues as { path, message }, each message naming its field. */
export function humanIssues(error: z.ZodError, where: Where): Issue[] {
  return error.issues.flatMap((i): Issue[] => {
    if (i.code === 'unrecognized_keys') {
      return i.keys.map((k) => ({ path: pathOf(where, [...i.path, k]), message: `Unknown field '${k}'.` }));
    }
    const label = labelOf(where, i.path);
    let message = /^[a-z]/.test(i.message) ? `${label}: ${i.message}` : i.message;
    if (LOOKS_LIKE_REGEX.test(message)) message = `${label}: is not in the expected form`;
    return [{ path: pathOf(where, i.path), message }];
  });
}

/** One sentence for the whole answer: the first issue, and how many more are listed. */
export function summary(issues: readonly Issue[]): string {
  const first = issues[0]?.message ?? 'The request is not valid.';
  return issues.length > 1 ? `${first} (and ${issues.length - 1} more, listed in issues)` : first;
}

/** '$.units[2].name' from ['units', 2, 'name']. */
export function jsonPath(parts: readonly PropertyKey[]): string {
  return (
    '$' +
    parts
      .map((p) => (typeof p === 'number' ? `[${p}]` : /^[A-Za-z_$][\w$]*$/.test(String(p)) ? `.${String(p)}` : `[${JSON.stringify(String(p))}]`))
      .join('')
  );
}
