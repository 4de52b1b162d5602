/**
 * The pure hourly engine (src/lib/engine): a unit of the plant model, its links and invented tag hours
 * in; the unit hour out. Reference figures come from outside the engine (see ./cases.ts).
 */
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { computeUnitHour, costKindOf, sha256Hex, canonicalJson, steamCost, ENGINE_VERSION } from '~/lib/engine';
import { ByteHasher } from '~/lib/engine/hash';
import { THIN_SPACE } from '~/lib/format';
import { expectClose } from '../support/expect-close';
import { ALL_CASES, boilerCase, heatExchangerCase, pumpCase, refCase, turbineCase, valveCase } from './cases';
import { HOUR0, hoursOf, inputOf, linksOf, siteOf, unitOf } from './support';

/** The brief's acceptance tolerance on destruction and efficiency: 0.1 percent. */
const RTOL = 1e-3;

describe.each(ALL_CASES())('$kind from tag readings in engineering units', (c) => {
  const r = computeUnitHour(inputOf(c));

  it(`destruction and efficiency within 0.1 % of ${c.source}`, () => {
    expectClose(r.destruction_W!, c.expected.destruction_W, { rtol: RTOL, label: `${c.id} destruction_W` });
    if (c.expected.efficiency === null) expect(r.efficiency).toBeNull();
    else expectClose(r.efficiency!, c.expected.efficiency, { rtol: RTOL, label: `${c.id} efficiency` });
    expectClose(r.fuel_W!, c.expected.fuel_W, { rtol: RTOL, label: 'fuel_W' });
  });

  it('is a steady hour with a closure, an uncertainty and hashes', () => {
    expect(r.reasons).toEqual([]);
    expect(r.state).toBe('steady');
    expect(Number.isFinite(r.closure_pct)).toBe(true);
    expect(r.destruction_U_W).toBeGreaterThan(0);
    expect(r.modelVersion).toMatch(/^[0-9a-f]{32}$/);
    expect(r.inputsHash).toMatch(/^[0-9a-f]{32}$/);
  });

  it('self-consistency: F = P + L + D and D against T0 Sgen within the entropy check', () => {
    expectClose(r.fuel_W! - (r.product_W ?? 0) - r.loss_W!, r.destruction_W!, { rtol: 1e-9, atol: 1e-6 });
    const bal = r.detail.balance as { T0Sgen_W: number; gouyStodolaResidual_W: number };
    expectClose(r.destruction_W! - bal.T0Sgen_W, bal.gouyStodolaResidual_W, { rtol: 1e-6, atol: 1e-6 * r.fuel_W! });
  });
});

describe('heat exchanger against tests/engine/engine-reference.py (python3-iapws)', () => {
  const c = heatExchangerCase();
  const r = computeUnitHour(inputOf(c));
  it('entropy generation within 0.1 %', () => {
    expectClose(r.entropyGeneration_W_per_K!, c.expected.entropyGeneration_W_per_K!, { rtol: RTOL });
  });
  it('expanded uncertainty (k = 2) of efficiency and destruction within 1 % of the script\'s own GUM propagation', () => {
    expectClose(r.efficiency_U!, c.expected.efficiency_U!, { rtol: 0.01 });
    expectClose(r.destruction_U_W!, c.expected.destruction_U_W!, { rtol: 0.01 });
  });
  it('lists the biggest uncertainty contributors with their tags, shares summing to at most 1', () => {
    const u = r.detail.uncertainty as { contributors: { tag?: string; share_efficiency: number }[] };
    expect(u.contributors.length).toBeGreaterThan(2);
    expect(u.contributors[0]!.tag).toMatch(/^HX_/);
    const shares = u.contributors.map((x) => x.share_efficiency);
    expect([...shares].sort((a, b) => b - a)).toEqual(shares);
    expect(shares.reduce((a, b) => a + b, 0)).toBeLessThanOrEqual(1 + 1e-9);
  });
});

