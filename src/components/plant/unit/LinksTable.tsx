import { LINK_QUANTITIES } from '~/lib/plant/kinds';
import { showInstant } from '../common';
import type { LinkRow } from './types';

function uncertaintyText(l: LinkRow): string {
  return l.uncertaintyMode === 'relative' ? `${l.uncertainty} %` : `${l.uncertainty} ${l.engUnit}`;
}

function rangeText(l: LinkRow): string {
  return l.validMin !== null || l.validMax !== null ? `${l.validMin ?? '…'} to ${l.validMax ?? '…'}` : '';
}

/** The links that hold now, with a change and an end button per row for those who edit. */
export default function LinksTable(props: { links: LinkRow[]; timeZone: string; canEdit: boolean; onChange: (l: LinkRow) => void; onEnd: (l: LinkRow) => void }) {
  const { links, timeZone, canEdit, onChange, onEnd } = props;
  if (links.length === 0) return <p className="text-sm text-ink-faint">No tag is linked now.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="grid-table" data-testid="links-table">
        <thead>
          <tr>
            <th>At</th>
            <th>Quantity</th>
            <th>Tag</th>
            <th>Unit</th>
            <th>Uncertainty</th>
            <th>Valid range</th>
            <th>Valid from ({timeZone})</th>
            <th>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {links.map((l) => (
            <tr key={l.id} data-testid={`link-${l.tagName}`}>
              <td>{l.portName ?? 'unit'}</td>
              <td>
                {LINK_QUANTITIES[l.quantity].label}
                {l.basis ? ` (${l.basis})` : ''}
              </td>
              <td className="font-mono text-xs">{l.tagName}</td>
              <td>{l.engUnit}</td>
              <td>{uncertaintyText(l)}</td>
              <td>{rangeText(l)}</td>
              <td className="whitespace-nowrap">{showInstant(l.validFrom, timeZone)}</td>
              <td className="whitespace-nowrap text-right">
                {canEdit && (
                  <>
                    <button type="button" className="btn py-0.5 text-xs" aria-label={`Change the link of ${l.tagName}`} onClick={() => onChange(l)}>
                      Change…
                    </button>{' '}
                    <button type="button" className="btn py-0.5 text-xs" aria-label={`End the link of ${l.tagName}`} onClick={() => onEnd(l)}>
                      End
                    </button>
                  </>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
