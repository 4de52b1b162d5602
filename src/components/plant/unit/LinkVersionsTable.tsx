import type { ReactNode } from 'react';
import { LINK_QUANTITIES } from '~/lib/plant/kinds';
import type { LinkVersionAnswer } from '~/lib/plant/link-version';
import { showInstant } from '../common';
import { GridTable } from '~/components/ui/GridTable';

type Link = LinkVersionAnswer;

/** Change and end a link (for those who edit). */
export interface LinkActions {
  canEdit: boolean;
  onChange: (l: Link) => void;
  onEnd: (l: Link) => void;
}

interface Column {
  head: ReactNode;
  cell: (l: Link) => ReactNode;
  className?: string;
}

function uncertaintyText(l: Link): string {
  return l.uncertaintyMode === 'relative' ? `${l.uncertainty} %` : `${l.uncertainty} ${l.engUnit}`;
}

function rangeText(l: Link): string {
  return l.validMin !== null || l.validMax !== null ? `${l.validMin ?? '…'} to ${l.validMax ?? '…'}` : '';
}

function actionCell(l: Link, a: LinkActions): ReactNode {
  if (!a.canEdit) return null;
  return (
    <>
      <button type="button" className="btn py-0.5 text-xs" aria-label={`Change the link of ${l.tagName}`} onClick={() => a.onChange(l)}>
        Change…
      </button>{' '}
      <button type="button" className="btn py-0.5 text-xs" aria-label={`End the link of ${l.tagName}`} onClick={() => a.onEnd(l)}>
        End
      </button>
    </>
  );
}

/** The columns: where, what and which tag for every version; figures and actions for the current ones, the end for history. */
function columns(timeZone: string, actions: LinkActions | null): Column[] {
  const at: Column = { head: 'At', cell: (l) => l.portName ?? 'unit' };
  const tag: Column = { head: 'Tag', cell: (l) => l.tagName, className: 'font-mono text-xs' };
  const unit: Column = { head: 'Unit', cell: (l) => l.engUnit };
  const from = (head: string): Column => ({ head: `${head} (${timeZone})`, cell: (l) => showInstant(l.validFrom, timeZone), className: 'whitespace-nowrap' });
  if (!actions) {
    const quantity: Column = { head: 'Quantity', cell: (l) => LINK_QUANTITIES[l.quantity].label };
    const until: Column = { head: 'Until', cell: (l) => (l.validTo ? showInstant(l.validTo, timeZone) : 'open'), className: 'whitespace-nowrap' };
    return [at, quantity, tag, unit, from('From'), until];
  }
  return [
    at,
    { head: 'Quantity', cell: (l) => `${LINK_QUANTITIES[l.quantity].label}${l.basis ? ` (${l.basis})` : ''}` },
    tag,
    unit,
    { head: 'Uncertainty', cell: uncertaintyText },
    { head: 'Valid range', cell: rangeText },
    from('Valid from'),
    { head: <span className="sr-only">Actions</span>, cell: (l) => actionCell(l, actions), className: 'whitespace-nowrap text-right' },
  ];
}

/**
 * Versions of the unit's tag links. With `actions`: the links that hold now, with a change and an end
 * button per row for those who edit. Without: every version of every link, a version that never held
 * struck through.
 */
export default function LinkVersionsTable({ links, timeZone, actions = null }: { links: Link[]; timeZone: string; actions?: LinkActions | null }) {
  const current = actions !== null;
  if (current && links.length === 0) return <p className="text-sm text-ink-faint">No tag is linked now.</p>;
  const cols = columns(timeZone, actions);
  return (
    <div className={current ? 'overflow-x-auto' : 'mt-2 overflow-x-auto'}>
      <GridTable testId={current ? 'links-table' : 'history-table'} columns={cols.map((c) => c.head)}>
          {links.map((l) => (
            <tr
              key={l.id}
              data-testid={current ? `link-${l.tagName}` : undefined}
              className={!current && l.validTo !== null && l.validTo === l.validFrom ? 'text-ink-faint line-through' : undefined}
            >
              {cols.map((c, i) => (
                <td key={i} className={c.className}>
                  {c.cell(l)}
                </td>
              ))}
            </tr>
          ))}
      </GridTable>
    </div>
  );
}