describe('port states', () => {
  it('a wet turbine exhaust comes from the energy balance with power and generator efficiency, never from p and T', () => {
    const c = turbineCase();
    // Link an exhaust temperature at saturation (p = 9 kPa: Tsat = 43.76 degC, IAPWS-IF97 eq. 31).
    c.links.push({ port: 'exhaust', quantity: 'temperature', tag: 'TG_EX_T', unit: 'degC', reading: 43.76 });
    const r = computeUnitHour(inputOf(c));
    expectClose(r.destruction_W!, c.expected.destruction_W, { rtol: RTOL, label: 'D' });
    const exhaust = (r.detail.ports as { name: string; x: number }[]).find((p) => p.name === 'exhaust')!;
    expectClose(exhaust.x, refCase('turbine-extraction-wet-exhaust').expected.exhaust_x!, { rtol: RTOL, label: 'exhaust x (scripts/equipment-reference.py)' });
    const plan = (r.detail.plan as { name: string; state: string }[]).find((p) => p.name === 'exhaust')!;
    expect(plan.state).toMatch(/energy balance/);
  });

  it('a superheated exhaust takes p and T (the energy balance then becomes a check)', () => {
    const c = turbineCase();
    c.links.push({ port: 'exhaust', quantity: 'temperature', tag: 'TG_EX_T', unit: 'degC', reading: 80 });
    const r = computeUnitHour(inputOf(c));
    const plan = (r.detail.plan as { name: string; state: string }[]).find((p) => p.name === 'exhaust')!;
    expect(plan.state).toBe('p and T');
    expect(Math.abs(r.closure_pct!)).toBeGreaterThan(1); // 80 degC vapour at 9 kPa does not close this turbine's energy
  });

  it('a fuel flow in Nm3/h gives the same boiler as the same flow in kg/s', () => {
    const c = boilerCase();
    const f = c.links.find((l) => l.tag === 'B_GAS_F')!;
    // Hand-worked: M = 0.93 x 16.04246 + 0.04 x 30.06904 + 0.01 x 44.0095 + 0.02 x 28.0134 g/mol (IUPAC atomic
    // weights as in NASA/TP-2002-211556) = 16.93307 g/mol; Nm3 at 273.15 K and 101325 Pa:
    // V = n R T / p with n = mDot / M, R = 8.31446261815324 J/(mol K) (2019 SI).
    const M = 0.93 * 0.01604246 + 0.04 * 0.03006904 + 0.01 * 0.0440095 + 0.02 * 0.0280134;
    const Nm3_per_h = ((f.reading / M) * 8.31446261815324 * 273.15) / 101325 * 3600;
    f.unit = 'Nm3/h';
    f.quantity = 'standardVolumeFlow';
    f.reading = Nm3_per_h;
    const r = computeUnitHour(inputOf(c));
    expectClose(r.destruction_W!, c.expected.destruction_W, { rtol: RTOL, label: 'D' });
    expectClose(r.efficiency!, c.expected.efficiency!, { rtol: RTOL, label: 'efficiency' });
  });

  it('a boiler blowdown without a temperature is saturated liquid at its pressure', () => {
    const r = computeUnitHour(inputOf(boilerCase()));
    const plan = (r.detail.plan as { name: string; state: string }[]).find((p) => p.name === 'blowdown')!;
    expect(plan.state).toMatch(/saturated liquid/);
  });
});

