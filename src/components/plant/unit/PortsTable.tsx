import { kindSpec } from '~/lib/plant/kinds';
import type { Fluid } from '~/lib/plant/model';
import { showSI } from '../common';
import type { UnitJson } from '../LinkForm';
import { describeFluid } from './fluids';
import { GridTable, ACTIONS } from '~/components/ui/GridTable';

type Port = UnitJson['ports'][number];

function boundaryText(p: Port): string {
  return p.boundaryT_K ? `Tb ${showSI(p.boundaryT_K, 'degC', 'temperature')} °C` : 'Tb from a tag';
}

/** The unit's ports with their slot and fluid (or heat boundary), and a remove button per row. */
export default function PortsTable({ unit, canEdit, onRemove }: { unit: UnitJson; canEdit: boolean; onRemove: (p: Port) => void }) {
  const spec = kindSpec(unit.kind);
  if (unit.ports.length === 0) return <p className="text-sm text-ink-faint">No port yet.</p>;
  return (
    <div className="overflow-x-auto">
      <GridTable testId="ports-table" columns={['Port', 'Slot', 'Fluid / boundary', ACTIONS]}>
        {unit.ports.map((p) => {
          const slot = spec.ports.find((s) => s.slot === p.slot);
          return (
            <tr key={p.id} data-testid={`port-${p.name}`}>
              <td>{p.name}</td>
              <td>
                {slot?.label ?? p.slot} ({slot?.role})
              </td>
              <td>{slot?.stream === 'heat' ? boundaryText(p) : describeFluid(p.fluid as Fluid | undefined)}</td>
              <td className="text-right">
                {canEdit && (
                  <button type="button" className="btn py-0.5 text-xs" aria-label={`Remove port ${p.name}`} onClick={() => onRemove(p)}>
                    Remove
                  </button>
                )}
              </td>
            </tr>
          );
        })}
      </GridTable>
    </div>
  );
}
