/**
 * Every unit kind against balances worked independently by scripts/equipment-reference.py
 * (python3-iapws IAPWS97 for water, the script's own NASA-9 polynomials for gases, Szargut 1988
 * chemical exergies, SPECO definitions). The fixture names the library and its version.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { entry } from '../support/present';
import {
  BALANCE_KINDS,
  evaluateUnitHour,
  inputVector,
  portState,
  type FluidSpec,
  type PortMeasurement,
  type BalanceKind,
  type UnitModel,
} from '~/lib/equipment';

interface RefCase {
  id: string;
  kind: BalanceKind;
  note: string;
  model: UnitModel;
  inputs: Record<string, number>;
  expected: Record<string, number | null>;
}

const FIX = JSON.parse(readFileSync(new URL('../fixtures/equipment-reference.json', import.meta.url), 'utf8')) as {
  library: string;
  library_version: string;
  dead_state: { T0_K: number; p0_Pa: number };
  cases: RefCase[];
  portStates: { fluid: FluidSpec; m: PortMeasurement; h: number | null; s: number | null; psi: number; eCh: number | null }[];
};
const SRC = `scripts/equipment-reference.py (${FIX.library}, iapws ${FIX.library_version})`;
/** The brief's acceptance tolerance for destruction and efficiency: 0.1 percent. */
const RTOL = 1e-3;

describe('reference fixture', () => {
  it('names its library and version and covers every unit kind', () => {
    expect(FIX.library).toMatch(/iapws/);
    expect(FIX.library_version).toMatch(/^\d+\.\d+/);
    const kinds = new Set(FIX.cases.map((c) => c.kind));
    for (const k of BALANCE_KINDS) expect(kinds.has(k), `no reference case for ${k}`).toBe(true);
  });
});

describe.each(FIX.cases)(`${SRC}: $kind ($id)`, (c) => {
  const x = inputVector(c.kind, c.model, c.inputs);
  const b = evaluateUnitHour(c.kind, c.model, x);

  it('destruction and efficiency within 0.1 %', () => {
    expectClose(b.destruction_W, c.expected.destruction_W!, { rtol: RTOL, label: `${c.id} destruction_W` });
    if (c.expected.efficiency === null) expect(b.efficiency).toBeNull();
    else expectClose(b.efficiency!, c.expected.efficiency!, { rtol: RTOL, label: `${c.id} efficiency` });
  });

  it('fuel, product and loss within 0.1 %', () => {
    expectClose(b.fuel_W, c.expected.fuel_W!, { rtol: RTOL, label: 'fuel_W' });
    if (c.expected.product_W === null) expect(b.product_W).toBeNull();
    else expectClose(b.product_W!, c.expected.product_W!, { rtol: RTOL, label: 'product_W' });
    expectClose(b.loss_W, c.expected.loss_W!, { rtol: RTOL, atol: 1e-6 * c.expected.fuel_W!, label: 'loss_W' });
  });

  it('companions within 0.1 %', () => {
    for (const key of ['isentropicEfficiency', 'energyEfficiency', 'lambda', 'airFlow_kg_per_s', 'flueGasFlow_kg_per_s', 'stackLossPhysical_W', 'stackLossChemical_W', 'hotDuty_W', 'coldDuty_W']) {
      const want = c.expected[key];
      if (typeof want === 'number') expectClose(entry(b.extras, key, 'extras'), want, { rtol: RTOL, label: key });
    }
    if (typeof c.expected.exhaust_x === 'number') expectClose(entry(b.ports, 'exhaust', 'ports').state.x!, c.expected.exhaust_x, { rtol: RTOL, label: 'exhaust x' });
    if (typeof c.expected.steamFlow_kg_per_s === 'number') expectClose(entry(b.ports, 'heating-steam', 'ports').mDot_kg_per_s, c.expected.steamFlow_kg_per_s, { rtol: RTOL });
    if (typeof c.expected.coolingFlow_kg_per_s === 'number') expectClose(entry(b.ports, 'cw-in', 'ports').mDot_kg_per_s, c.expected.coolingFlow_kg_per_s, { rtol: RTOL });
  });

  it('self-consistency: F = P + L + D', () => {
    expectClose(b.fuel_W - (b.product_W ?? 0) - b.loss_W, b.destruction_W, { rtol: 1e-9, atol: 1e-6 });
  });
});

describe.each(FIX.portStates)(`${SRC}: port state of $fluid.kind at $m`, (row) => {
  it('h, s, psi and chemical exergy', () => {
    const st = portState(row.fluid, row.m, FIX.dead_state);
    if (row.h !== null) expectClose(st.h, row.h, { rtol: 1e-7, atol: 1e-3 });
    if (row.s !== null) expectClose(st.s, row.s, { rtol: 1e-7, atol: 1e-6 });
    expectClose(st.psi, row.psi, { rtol: 1e-6, atol: 1e-3 });
    if (row.eCh === null) expect(st.eCh).toBeNull();
    else expectClose(st.eCh!, row.eCh, { rtol: 1e-9 });
  });
});