describe('hour states', () => {
  const reasonCodes = (r: { reasons: { code: string }[] }) => r.reasons.map((x) => x.code);

  it('idle below the minimum load, with the load in the reason', () => {
    const c = turbineCase(); // minLoad_W 1 MW
    const r = computeUnitHour(inputOf(c, { TG_MW: { mean: 0.4, min: 0.39, max: 0.41 } }));
    expect(r.state).toBe('idle');
    expect(reasonCodes(r)).toContain('BELOW_MIN_LOAD');
    expect(r.reasons.find((x) => x.code === 'BELOW_MIN_LOAD')!.message).toBe(`power 400.0 kW is below the minimum load 1${THIN_SPACE}000.0 kW`); // grouped by the one formatter (src/lib/format.ts)
    expect(r.load).toBeCloseTo(4e5, 3);
  });

  it('idle at zero load even with no minimum load set, and the failed balance is a note, not a reason', () => {
    const c = valveCase();
    c.parameters = {};
    const r = computeUnitHour(inputOf(c, { PRV_F: { mean: 0, min: 0, max: 0 } }));
    expect(r.state).toBe('idle');
    expect(reasonCodes(r)).toEqual(['BELOW_MIN_LOAD']);
  });

  it('unsettled when a key tag swings more than the spread limit within the hour', () => {
    const c = pumpCase();
    const flow = c.links.find((l) => l.tag === 'FWP_F')!.reading;
    const r = computeUnitHour(inputOf(c, { FWP_F: { min: flow * 0.95, max: flow * 1.05 } }));
    expect(r.state).toBe('unsettled');
    expect(r.reasons).toEqual([expect.objectContaining({ code: 'SPREAD_HIGH', tag: 'FWP_F' })]);
    expect(r.destruction_W).not.toBeNull(); // still computed, kept out of trends by its state
  });

  it('the spread limit is the unit parameter spreadLimit', () => {
    const c = pumpCase();
    c.parameters = { ...c.parameters, spreadLimit: 0.2 };
    const flow = c.links.find((l) => l.tag === 'FWP_F')!.reading;
    expect(computeUnitHour(inputOf(c, { FWP_F: { min: flow * 0.95, max: flow * 1.05 } })).state).toBe('steady');
  });

  it('suspect when a tag has no value in the hour', () => {
    const r = computeUnitHour(inputOf(pumpCase(), { FWP_DIS_T: null }));
    expect(r.state).toBe('suspect');
    expect(r.reasons[0]).toEqual(expect.objectContaining({ code: 'TAG_MISSING', tag: 'FWP_DIS_T' }));
    expect(r.destruction_W).toBeNull();
  });

  it('suspect when a transmitter is frozen', () => {
    const r = computeUnitHour(inputOf(pumpCase(), { FWP_SUC_P: { flatline: true } }));
    expect(r.state).toBe('suspect');
    expect(reasonCodes(r)).toContain('TAG_FROZEN');
  });

  it('suspect when readings leave the link\'s valid range', () => {
    const c = valveCase();
    const input = inputOf(c);
    const links = linksOf(c).map((l) => (l.tagName === 'PRV_F' ? { ...l, validMax: 1.5 } : l));
    const r = computeUnitHour({ ...input, links });
    expect(r.state).toBe('suspect');
    expect(r.reasons[0]).toEqual(expect.objectContaining({ code: 'TAG_OUT_OF_RANGE', tag: 'PRV_F' }));
  });

  it('suspect when the ingest counted out-of-range samples or the hour is poorly covered', () => {
    expect(reasonCodes(computeUnitHour(inputOf(valveCase(), { PRV_IN_T: { outOfRange: 3 } })))).toContain('TAG_OUT_OF_RANGE');
    expect(reasonCodes(computeUnitHour(inputOf(valveCase(), { PRV_IN_T: { coveredFraction: 0.4 } })))).toContain('TAG_POOR_COVERAGE');
  });

  it('suspect when the first law does not close (a heat-exchanger side off by 20 %)', () => {
    const c = heatExchangerCase();
    const f = c.links.find((l) => l.tag === 'HX_COLD_IN_F')!.reading;
    const r = computeUnitHour(inputOf(c, { HX_COLD_IN_F: { mean: f * 1.2, min: f * 1.199, max: f * 1.201 } }));
    expect(r.state).toBe('suspect');
    expect(reasonCodes(r)).toContain('BALANCE_NOT_CLOSED');
    expect(reasonCodes(r)).toContain('ENTROPY_CHECK_FAILED');
  });

  it('suspect when measured flows do not balance mass (pump outlet flow 10 % low)', () => {
    const c = pumpCase();
    const f = c.links.find((l) => l.tag === 'FWP_F')!;
    c.links.push({ port: 'discharge', quantity: 'massFlow', tag: 'FWP_DIS_F', unit: 't/h', reading: f.reading * 0.9 });
    const r = computeUnitHour(inputOf(c));
    expect(r.state).toBe('suspect');
    const mass = r.reasons.find((x) => x.code === 'BALANCE_NOT_CLOSED' && x.message.startsWith('mass'));
    expect(mass!.message).toMatch(/^mass balance misses by 10\.0 %/);
  });

  it('suspect when a required link is missing, naming it', () => {
    const c = pumpCase();
    c.links = c.links.filter((l) => l.tag !== 'FWP_KW');
    const r = computeUnitHour(inputOf(c));
    expect(r.state).toBe('suspect');
    expect(r.reasons[0]).toEqual(expect.objectContaining({ code: 'LINK_MISSING', message: 'no power of the unit linked' }));
  });
});

describe('dead state', () => {
  it('takes T0 from the ambient tag when it has a value, else the site setting (noted)', () => {
    const c = valveCase();
    const hours = hoursOf(c);
    hours.set('AMB_T', { mean: 15, min: 14.5, max: 15.5, std: 0.3, samples: 60, coveredFraction: 1, nonNumeric: 0, outOfRange: 0, flatline: false });
    const site = siteOf({ t0Tag: { name: 'AMB_T', engUnit: 'degC' } });
    const withTag = computeUnitHour({ unit: unitOf(c), links: linksOf(c), tagHours: hours, site, hourStartMs: HOUR0, cost: null });
    expectClose(withTag.T0_K, 288.15, { rtol: 1e-12 });
    hours.delete('AMB_T');
    const fallback = computeUnitHour({ unit: unitOf(c), links: linksOf(c), tagHours: hours, site, hourStartMs: HOUR0, cost: null });
    expect(fallback.T0_K).toBe(298.15);
    expect((fallback.detail.notes as string[]).join(' ')).toMatch(/ambient tag AMB_T has no usable value/);
    expect(fallback.inputsHash).not.toBe(withTag.inputsHash);
  });
});

