/**
 * The one list of kind names (src/lib/kinds.ts): the plant model's unit kinds, the equipment
 * library's balance kinds, their families, and the table of which balance a unit kind runs. The
 * engine's mappers (src/lib/engine/map-kinds.ts) must pick a balance the table names.
 */
import { describe, expect, it } from 'vitest';
import { mapUnitHour, type EngineUnit } from '~/lib/engine';
import { BALANCE_FAMILIES, BALANCE_KINDS, BALANCE_KINDS_OF_UNIT_KIND, UNIT_KINDS, balanceFamilyOf, balanceKindsOf, isBalanceKind, isUnitKind, unitKindLabel, type BalanceKind } from '~/lib/kinds';
import { kindSpec } from '~/lib/plant/kinds';
import { UNIT_KIND_WORDS } from '~/lib/words/states';

const P_ATM_Pa = 101325;

function mapped(kind: (typeof UNIT_KINDS)[number], parameters: Record<string, string> = {}): BalanceKind {
  const unit: EngineUnit = { id: 'u1', name: 'Unit one', kind, parameters, fuel: null, ports: [] };
  return mapUnitHour(unit, [], new Map(), P_ATM_Pa).balanceKind;
}

describe('the one list of kind names', () => {
  it('self-consistency: every balance kind belongs to exactly one family', () => {
    const seen = Object.values(BALANCE_FAMILIES).flat();
    expect([...seen].sort()).toEqual([...BALANCE_KINDS].sort());
    for (const k of BALANCE_KINDS) expect((BALANCE_FAMILIES[balanceFamilyOf(k)] as readonly string[]).includes(k)).toBe(true);
  });

  it('self-consistency: every balance family is run by some unit kind', () => {
    const run = new Set(Object.values(BALANCE_KINDS_OF_UNIT_KIND).flat().map((k) => balanceFamilyOf(k)));
    expect([...run].sort()).toEqual(Object.keys(BALANCE_FAMILIES).sort());
  });

  it('the engine maps each unit kind to a balance its row of the table names', () => {
    for (const kind of UNIT_KINDS) {
      if (kind === 'motor-generator') continue;
      expect(balanceKindsOf(kind), kind).toContain(mapped(kind));
    }
    expect(mapped('motor-generator', { mode: 'motor' })).toBe('motor');
    expect(mapped('motor-generator', { mode: 'generator' })).toBe('generator');
    expect(balanceKindsOf('motor-generator')).toEqual(['motor', 'generator']);
  });

  it('unit kinds and balance kinds are told apart where their names differ', () => {
    expect(isUnitKind('let-down-valve')).toBe(true);
    expect(isBalanceKind('let-down-valve')).toBe(false);
    expect(isBalanceKind('valve')).toBe(true);
    expect(isUnitKind('valve')).toBe(false);
  });

  it('a unit kind has one label: the catalogue, the words and the views say the same', () => {
    for (const k of UNIT_KINDS) {
      const label = unitKindLabel(k);
      expect(kindSpec(k).label).toBe(label);
      expect(UNIT_KIND_WORDS[k].label.toLowerCase()).toBe(label.toLowerCase());
    }
    expect(unitKindLabel('steam-engine')).toBe('steam-engine');
  });
});
