import { describe, expect, it } from 'vitest';
import { unitStatus, type LinkModel, type StatusContext, type UnitModel } from '~/lib/plant';

const valve = (links: LinkModel[] = [], ports = true): UnitModel => ({
  name: 'PRV 1',
  kind: 'let-down-valve',
  parameters: {},
  ports: ports
    ? [
        { name: 'in', slot: 'inlet', fluid: { kind: 'water' } },
        { name: 'out', slot: 'outlet', fluid: { kind: 'water' } },
      ]
    : [],
  links,
});
const ctx = (over: Partial<StatusContext> = {}): StatusContext => ({ tagHints: new Map(), siteLinks: [], boilers: new Set(), ...over });
const L = (port: string | undefined, quantity: LinkModel['quantity'], tag: string, unit: string): LinkModel => ({ ...(port ? { port } : {}), quantity, tag, unit });
const fullValve = [L('in', 'pressure', 'P1', 'barg'), L('in', 'temperature', 'T1', 'degC'), L('in', 'massFlow', 'F1', 't/h'), L('out', 'pressure', 'P2', 'barg')];

describe('what a unit still lacks', () => {
  it('a valve without ports lacks its inlet and outlet', () => {
    const s = unitStatus(valve([], false), ctx());
    expect(s.complete).toBe(false);
    expect(s.missing.map((m) => [m.code, m.slot])).toEqual([
      ['MISSING_PORT', 'inlet'],
      ['MISSING_PORT', 'outlet'],
    ]);
  });

  it('a valve with ports but no links lacks inlet p, T and flow and outlet p (outlet T is optional: h is kept)', () => {
    const s = unitStatus(valve(), ctx());
    expect(s.missing.map((m) => `${m.port}:${m.quantities!.join('|')}`)).toEqual([
      'in:pressure',
      'in:temperature',
      'in:massFlow|volumeFlow|standardVolumeFlow',
      'out:pressure',
    ]);
  });

  it('becomes complete when each required measurement has a link, whichever flow quantity it is', () => {
    expect(unitStatus(valve(fullValve), ctx()).complete).toBe(true);
    const withVolume = [...fullValve.slice(0, 2), L('in', 'standardVolumeFlow', 'F1', 'Nm3/h'), fullValve[3]!];
    expect(unitStatus({ ...valve(withVolume), ports: [{ name: 'in', slot: 'inlet', fluid: { kind: 'air' } }, { name: 'out', slot: 'outlet', fluid: { kind: 'air' } }] }, ctx()).complete).toBe(true);
  });

  it('a port without a fluid lacks it', () => {
    const u = valve(fullValve);
    u.ports[1] = { name: 'out', slot: 'outlet' };
    expect(unitStatus(u, ctx()).missing.map((m) => m.code)).toContain('MISSING_FLUID');
  });

  it('a boiler without a fuel lacks it, and its flue gas takes its composition from the boiler itself', () => {
    const boiler: UnitModel = {
      name: 'B1',
      kind: 'boiler',
      parameters: {},
      ports: [{ name: 'stack', slot: 'flueGas', fluid: { kind: 'flue-gas' } }],
      links: [],
    };
    const s = unitStatus(boiler, ctx({ boilers: new Set(['B1']) }));
    expect(s.missing.map((m) => m.code)).toContain('MISSING_FUEL');
    expect(s.missing.map((m) => m.code)).not.toContain('MISSING_FUEL_SOURCE');
    expect(s.missing.filter((m) => m.port === 'stack').flatMap((m) => m.quantities)).toEqual(['temperature', 'o2Fraction']);
  });

  it('a fan moving flue gas must say which boiler the gas comes from', () => {
    const fan: UnitModel = {
      name: 'ID fan',
      kind: 'fan',
      parameters: {},
      ports: [
        { name: 'in', slot: 'inlet', fluid: { kind: 'flue-gas' } },
        { name: 'out', slot: 'outlet', fluid: { kind: 'flue-gas', fuelFrom: 'B1' } },
      ],
      links: [],
    };
    const s = unitStatus(fan, ctx({ boilers: new Set(['B1']) }));
    expect(s.missing.filter((m) => m.code === 'MISSING_FUEL_SOURCE').map((m) => m.port)).toEqual(['in']);
  });

  it('a heat port needs a boundary temperature, fixed or from a tag', () => {
    const cv: UnitModel = {
      name: 'Dryer hood',
      kind: 'control-volume',
      parameters: {},
      ports: [{ name: 'steam coil', slot: 'heatIn' }],
      links: [L('steam coil', 'heatFlow', 'Q1', 'kW')],
    };
    expect(unitStatus(cv, ctx()).missing.map((m) => m.code)).toEqual(['MISSING_BOUNDARY_T']);
    expect(unitStatus({ ...cv, ports: [{ name: 'steam coil', slot: 'heatIn', boundaryT_K: 453.15 }] }, ctx()).complete).toBe(true);
    expect(unitStatus({ ...cv, links: [...cv.links, L('steam coil', 'temperature', 'T9', 'degC')] }, ctx()).complete).toBe(true);
  });

  it('a generic control volume needs at least one port', () => {
    const cv: UnitModel = { name: 'CV', kind: 'control-volume', parameters: {}, ports: [], links: [] };
    expect(unitStatus(cv, ctx()).missing.map((m) => m.code)).toEqual(['MISSING_PORT']);
  });
});