describe('cost of destruction', () => {
  it('prices a pump\'s destruction at the electricity price: 90 EUR/MWh x 16.918 kW = 1.5226 EUR/h (hand-worked)', () => {
    const c = pumpCase();
    const r = computeUnitHour(inputOf(c, {}, { cost: { cF_per_J: 90 / 3.6e9, basis: 'test' } }));
    expectClose(r.destructionCost_per_h!, (90 * c.expected.destruction_W) / 1e6, { rtol: RTOL });
    expect(costKindOf(unitOf(c))).toBe('electricity');
  });

  it('self-consistency: steam costs the fuel\'s exergy price divided by the boiler\'s exergy efficiency', () => {
    const s = steamCost([{ name: 'B1', fuel_W: 50e6, product_W: 20e6, cF_per_J: 1e-8 }], null, 'EUR')!;
    expectClose(s.cF_per_J, 1e-8 / 0.4, { rtol: 1e-12 });
    expect(s.basis).toMatch(/exergy efficiency 40\.0 %/);
    const fallback = steamCost([], { cF_per_J: 1e-8, basis: 'fuel' }, 'EUR')!;
    expect(fallback.cF_per_J).toBe(1e-8);
    expect(fallback.basis).toMatch(/lower bound/);
    expect(costKindOf(unitOf(turbineCase()))).toBe('steam');
  });
});

describe('hashes', () => {
  it('SHA-256 of "abc" and of the empty text (FIPS 180-4 / NIST CSRC examples)', () => {
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
  });

  it('SHA-256 agrees with node:crypto (an independent implementation) on texts of every length up to three blocks, ASCII or not', () => {
    for (let n = 0; n < 200; n++) {
      const t = Array.from({ length: n }, (_, i) => (i % 7 === 3 && n % 2 ? 'é°Ω' : 'abcXYZ09|=,'[(i * 7 + n) % 11])).join('');
      expect(sha256Hex(t)).toBe(createHash('sha256').update(t, 'utf8').digest('hex'));
    }
  });

  it('the byte hasher digests texts and binary64 numbers as documented (checked against node:crypto)', () => {
    const parts: Buffer[] = [Buffer.from('TG_MW\u0000', 'utf8'), Buffer.from([1]), Buffer.alloc(8), Buffer.from([2]), Buffer.from([1]), Buffer.alloc(8), Buffer.from('Ω\u0000', 'utf8'), Buffer.from([3, 0, 0, 1, 44, 7])];
    parts[2]!.writeDoubleLE(11.92, 0);
    parts[5]!.writeDoubleLE(0, 0); // -0 is written as 0
    const want = createHash('sha256').update(Buffer.concat(parts)).digest('hex');
    expect(new ByteHasher().reset().text('TG_MW').num(11.92).num(NaN).num(-0).text('Ω').int(300).byte(7).digest()).toBe(want);
  });

  it('canonical JSON sorts keys and drops undefined members', () => {
    expect(canonicalJson({ b: 1, a: [1, undefined, -0], c: undefined })).toBe('{"a":[1,null,0],"b":1}');
  });

  it('the same inputs give the same row; a changed reading changes the inputs hash but not the model version', () => {
    const a = computeUnitHour(inputOf(valveCase()));
    const b = computeUnitHour(inputOf(valveCase()));
    expect(b).toEqual(a);
    const c = valveCase();
    const moved = computeUnitHour(inputOf(c, { PRV_F: { mean: 2.01 } }));
    expect(moved.inputsHash).not.toBe(a.inputsHash);
    expect(moved.modelVersion).toBe(a.modelVersion);
    expect(a.detail.engine).toBe(ENGINE_VERSION);
  });

  it('a changed link changes the model version', () => {
    const c = valveCase();
    const links = linksOf(c).map((l) => (l.tagName === 'PRV_F' ? { ...l, uncertainty: 2 } : l));
    const a = computeUnitHour(inputOf(c));
    const b = computeUnitHour({ ...inputOf(c), links });
    expect(b.modelVersion).not.toBe(a.modelVersion);
  });

  it('without uncertainty the figures are the same and U is absent', () => {
    const a = computeUnitHour(inputOf(boilerCase()));
    const b = computeUnitHour(inputOf(boilerCase()), { uncertainty: false });
    expect(b.destruction_W).toBe(a.destruction_W);
    expect(b.efficiency_U).toBeNull();
  });
});
