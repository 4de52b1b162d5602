/**
 * The unit cost of a unit's fuel exergy (src/lib/engine/unit-cost.ts): one rule for the engine's hours
 * and for drift notices whose hours carry no cost. SPECO (Lazzaretto & Tsatsaronis, Energy 31 (2006)
 * 1257-1289; docs/domain.md sections 3 and 7): c_F is the unit cost of the unit's own fuel exergy, so
 * a compressor's destruction is priced at electricity, never at the gas price.
 */
import { describe, expect, it } from 'vitest';
import { costOfHours, unitFuelCost, type CostUnit } from '~/lib/engine/unit-cost';
import type { EnergyPrice } from '~/lib/plant/model';
import { expectClose } from '../support/expect-close';

const gas: EnergyPrice = { name: 'gas', kind: 'fuel', price_per_MWh: 36, currency: 'EUR' };
const grid: EnergyPrice = { name: 'grid', kind: 'electricity', price_per_MWh: 90, currency: 'EUR' };
const site = (prices: EnergyPrice[]) => ({ prices, currency: 'EUR', T0_K: 298.15 });
const boiler: CostUnit = { kind: 'boiler', fuel: { by: 'composition', moleFractions: { CH4: 1 }, price: 'gas' }, ports: [{ fluid: { kind: 'water' } }] };
const compressor: CostUnit = { kind: 'compressor', fuel: null, ports: [{ fluid: { kind: 'air' } }] };
const turbine: CostUnit = { kind: 'turbine', fuel: null, ports: [{ fluid: { kind: 'water' } }] };

describe('the cost of a unit fuel exergy, by what the unit spends', () => {
  it('a compressor spends power: priced at electricity, 90 EUR/MWh / 3.6e9 J/MWh (exergy factor 1)', () => {
    expectClose(unitFuelCost(compressor, site([gas, grid]), [boiler])!.cF_per_J, 90 / 3.6e9, { rtol: 1e-15 });
  });

  it('a compressor at a site with only a gas price has no cost (the old notice rule priced it at gas / 1.04)', () => {
    expect(unitFuelCost(compressor, site([gas]), [boiler])).toBeNull();
  });

  it('a boiler burning methane: gas price over phi = e_ch / LHV, about 831.65 / 802.7 (Bejan et al. 1996 Table C.2; ISO 6976:2016)', () => {
    const c = unitFuelCost(boiler, site([gas, grid]), [boiler])!;
    // phi from the tables is 1.0361; the engine's own fuel chemistry may differ in the third decimal.
    expectClose(c.cF_per_J, 36 / 3.6e9 / (831.65 / 802.7), { rtol: 2e-3 });
    expect(c.basis).toMatch(/fuel 'gas'/);
  });

  it('a steam turbine without a boiler hour: the boiler fuel exergy price, said to be a lower bound', () => {
    const b = unitFuelCost(boiler, site([gas]), [boiler])!;
    const t = unitFuelCost(turbine, site([gas]), [boiler])!;
    expect(t.cF_per_J).toBe(b.cF_per_J);
    expect(t.basis).toMatch(/lower bound/);
  });

  it('hand-worked: a steam turbine with a boiler hour of F = 10 MW, P = 8 MW inherits c_F x F / P', () => {
    const cF = 1e-8;
    const t = unitFuelCost(turbine, site([gas]), [boiler], [{ name: 'B1', fuel_W: 10e6, product_W: 8e6, cF_per_J: cF }])!;
    expectClose(t.cF_per_J, 1.25e-8, { rtol: 1e-12 });
  });
});

describe('the cost the hours carry', () => {
  it('hand-worked: 2 hours of 1 MW costing 36 and 72 per hour: 108 / (2 x 3.6e9 J) = 1.5e-8 per J', () => {
    const hours = [
      { destruction_W: 1e6, destructionCost_per_h: 36 },
      { destruction_W: 1e6, destructionCost_per_h: 72 },
      { destruction_W: 5e6, destructionCost_per_h: null },
    ];
    expectClose(costOfHours(hours)!, 108 / 7.2e9, { rtol: 1e-14 });
  });

  it('no hour with a cost: null', () => {
    expect(costOfHours([{ destruction_W: 1e6, destructionCost_per_h: null }])).toBeNull();
  });
});
