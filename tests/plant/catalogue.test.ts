import { describe, expect, it } from 'vitest';
import {
  FLUID_KINDS,
  LINK_QUANTITIES,
  LINK_QUANTITY_NAMES,
  UNIT_KINDS,
  allowedQuantities,
  defaultParameters,
  defaultUncertainty,
  kindSpec,
  measurementsFor,
  portSlot,
  pressureAtElevation,
} from '~/lib/plant';
import { canConvert, unitsFor } from '~/lib/units';
import { expectClose } from '../support/expect-close';

describe('the unit-kind catalogue', () => {
  it('self-consistency: every kind of docs/domain.md section 3 has an entry that names itself', () => {
    expect([...UNIT_KINDS].sort()).toEqual(
      ['boiler', 'compressor', 'condenser', 'control-volume', 'fan', 'heat-exchanger', 'let-down-valve', 'mixer', 'motor-generator', 'pump', 'turbine'].sort(),
    );
    for (const k of UNIT_KINDS) expect(kindSpec(k).kind).toBe(k);
    expect(() => kindSpec('steam-engine' as never)).toThrow(/Unknown unit kind/);
  });

  it('self-consistency: every slot, measurement and parameter is well formed', () => {
    const problems: string[] = [];
    for (const k of UNIT_KINDS) {
      const spec = kindSpec(k);
      const slots = new Set<string>();
      for (const s of spec.ports) {
        if (slots.has(s.slot)) problems.push(`${k}: slot ${s.slot} twice`);
        slots.add(s.slot);
        if (s.max !== null && s.max < s.min) problems.push(`${k}.${s.slot}: max < min`);
        if (s.stream === 'matter' && s.fluids.length === 0) problems.push(`${k}.${s.slot}: no fluid`);
        if (s.stream === 'heat' && s.fluids.length > 0) problems.push(`${k}.${s.slot}: heat port with fluids`);
        for (const f of s.fluids) if (!FLUID_KINDS.includes(f)) problems.push(`${k}.${s.slot}: fluid ${f}`);
        for (const m of s.measurements) for (const q of m.anyOf) if (!LINK_QUANTITY_NAMES.includes(q)) problems.push(`${k}.${s.slot}.${m.key}: ${q}`);
      }
      const keys = new Set<string>();
      for (const p of spec.params) {
        if (keys.has(p.key)) problems.push(`${k}: parameter ${p.key} twice`);
        keys.add(p.key);
        if (p.type === 'number') {
          if (!canConvert(p.displayUnit, p.quantity)) problems.push(`${k}.${p.key}: display unit ${p.displayUnit} is not a unit of ${p.quantity}`);
          if (p.default !== undefined && ((p.min !== undefined && p.default < p.min) || (p.max !== undefined && p.default > p.max))) {
            problems.push(`${k}.${p.key}: default outside its range`);
          }
          if (p.required && p.default !== undefined) problems.push(`${k}.${p.key}: required with a default`);
        } else if (!p.choices.includes(p.default)) problems.push(`${k}.${p.key}: default not a choice`);
      }
    }
    expect(problems).toEqual([]);
  });

  it('a turbine has an inlet, an exhaust and any number of extractions, needs power, and defaults to the energy balance for a wet exhaust', () => {
    const t = kindSpec('turbine');
    expect(t.ports.map((s) => [s.slot, s.role, s.min, s.max])).toEqual([
      ['inlet', 'in', 1, 1],
      ['exhaust', 'out', 1, 1],
      ['extraction', 'out', 0, null],
    ]);
    expect(t.unitMeasurements.filter((m) => m.need === 'required').flatMap((m) => m.anyOf)).toEqual(['power']);
    const params = defaultParameters('turbine');
    expect(params.wetExhaustMethod).toBe('energy-balance');
    expect(params.generatorEfficiency).toBe(0.97); // common practice
    expect(params.massBalanceTolerance).toBe(0.03); // common practice
  });

  it('a boiler needs a fuel definition and asks O2 only at its flue-gas port', () => {
    expect(kindSpec('boiler').needsFuel).toBe(true);
    expect(kindSpec('turbine').needsFuel).toBe(false);
    expect(allowedQuantities('boiler', portSlot('boiler', 'flueGas')!, 'flue-gas')).toContain('o2Fraction');
    expect(allowedQuantities('boiler', portSlot('boiler', 'feedwater')!, 'water')).not.toContain('o2Fraction');
  });

  it('asks the vapour fraction only where the port carries water', () => {
    const exhaust = portSlot('turbine', 'exhaust')!;
    expect(measurementsFor(exhaust, 'water').map((m) => m.key)).toContain('x');
    expect(measurementsFor(exhaust, 'air').map((m) => m.key)).not.toContain('x');
  });

  it('a motor-generator has no ports and needs power in and out; a control volume takes heat ports', () => {
    expect(kindSpec('motor-generator').ports).toEqual([]);
    expect(allowedQuantities('motor-generator', null, null).sort()).toEqual(['powerIn', 'powerOut']);
    const heat = portSlot('control-volume', 'heatIn')!;
    expect(heat.stream).toBe('heat');
    expect(allowedQuantities('control-volume', heat, null).sort()).toEqual(['heatFlow', 'temperature']);
  });

  it('every link quantity converts as a quantity the units library knows', () => {
    for (const [name, spec] of Object.entries(LINK_QUANTITIES)) {
      const units = unitsFor(spec.quantity);
      expect({ name, convertible: units.length > 0 && units.every((u) => canConvert(u, spec.quantity)) }).toEqual({ name, convertible: true });
    }
  });
});

