/**
 * Cursor paging of the lists under /api/v1 that can grow (units, notices, baselines, uploads): a list
 * answers `{ items, nextCursor }`; `nextCursor` is null on the last page, else the text to send as
 * `?cursor=` for the next one, with the same `limit`. A cursor is opaque to clients: it holds the
 * sort key of the last item given (keyset paging), so a page never repeats or skips an item that was
 * there when the first page was read, whatever is added meanwhile.
 *
 * Pure: the query and answer schemas. The cursors themselves: src/server/paging.ts.
 */
import { z } from 'zod';

/** Items per page when `limit` is left out, and the most one page may hold. */
export const DEFAULT_PAGE_LIMIT = 100;
export const MAX_PAGE_LIMIT = 500;

/** What a cursor holds: the sort key of the last item of the page before, as strings and numbers. */
export type CursorKey = readonly (string | number | null)[];

/** The paging part of a list's query string. */
export const PageQuery = z.object({
  limit: z.coerce
    .number()
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(MAX_PAGE_LIMIT, `must be at most ${MAX_PAGE_LIMIT}`)
    .default(DEFAULT_PAGE_LIMIT),
  cursor: z.string().max(1000, 'is not a cursor this API gave (too long)').optional(),
});
export type PageQuery = z.infer<typeof PageQuery>;

/** A page of a list: its items, and the cursor of the next page (null on the last). */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({
    items: z.array(item),
    nextCursor: z.string().nullable().describe('Send as ?cursor= (with the same limit) for the next page; null on the last page.'),
  });
export interface Page<T> {
  items: T[];
  nextCursor: string | null;
}
