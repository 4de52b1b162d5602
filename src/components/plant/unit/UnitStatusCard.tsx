import { nonZeroParts } from '~/lib/counts';
import { targetsOf, type UnitJson } from '../LinkForm';

type Missing = UnitJson['status']['missing'][number];

/** The link target a missing item can be filled from, if it is one tag link. */
function targetFor(unit: UnitJson, targets: ReturnType<typeof targetsOf>, m: Missing) {
  if (!m.quantities || m.code === 'MISSING_PORT') return undefined;
  return targets.find(
    (t) => t.missing && t.quantity === m.quantities![0] && (t.portId === null) === !m.port && (!m.port || unit.ports.find((p) => p.id === t.portId)?.name === m.port),
  );
}

/** "Can it compute?": what the unit lacks and what conflicts, with a way to link a missing tag. */
export default function UnitStatusCard({ unit, canEdit, onLink }: { unit: UnitJson; canEdit: boolean; onLink: (target: string) => void }) {
  const { missing, conflicts, complete } = unit.status;
  const targets = targetsOf(unit);
  const lacks = nonZeroParts([
    [missing.length, 'missing', 'missing'],
    [conflicts.length, 'conflict', 'conflicts'],
  ]);
  return (
    <section className="card" aria-label="Can it compute?">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2>Can it compute?</h2>
        <p data-testid="unit-status" className={complete ? 'font-medium text-teal-deep' : 'font-medium text-copper-deep'}>
          {complete ? '✓ Complete: the unit can be computed.' : `◇ Not yet: ${lacks}.`}
        </p>
      </div>
      {missing.length > 0 && (
        <ul className="mt-2 space-y-1 text-sm" data-testid="missing">
          {missing.map((m, i) => {
            const target = targetFor(unit, targets, m);
            return (
              <li key={i} className="flex items-center gap-2">
                <span aria-hidden>◇</span>
                <span>{m.message}</span>
                {canEdit && target && (
                  <button type="button" className="btn py-0.5 text-xs" aria-label={`Link a tag: ${m.message}`} onClick={() => onLink(target.value)}>
                    Link a tag
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {conflicts.length > 0 && (
        <ul className="mt-2 space-y-1 text-sm text-alert" data-testid="conflicts">
          {conflicts.map((c, i) => (
            <li key={i}>
              <span aria-hidden>▲ </span>
              {c.message}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
