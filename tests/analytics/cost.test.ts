import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import {
  destructionCostOverHours,
  destructionCost_per_day,
  destructionCost_per_hour,
  destructionCost_per_s,
  electricityExergyCost_per_J,
  exergyCostFromMassPrice_per_J,
  extraDestructionCost_per_day,
  fuelExergyCost_per_J,
  productExergyCost_per_J,
} from '~/lib/analytics/cost';

describe('cost of exergy destruction (SPECO, Lazzaretto & Tsatsaronis 2006), worked by hand', () => {
  it('gas at 40 per MWh LHV with phi = 1.04: 1 MW destroyed for an hour costs 40/1.04 = 38.4615...', () => {
    // 1 MW for 1 h = 1 MWh of exergy; one MWh of fuel exergy costs 40 / 1.04 per MWh.
    const cF = fuelExergyCost_per_J(40, 1.04);
    expectClose(cF, 40 / 1.04 / 3.6e9, { rtol: 1e-15 });
    expectClose(destructionCost_per_hour(cF, 1e6), 40 / 1.04, { rtol: 1e-14 });
    expectClose(destructionCost_per_day(cF, 1e6), (24 * 40) / 1.04, { rtol: 1e-14 });
    expectClose(destructionCost_per_s(cF, 1e6), 40 / 1.04 / 3600, { rtol: 1e-14 });
  });

  it('electricity at 90 per MWh: 250 kW destroyed for a day costs 0.25 x 24 x 90 = 540', () => {
    expectClose(destructionCost_per_day(electricityExergyCost_per_J(90), 250e3), 540, { rtol: 1e-14 });
  });

  it('by mass: steam at 25 per tonne with 1000 kJ/kg of exergy costs 25e-3 / 1e6 per J', () => {
    expectClose(exergyCostFromMassPrice_per_J(0.025, 1e6), 2.5e-8, { rtol: 1e-14 });
  });

  it('product cost balance: c_P X_P = c_F X_F + Z', () => {
    // boiler: X_F = 10 MW at 1e-8 per J, X_P = 4 MW, Z = 0.01 per s:
    // c_P = (1e-8 x 1e7 + 0.01) / 4e6 = (0.1 + 0.01) / 4e6 = 2.75e-8 per J
    expectClose(productExergyCost_per_J(1e-8, 10e6, 4e6, 0.01), 2.75e-8, { rtol: 1e-14 });
    expect(() => productExergyCost_per_J(1e-8, 10e6, 0)).toThrow(/XP_W/);
  });

  it('loss ledger over hours skips hours without a value; drift notice states extra kW and cost per day', () => {
    const cF = 1e-8; // per J
    // hours: 1 MW, (not steady), 2 MW -> 3 MWh = 1.08e10 J -> cost 108
    const r = destructionCostOverHours(cF, [1e6, NaN, 2e6]);
    expectClose(r.XD_J, 1.08e10, { rtol: 1e-14 });
    expectClose(r.cost, 108, { rtol: 1e-14 });
    expect([r.hoursCounted, r.hoursSkipped]).toEqual([2, 1]);
    // 150 kW above the expected 1.2 MW: 150e3 W x 86400 s x 1e-8 per J = 129.6 per day
    const e = extraDestructionCost_per_day(cF, 1.35e6, 1.2e6);
    expectClose(e.extra_W, 150e3, { rtol: 1e-9 });
    expectClose(e.cost_per_day, 129.6, { rtol: 1e-9 });
  });

  it('refuses a non-positive exergy/LHV ratio and non-finite inputs', () => {
    expect(() => fuelExergyCost_per_J(40, 0)).toThrow(/exergyToLhvRatio/);
    expect(() => destructionCost_per_s(1e-8, NaN)).toThrow(/XD_W/);
  });
});
