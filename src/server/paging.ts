/**
 * The cursors of /api/v1's paged lists (schemas in src/lib/api/paging.ts): opaque base64url text of
 * the list's name and the sort key of the last item given. A cursor this API did not give for that
 * list is refused with 400 VALIDATION_FAILED naming the cursor.
 */
import { AppError } from './errors';
import type { CursorKey, Page, PageQuery } from '~/lib/api/paging';

const VERSION = 1;

const toBase64Url = (text: string) => Buffer.from(text, 'utf8').toString('base64url');

function fromBase64Url(text: string): string {
  if (!/^[A-Za-z0-9_-]+$/.test(text)) throw new Error('not base64url');
  return new TextDecoder('utf-8', { fatal: true }).decode(Buffer.from(text, 'base64url'));
}

/** The cursor that continues after an item with this sort key, for the list named `list`. */
export function encodeCursor(list: string, key: CursorKey): string {
  return toBase64Url(JSON.stringify({ v: VERSION, l: list, k: key }));
}

function badCursor(why: string): AppError {
  return new AppError('VALIDATION_FAILED', `cursor: ${why}. Send the nextCursor of the page before, unchanged, or leave cursor out for the first page.`, [
    { path: 'cursor', message: `cursor: ${why}` },
  ]);
}

/**
 * The sort key a cursor holds, or null when no cursor was sent. A cursor that this API did not give
 * for this list (edited, cut short, from another list) is refused with a clear 400.
 */
export function decodeCursor(list: string, cursor: string | undefined, keyLength: number, sound: (key: CursorKey) => boolean = () => true): CursorKey | null {
  if (cursor === undefined) return null;
  let parsed: unknown;
  try {
    parsed = JSON.parse(fromBase64Url(cursor));
  } catch {
    throw badCursor('is not a cursor this API gave');
  }
  const p = parsed as { v?: unknown; l?: unknown; k?: unknown };
  if (!p || typeof p !== 'object' || p.v !== VERSION || !Array.isArray(p.k)) throw badCursor('is not a cursor this API gave');
  if (p.l !== list) throw badCursor('belongs to another list');
  if (p.k.length !== keyLength || !p.k.every((x) => x === null || typeof x === 'string' || (typeof x === 'number' && Number.isFinite(x)))) {
    throw badCursor('is not a cursor this API gave');
  }
  if (!sound(p.k as CursorKey)) throw badCursor('is not a cursor this API gave');
  return p.k as CursorKey;
}

/** Compares two sort keys element by element (null first, numbers by value, text by code points). */
export function compareKeys(a: CursorKey, b: CursorKey): number {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const x = a[i] ?? null;
    const y = b[i] ?? null;
    if (x === y) continue;
    if (x === null) return -1;
    if (y === null) return 1;
    if (typeof x === 'number' && typeof y === 'number') return x - y;
    const sx = String(x);
    const sy = String(y);
    return sx < sy ? -1 : 1;
  }
  return 0;
}

/**
 * A page of rows a query fetched in its sort order with one more than the limit (`limit + 1`): the
 * first `limit`, and the cursor after the last of them when there were more.
 */
export function pageFromRows<T>(list: string, rows: readonly T[], limit: number, keyOf: (row: T) => CursorKey): Page<T> {
  const items = rows.slice(0, limit);
  const more = rows.length > limit && items.length > 0;
  return { items, nextCursor: more ? encodeCursor(list, keyOf(items[items.length - 1]!)) : null };
}

/**
 * A page of a list held whole in memory, sorted ascending by `keyOf` (a key unique per item, e.g.
 * ending with the id): the items after the cursor's key, at most `limit`.
 */
export function pageOfArray<T>(list: string, all: readonly T[], query: PageQuery, keyLength: number, keyOf: (item: T) => CursorKey): Page<T> {
  const sorted = [...all].sort((a, b) => compareKeys(keyOf(a), keyOf(b)));
  const after = decodeCursor(list, query.cursor, keyLength);
  const rest = after ? sorted.filter((x) => compareKeys(keyOf(x), after) > 0) : sorted;
  return pageFromRows(list, rest, query.limit, keyOf);
}