describe('what conflicts in a unit\'s links', () => {
  it('a temperature tag (the export says degC) linked as a pressure', () => {
    const s = unitStatus(valve(fullValve), ctx({ tagHints: new Map([['P1', '°C']]) }));
    expect(s.conflicts.map((c) => [c.code, c.tag])).toEqual([['TAG_HINT_OTHER_QUANTITY', 'P1']]);
    expect(s.complete).toBe(false);
  });

  it('the export says barg but the link says bar (gauge against absolute)', () => {
    const links = [...fullValve];
    links[0] = L('in', 'pressure', 'P1', 'bar');
    const s = unitStatus(valve(links), ctx({ tagHints: new Map([['P1', 'bar(g)']]) }));
    expect(s.conflicts.map((c) => c.code)).toEqual(['UNIT_DIFFERS_FROM_HINT']);
  });

  it('the same spelling in another form is no conflict', () => {
    const s = unitStatus(valve(fullValve), ctx({ tagHints: new Map([['P1', 'bar(g)'], ['T1', '°C'], ['F1', 'T/H']]) }));
    expect(s.conflicts).toEqual([]);
  });

  it('one tag on two quantities, across units', () => {
    const siteLinks = [
      ...fullValve.map((l) => ({ unit: 'PRV 1', port: l.port, quantity: l.quantity, tag: l.tag })),
      { unit: 'Pump 3', port: 'suction', quantity: 'temperature' as const, tag: 'P1' },
    ];
    const s = unitStatus(valve(fullValve), ctx({ siteLinks }));
    expect(s.conflicts.map((c) => [c.code, c.tag])).toEqual([['TAG_ON_TWO_QUANTITIES', 'P1']]);
  });

  it('one flow tag on two ports of the same quantity is no conflict (units in series)', () => {
    const siteLinks = [
      ...fullValve.map((l) => ({ unit: 'PRV 1', port: l.port, quantity: l.quantity, tag: l.tag })),
      { unit: 'Desuperheater', port: 'in', quantity: 'massFlow' as const, tag: 'F1' },
    ];
    expect(unitStatus(valve(fullValve), ctx({ siteLinks })).conflicts).toEqual([]);
  });

  it('a unit that cannot convert, and two links for one measurement', () => {
    const links = [...fullValve, L('in', 'volumeFlow', 'F2', 'm3/h')];
    links[3] = L('out', 'pressure', 'P2', 'parsecs');
    const s = unitStatus(valve(links), ctx());
    expect(s.conflicts.map((c) => c.code).sort()).toEqual(['DUPLICATE_MEASUREMENT', 'UNIT_CANNOT_CONVERT']);
  });

  it('a link the port no longer takes (its fluid changed)', () => {
    const u = valve([...fullValve, L('out', 'vapourFraction', 'X2', '1')]);
    expect(unitStatus(u, ctx()).conflicts.map((c) => c.code)).toEqual(['LINK_NOT_IN_CATALOGUE']);
  });
});
