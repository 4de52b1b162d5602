import type { ReactNode } from 'react';
import { isHead, num, tableClass, type Column as ColumnOf } from './columns';

/** A column head of a GridTable (src/components/ui/columns.ts); its label may hold markup. */
export type Column = ColumnOf<ReactNode>;
export { num };

/** The head of a column of row buttons: named for screen readers, blank on screen. */
export const ACTIONS: Column = { label: <span className="sr-only">Actions</span> };

/**
 * The product's data table (class grid-table of src/styles/global.css; the pages' twin is
 * GridTable.astro): one head row of `columns` and the rows given as children. `className` adds to
 * grid-table; `testId` is its data-testid; `caption` a line above it that says what its figures are in.
 */
export function GridTable({ columns, className, testId, caption, children }: { columns: Column[]; className?: string; testId?: string; caption?: ReactNode; children: ReactNode }) {
  return (
    <table className={tableClass(className)} data-testid={testId}>
      {caption !== undefined && <caption className="mb-1 text-left text-ink-soft">{caption}</caption>}
      <thead>
        <tr>
          {columns.map((c, i) =>
            isHead(c) ? (
              <th key={i} className={c.className}>
                {c.label}
                {c.sub !== undefined && <span className="block text-xs font-normal">{c.sub}</span>}
              </th>
            ) : (
              <th key={i}>{c}</th>
            ),
          )}
        </tr>
      </thead>
      <tbody>{children}</tbody>
    </table>
  );
}
