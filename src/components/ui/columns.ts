/**
 * The column heads of the product's data tables, shared by the islands' GridTable.tsx and the pages'
 * GridTable.astro: a head is its text, or { label, className, sub } for a numeric column ('num':
 * right-aligned, its unit in the head; the a11y walk checks numeric heads are) or a second, small line.
 */
export interface Head<L> {
  label: L;
  className?: string;
  /** A second line in small type under the label. */
  sub?: string;
}
export type Column<L = string> = L | Head<L>;

/** A numeric column's head: right-aligned. */
export const num = <L>(label: L): Head<L> => ({ label, className: 'num' });

export const isHead = <L>(c: Column<L>): c is Head<L> => typeof c === 'object' && c !== null && 'label' in c;

/** The grid-table's class with any the caller adds. */
export const tableClass = (extra?: string) => (extra ? `grid-table ${extra}` : 'grid-table');