describe('default uncertainty of a link (common practice, docs/domain.md section 6)', () => {
  it('common practice: 1 K for a temperature, written in the link unit (1.8 degF, 1 degC)', () => {
    expect(defaultUncertainty('temperature', 'degC')).toEqual({ mode: 'absolute', value: 1 });
    expect(defaultUncertainty('temperature', 'degF')).toEqual({ mode: 'absolute', value: 1.8 });
  });
  it('common practice: relative in percent of reading for pressure, flow and power', () => {
    expect(defaultUncertainty('pressure', 'barg')).toEqual({ mode: 'relative', value: 0.5 });
    expect(defaultUncertainty('massFlow', 't/h')).toEqual({ mode: 'relative', value: 1 });
    expect(defaultUncertainty('power', 'MW')).toEqual({ mode: 'relative', value: 0.5 });
  });
  it('common practice: O2 0.2 %-points, i.e. 0.2 for a tag in % and 0.002 for a fraction', () => {
    expect(defaultUncertainty('o2Fraction', '%')).toEqual({ mode: 'absolute', value: 0.2 });
    expect(defaultUncertainty('o2Fraction', '1')).toEqual({ mode: 'absolute', value: 0.002 });
  });
});

describe('atmospheric pressure from elevation', () => {
  // U.S. Standard Atmosphere, 1976, Table I (geopotential altitude), printed to 5 figures; from memory.
  it.each([
    { h_m: 500, p_Pa: 9.5461e4 },
    { h_m: 1000, p_Pa: 8.9875e4 },
    { h_m: 2000, p_Pa: 7.9495e4 },
    { h_m: 3000, p_Pa: 7.0109e4 },
  ])('U.S. Standard Atmosphere 1976: p at $h_m m', ({ h_m, p_Pa }) => {
    expectClose(pressureAtElevation(h_m), p_Pa, { rtol: 1e-4 });
  });
  it('self-consistency: sea level gives the standard atmosphere exactly, and the range is enforced', () => {
    expect(pressureAtElevation(0)).toBe(101325);
    expect(() => pressureAtElevation(9000)).toThrow(RangeError);
  });
});
