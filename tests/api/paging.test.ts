/** Cursor paging of /api/v1's lists (src/server/paging.ts): pages neither repeat nor skip, and a cursor the API did not give is a clear 400. */
import { expect, it } from 'vitest';
import { PageQuery } from '~/lib/api/paging';
import { AppError } from '~/server/errors';
import { decodeCursor, encodeCursor, pageOfArray } from '~/server/paging';

const items = Array.from({ length: 23 }, (_, i) => ({ id: `id-${String(i).padStart(2, '0')}`, name: `Unit ${i % 5}` }));
const key = (u: { id: string; name: string }) => [u.name, u.id] as const;

function walk(limit: number) {
  const seen: string[] = [];
  let cursor: string | undefined;
  let pages = 0;
  do {
    const page = pageOfArray('units', items, PageQuery.parse({ limit: String(limit), cursor }), 2, key);
    expect(page.items.length).toBeLessThanOrEqual(limit);
    seen.push(...page.items.map((u) => u.id));
    cursor = page.nextCursor ?? undefined;
    pages++;
  } while (cursor);
  return { seen, pages };
}

it('walks a list page by page in key order, each item once, the last page without a next cursor', () => {
  for (const limit of [1, 4, 10, 23, 100]) {
    const { seen, pages } = walk(limit);
    expect(new Set(seen).size).toBe(items.length);
    expect(seen).toEqual([...items].sort((a, b) => (a.name + a.id < b.name + b.id ? -1 : 1)).map((u) => u.id));
    expect(pages).toBe(Math.max(1, Math.ceil(items.length / limit)));
  }
});

it('keeps its place when items are added before the cursor while a client pages', () => {
  const first = pageOfArray('units', items, PageQuery.parse({ limit: '5' }), 2, key);
  const grown = [{ id: 'id-new', name: 'Unit 0' }, ...items];
  const second = pageOfArray('units', grown, PageQuery.parse({ limit: '5', cursor: first.nextCursor! }), 2, key);
  expect(second.items.map((u) => u.id)).not.toContain(first.items[4]!.id);
  expect(second.items[0]!.name + second.items[0]!.id > first.items[4]!.name + first.items[4]!.id).toBe(true);
});

it('answers 400 VALIDATION_FAILED naming the cursor for a cursor it did not give', () => {
  const bad = ['not a cursor!', 'eyJ2IjoxfQ', encodeCursor('notices', ['x', 'y']), encodeCursor('units', ['only one']), Buffer.from('{"v":1,"l":"units","k":[{},1]}').toString('base64url')];
  for (const cursor of bad) {
    let err: unknown;
    try {
      pageOfArray('units', items, PageQuery.parse({ cursor }), 2, key);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).code).toBe('VALIDATION_FAILED');
    expect((err as AppError).message).toMatch(/^cursor: /);
    expect((err as AppError).issues?.[0]?.path).toBe('cursor');
  }
  expect(() => decodeCursor('uploads', encodeCursor('uploads', ['2026-01-01', 'z']), 2, ([, id]) => id === 'ok')).toThrow(/cursor/);
});

it('refuses a limit outside 1..500 and takes 100 when it is left out', () => {
  expect(PageQuery.parse({}).limit).toBe(100);
  expect(PageQuery.safeParse({ limit: '0' }).success).toBe(false);
  expect(PageQuery.safeParse({ limit: '501' }).success).toBe(false);
  expect(PageQuery.safeParse({ limit: 'ten' }).success).toBe(false);
});
