import { LINK_QUANTITIES } from '~/lib/plant/kinds';
import { showInstant } from '../common';
import type { LinkRow } from './types';

/** Every version of every link of the unit; a version that never held is struck through. */
export default function LinkHistoryTable({ history, timeZone }: { history: LinkRow[]; timeZone: string }) {
  return (
    <div className="mt-2 overflow-x-auto">
      <table className="grid-table" data-testid="history-table">
        <thead>
          <tr>
            <th>At</th>
            <th>Quantity</th>
            <th>Tag</th>
            <th>Unit</th>
            <th>From ({timeZone})</th>
            <th>Until</th>
          </tr>
        </thead>
        <tbody>
          {history.map((l) => (
            <tr key={l.id} className={l.validTo !== null && l.validTo === l.validFrom ? 'text-ink-faint line-through' : ''}>
              <td>{l.portName ?? 'unit'}</td>
              <td>{LINK_QUANTITIES[l.quantity].label}</td>
              <td className="font-mono text-xs">{l.tagName}</td>
              <td>{l.engUnit}</td>
              <td className="whitespace-nowrap">{showInstant(l.validFrom, timeZone)}</td>
              <td className="whitespace-nowrap">{l.validTo ? showInstant(l.validTo, timeZone) : 'open'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
