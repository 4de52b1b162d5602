import { expect, it } from 'vitest';
import * as thermo from '~/lib/thermo';

it('self-consistency: the public surface exposes water, gases, combustion, chemical exergy, liquids and the balance', () => {
  for (const name of [
    'water',
    'species',
    'mixture',
    'dryAir',
    'gaseousFuel',
    'combustionFromO2',
    'mixtureChemicalExergy',
    'fuelChemicalExergy',
    'liquid',
    'deadState',
    'flowExergy',
    'heatExergy',
    'controlVolumeBalance',
    'ThermoRangeError',
    'NoConvergenceError',
    'requireRange',
  ]) {
    expect(thermo, name).toHaveProperty(name);
  }
  expect(typeof thermo.water.pt).toBe('function');
});
