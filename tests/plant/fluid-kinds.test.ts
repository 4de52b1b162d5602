/**
 * The one list of fluid kinds (src/lib/kinds.ts): the plant model's fluid kinds are what the model
 * schema accepts, and the engine prepares each as an equipment fluid kind its row of the table names.
 */
import { describe, expect, it } from 'vitest';
import { fluidSpecOf, type Ctx } from '~/lib/engine/map-port';
import type { EnginePort } from '~/lib/engine';
import { prepareFluid, type FluidSpec } from '~/lib/equipment';
import { FLUID_FAMILIES, FLUID_KINDS, FLUID_LABELS, FLUID_SHORT_LABELS, FLUID_SPEC_KINDS, FLUID_SPEC_KINDS_OF_FLUID_KIND, isFluidKind, type FluidKind } from '~/lib/kinds';
import { FluidSchema, type Fluid } from '~/lib/plant/model';
import { FLUID_WORDS } from '~/lib/words/states';

/** One valid fluid of each plant kind, as a model file writes it (docs/plant-model.md). */
const SAMPLES: Record<FluidKind, Fluid> = {
  water: { kind: 'water' },
  air: { kind: 'air' },
  'flue-gas': { kind: 'flue-gas' },
  fuel: { kind: 'fuel' },
  'fuel-gas': { kind: 'fuel-gas', moleFractions: { CH4: 0.9, N2: 0.1 } },
  'gas-mixture': { kind: 'gas-mixture', moleFractions: { N2: 0.79, O2: 0.21 } },
  liquid: { kind: 'liquid', cp_J_per_kgK: 4180, rho_kg_per_m3: 1000 },
};

describe('the one list of fluid kinds', () => {
  it('the model schema accepts exactly the fluid kinds of the list', () => {
    const schemaKinds = FluidSchema.options.map((o) => [...o.shape.kind.values][0]);
    expect([...schemaKinds].sort()).toEqual([...FLUID_KINDS].sort());
    for (const k of FLUID_KINDS) expect(FluidSchema.safeParse(SAMPLES[k]).success, k).toBe(true);
    expect(FluidSchema.safeParse({ kind: 'steam' }).success).toBe(false);
    expect(FluidSchema.safeParse({ kind: 'gas' }).success).toBe(false);
    expect(isFluidKind('gas-mixture')).toBe(true);
    expect(isFluidKind('gas')).toBe(false);
  });

  it('every fluid kind has its label, its short word and its entry in the words catalogue', () => {
    for (const k of FLUID_KINDS) {
      expect(FLUID_LABELS[k].length, k).toBeGreaterThan(0);
      expect(FLUID_SHORT_LABELS[k].length, k).toBeGreaterThan(0);
      expect(FLUID_WORDS[k].label).toBe(FLUID_LABELS[k]);
    }
  });

  it('the engine prepares each plant fluid kind as an equipment kind its row of the table names', () => {
    const boilerFuel = { by: 'composition', moleFractions: { CH4: 1 } } as const;
    for (const k of FLUID_KINDS) {
      const ctx = {
        unit: { id: 'u1', name: 'Boiler one', kind: 'boiler', parameters: {}, fuel: boilerFuel, ports: [] },
        problems: [],
        flueGasSources: {},
      } as unknown as Ctx;
      const port = { name: 'p', slot: 'inlet', direction: 'in', fluid: SAMPLES[k] } as unknown as EnginePort;
      const spec = fluidSpecOf(ctx, port, 'dry') as FluidSpec;
      expect(spec, k).not.toBeNull();
      expect(FLUID_SPEC_KINDS_OF_FLUID_KIND[k] as readonly string[], k).toContain(spec.kind);
    }
  });

  it('the equipment library prepares every fluid kind of its list into a family of the list, and no other kind', () => {
    const specs: FluidSpec[] = [
      { kind: 'water' },
      { kind: 'gas', fractions: { N2: 0.79, O2: 0.21 }, basis: 'mole' },
      { kind: 'air' },
      { kind: 'fuel-gas', composition: { CH4: 1 } },
      { kind: 'fuel', fuel: { composition: { CH4: 1 } } },
      { kind: 'flue-gas', fuel: { composition: { CH4: 1 } }, o2Basis: 'dry' },
      { kind: 'liquid', cp_J_per_kgK: 4180, rho_kg_per_m3: 1000 },
    ];
    expect(specs.map((s) => s.kind).sort()).toEqual([...FLUID_SPEC_KINDS].sort());
    for (const s of specs) expect(FLUID_FAMILIES as readonly string[], s.kind).toContain(prepareFluid(s).family);
    expect(() => prepareFluid({ kind: 'gas-mixture' } as never)).toThrow(/unknown fluid kind 'gas-mixture'/);
  });
});
