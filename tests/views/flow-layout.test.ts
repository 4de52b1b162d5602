/**
 * The geometry of the exergy flow picture (src/lib/views/flow-layout.ts), worked by hand for two
 * invented units: the picture is 340 high (2 + 2 out nodes of 44 each need only 230), of which
 * 340 - 34 (top) - 20 (bottom) - 3 x 10 (gaps of the four out nodes) = 256 carry the 150 MWh of the
 * larger side of each unit, so 1 MWh is 256 / 150 of height.
 */
import { expect, it } from 'vitest';
import { bandPath, flowLayout } from '~/lib/views/flow-layout';
import type { FlowAnswer, FlowUnit } from '~/lib/views/ledger';
import { at, defined } from '../support/present';

const unit = (o: Partial<FlowUnit> & Pick<FlowUnit, 'unitId' | 'name' | 'source' | 'fuel_MWh'>): FlowUnit => ({
  kindLabel: 'Boiler',
  product_MWh: 0,
  loss_MWh: 0,
  destruction_MWh: 0,
  destruction_U_MWh: 0,
  ...o,
});

const flow = (units: FlowUnit[]): FlowAnswer =>
  ({
    sources: [
      { key: 'power', label: 'Power', MWh: 50 },
      { key: 'fuel', label: 'Fuel', MWh: 100 },
    ],
    units,
    totals: { fuel_MWh: 150, product_MWh: 80, loss_MWh: 10, destruction_MWh: 60 },
    steadyHours: 12,
  }) as unknown as FlowAnswer;

const k = 256 / 150;

it('draws nothing without units', () => {
  expect(flowLayout(flow([]))).toBeNull();
});

it('orders by source, stacks each column from the top and scales bands to MWh', () => {
  const layout = defined(
    flowLayout(
      flow([
        unit({ unitId: 'b', name: 'Pump B', source: 'power', fuel_MWh: 50, product_MWh: 20, destruction_MWh: 30 }),
        unit({ unitId: 'a', name: 'Boiler A', source: 'fuel', fuel_MWh: 100, product_MWh: 60, loss_MWh: 10, destruction_MWh: 30 }),
      ]),
    ) ?? undefined,
    'layout',
  );
  expect(layout.units.map((u) => u.unitId)).toEqual(['a', 'b']);
  expect(layout.sources.map((s) => s.key)).toEqual(['fuel', 'power']);

  const fuel = defined(layout.srcNode.get('fuel'), 'fuel node');
  const power = defined(layout.srcNode.get('power'), 'power node');
  expect(fuel.y).toBe(34);
  expect(fuel.h).toBeCloseTo(100 * k, 9);
  expect(power.y).toBeCloseTo(34 + 100 * k + 10, 9);
  expect(defined(layout.unitNode.get('b'), 'unit b').y).toBeCloseTo(34 + 100 * k + 10, 9);

  // OUT: product (80 MWh), loss (10 MWh, but at least a 34-high slot), then each destruction.
  expect(layout.product).toEqual({ y: 34, h: expect.closeTo(80 * k, 9) });
  expect(layout.loss.y).toBeCloseTo(34 + 80 * k + 10, 9);
  const destA = defined(layout.destNode.get('a'), 'destruction a');
  const destB = defined(layout.destNode.get('b'), 'destruction b');
  expect(destA.y).toBeCloseTo(34 + 80 * k + 10 + 34 + 10, 9);
  expect(destB.y).toBeCloseTo(destA.y + 30 * k + 10, 9);
  expect(layout.height).toBeCloseTo(destB.y + 30 * k + 10 + 10, 9);

  // Bands: per unit in, product, loss (only where there is some), destruction.
  expect(layout.bands.map((b) => b.key)).toEqual(['in-a', 'p-a', 'l-a', 'd-a', 'in-b', 'p-b', 'd-b']);
  // Boiler A's loss leaves the unit below its product and enters the loss node at its top.
  const lossA = at(layout.bands, 2, 'bands');
  expect(lossA.d).toBe(bandPath(534, 34 + 60 * k, 800, layout.loss.y, 10 * k, 10 * k));
  // Pump B's product enters the product node below Boiler A's.
  expect(at(layout.bands, 5, 'bands').d).toBe(bandPath(534, power.y, 800, 34 + 60 * k, 20 * k, 20 * k));
});

it('writes a band as two curves joined by straight ends', () => {
  expect(bandPath(0, 10, 100, 50, 4, 6)).toBe('M0 10 C50 10 50 50 100 50 L100 56 C50 56 50 14 0 14 Z');
});
