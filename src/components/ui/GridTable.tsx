import type { ReactNode } from 'react';

/**
 * A column head of a GridTable: its text, or { label, className } for a numeric column ('num',
 * right-aligned, its unit in the head) or another class.
 */
export type Column = ReactNode | { label: ReactNode; className?: string };

/** A numeric column's head: right-aligned (the a11y walk checks numeric heads are). */
export const num = (label: ReactNode): Column => ({ label, className: 'num' });

/** The head of a column of row buttons: named for screen readers, blank on screen. */
export const ACTIONS: Column = { label: <span className="sr-only">Actions</span> };

const isHead = (c: Column): c is { label: ReactNode; className?: string } => typeof c === 'object' && c !== null && 'label' in c;

/**
 * The product's data table (class grid-table of src/styles/global.css): one head row of `columns`
 * and the rows given as children. `className` adds to grid-table; `testId` is its data-testid;
 * `caption` a line above it that says what its figures are in.
 */
export function GridTable({ columns, className, testId, caption, children }: { columns: Column[]; className?: string; testId?: string; caption?: ReactNode; children: ReactNode }) {
  return (
    <table className={className ? `grid-table ${className}` : 'grid-table'} data-testid={testId}>
      {caption !== undefined && <caption className="mb-1 text-left text-ink-soft">{caption}</caption>}
      <thead>
        <tr>
          {columns.map((c, i) =>
            isHead(c) ? (
              <th key={i} className={c.className}>
                {c.label}
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
