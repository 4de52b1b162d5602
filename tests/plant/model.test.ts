import { describe, expect, it } from 'vitest';
import { checkModel, jsonPath, unitStatus, type PlantModel } from '~/lib/plant';
import { documentedExample } from './example';

const clone = <T>(x: T): T => structuredClone(x);

function pathsOf(input: unknown): string[] {
  const r = checkModel(input);
  return r.ok ? [] : r.issues.map((i) => i.path);
}

describe('the model file check', () => {
  it('self-consistency: the documented example is a valid model and every unit in it is complete', () => {
    const r = checkModel(documentedExample());
    expect(r.issues).toEqual([]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const model = r.model;
    const now = Date.now();
    const current = (u: PlantModel['units'][number]) => ({
      ...u,
      links: u.links.filter((l) => (!l.validFrom || Date.parse(l.validFrom) <= now) && (!l.validTo || Date.parse(l.validTo) > now)),
    });
    const siteLinks = model.units.flatMap((u) => current(u).links.map((l) => ({ unit: u.name, port: l.port, quantity: l.quantity, tag: l.tag })));
    const boilers = new Set(model.units.filter((u) => u.kind === 'boiler').map((u) => u.name));
    for (const u of model.units) {
      const s = unitStatus(current(u), { tagHints: new Map(), siteLinks, boilers });
      expect({ unit: u.name, missing: s.missing, conflicts: s.conflicts }).toEqual({ unit: u.name, missing: [], conflicts: [] });
    }
  });

  it('writes JSON paths the way a reader finds them', () => {
    expect(jsonPath([])).toBe('$');
    expect(jsonPath(['units', 2, 'links', 0, 'unit'])).toBe('$.units[2].links[0].unit');
    expect(jsonPath(['units', 0, 'fuel', 'moleFractions', 'C-9'])).toBe('$.units[0].fuel.moleFractions["C-9"]');
  });

  const cases: { name: string; edit: (m: PlantModel & Record<string, unknown>) => void; path: string }[] = [
    { name: 'a file of another format', edit: (m) => void (m.format = 'something-else' as never), path: '$.format' },
    { name: 'a version Lossline does not read', edit: (m) => void (m.version = 2 as never), path: '$.version' },
    { name: 'an unknown top-level field', edit: (m) => void (m.extra = 1), path: '$.extra' },
    { name: 'an unknown time zone', edit: (m) => void (m.site.timeZone = 'Europe/Atlantis'), path: '$.site.timeZone' },
    { name: 'an atmosphere in bar instead of Pa', edit: (m) => void (m.site.p_atm_Pa = 1.013), path: '$.site.p_atm_Pa' },
    { name: 'a lower-case currency', edit: (m) => void (m.site.currency = 'gbp'), path: '$.site.currency' },
    { name: 'two prices of one name', edit: (m) => void (m.site.prices[1]!.name = m.site.prices[0]!.name), path: '$.site.prices[1].name' },
    { name: 'an ambient tag in a pressure unit', edit: (m) => void (m.site.deadState.T0Tag!.unit = 'barg'), path: '$.site.deadState.T0Tag.unit' },
    { name: 'an unknown kind', edit: (m) => void (m.units[1]!.kind = 'steam-engine' as never), path: '$.units[1].kind' },
    { name: 'two units of one name', edit: (m) => void (m.units[2]!.name = m.units[1]!.name), path: '$.units[2].name' },
    { name: 'an unknown parameter', edit: (m) => void (m.units[3]!.parameters.efficiencyOfEverything = 1), path: '$.units[3].parameters.efficiencyOfEverything' },
    { name: 'a parameter out of range', edit: (m) => void (m.units[3]!.parameters.generatorEfficiency = 1.2), path: '$.units[3].parameters.generatorEfficiency' },
    { name: 'a choice parameter with another value', edit: (m) => void (m.units[3]!.parameters.wetExhaustMethod = 'guess'), path: '$.units[3].parameters.wetExhaustMethod' },
    { name: 'a fuel on a pump', edit: (m) => void (m.units[1]!.fuel = { by: 'heating-value', fuelType: 'natural-gas', LHV_J_per_kg: 4.9e7 }), path: '$.units[1].fuel' },
    { name: 'a fuel whose mole fractions do not sum to 1', edit: (m) => void ((m.units[0]!.fuel as { moleFractions: Record<string, number> }).moleFractions.CH4 = 0.5), path: '$.units[0].fuel.moleFractions' },
    { name: 'a fuel with an unknown species', edit: (m) => void ((m.units[0]!.fuel as { moleFractions: Record<string, number> }).moleFractions = { CH4: 0.9, C4H10: 0.1 }), path: '$.units[0].fuel.moleFractions.C4H10' },
    { name: 'a fuel priced by a price the site lacks', edit: (m) => void (m.units[0]!.fuel!.price = 'moonshine'), path: '$.units[0].fuel.price' },
    { name: 'a port slot the kind does not have', edit: (m) => void (m.units[2]!.ports[0]!.slot = 'exhaust'), path: '$.units[2].ports[0].slot' },
    { name: 'a fluid the slot does not take', edit: (m) => void (m.units[0]!.ports[0]!.fluid = { kind: 'air' }), path: '$.units[0].ports[0].fluid.kind' },
    { name: 'a second inlet on a valve', edit: (m) => void m.units[2]!.ports.push({ name: 'bypass', slot: 'inlet', fluid: { kind: 'water' } }), path: '$.units[2].ports[2].slot' },
    { name: 'two ports of one name', edit: (m) => void (m.units[2]!.ports[1]!.name = 'HP side'), path: '$.units[2].ports[1].name' },
    { name: 'a liquid without density', edit: (m) => void (m.units[1]!.ports[0]!.fluid = { kind: 'liquid', cp_J_per_kgK: 4180 } as never), path: '$.units[1].ports[0].fluid.rho_kg_per_m3' },
    { name: 'a link to a port the unit lacks', edit: (m) => void (m.units[2]!.links[0]!.port = 'middle'), path: '$.units[2].links[0].port' },
    { name: 'a pressure tag in degC', edit: (m) => void (m.units[2]!.links[0]!.unit = 'degC'), path: '$.units[2].links[0].unit' },
    { name: 'a unit nobody knows', edit: (m) => void (m.units[2]!.links[2]!.unit = 'furlongs/fortnight'), path: '$.units[2].links[2].unit' },
    { name: 'a quantity the port does not take', edit: (m) => void (m.units[2]!.links[3]!.quantity = 'o2Fraction'), path: '$.units[2].links[3].quantity' },
    { name: 'O2 without its basis', edit: (m) => void delete m.units[0]!.links[9]!.basis, path: '$.units[0].links[9].basis' },
    { name: 'a basis on a temperature', edit: (m) => void (m.units[0]!.links[8]!.basis = 'dry'), path: '$.units[0].links[8].basis' },
    { name: 'a valid range upside down', edit: (m) => void (m.units[2]!.links[2]!.validMin = 30), path: '$.units[2].links[2].validMax' },
    { name: 'a relative uncertainty above 100 %', edit: (m) => void (m.units[3]!.links[8]!.uncertainty = { mode: 'relative', value: 300 }), path: '$.units[3].links[8].uncertainty.value' },
    { name: 'a negative uncertainty', edit: (m) => void (m.units[3]!.links[8]!.uncertainty = { mode: 'absolute', value: -1 }), path: '$.units[3].links[8].uncertainty.value' },
    { name: 'a date without a zone', edit: (m) => void (m.units[0]!.links[6]!.validFrom = '2024-03-04 06:00'), path: '$.units[0].links[6].validFrom' },
    { name: 'a link that ends before it starts', edit: (m) => void (m.units[0]!.links[6]!.validTo = '2024-01-01T00:00:00Z'), path: '$.units[0].links[6].validTo' },
    { name: 'two versions that overlap', edit: (m) => void (m.units[0]!.links[6]!.validFrom = '2024-03-01T00:00:00Z'), path: '$.units[0].links[6].validFrom' },
    { name: 'a flue gas from a boiler that is not there', edit: (m) => void (m.units[0]!.ports[3]!.fluid = { kind: 'flue-gas', fuelFrom: 'Boiler 9' }), path: '$.units[0].ports[3].fluid.fuelFrom' },
    { name: 'a link without a tag', edit: (m) => void ((m.units[1]!.links[0] as { tag?: string }).tag = undefined), path: '$.units[1].links[0].tag' },
  ];
  it.each(cases)('reports $name at $path', ({ edit, path }) => {
    const m = clone(documentedExample()) as PlantModel & Record<string, unknown>;
    edit(m);
    expect(pathsOf(m)).toContain(path);
  });

  it('reports every problem of a file at once, not only the first', () => {
    const m = clone(documentedExample());
    m.site.timeZone = 'Nowhere/Else';
    m.units[2]!.links[0]!.unit = 'degC';
    m.units[3]!.parameters.generatorEfficiency = 7;
    expect(pathsOf(m)).toEqual(['$.site.timeZone', '$.units[2].links[0].unit', '$.units[3].parameters.generatorEfficiency']);
  });

  it('accepts a file without optional parts: no units, no prices, no elevation', () => {
    const r = checkModel({ format: 'lossline-plant-model', version: 1, site: { name: 'Bare', timeZone: 'UTC', deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR' } });
    expect(r.ok).toBe(true);
  });
});
