/**
 * The demo's passing let-down valve raises its "running while idle" notice: four weeks of the demo
 * plan (scaled from the year: TG1 inspection on day 3, PRV1 passing from day 20), read back through
 * the ingest core, balanced hour by hour by the engine core for PRV1 and TG1, then judged by the idle
 * rule with the demo model's declaration (PRV1 normally idle while TG1 runs).
 */
import { describe, expect, it } from 'vitest';
import { idleRuns, type RuleHour } from '~/lib/analytics/unit-rules';
import { computeUnitHour, type EngineLink, type EngineSite, type EngineUnit, type TagHour } from '~/lib/engine';
import { defaultParameters } from '~/lib/plant/kinds';
import type { UnitModel } from '~/lib/plant/model';
import { defaultUncertainty } from '~/lib/plant/uncertainty';
import { resolvePlan, type GenerateOptions } from '../../scripts/demo/generate';
import { demoModel, DEMO_TIME_ZONE } from '../../scripts/demo/site';
import { generate, HOUR_ms, Hours } from './support';

const OPTS: GenerateOptions = { start: '2025-01-06', days: 28, seed: 7 };

function engineUnit(u: UnitModel): EngineUnit {
  return {
    id: u.name,
    name: u.name,
    kind: u.kind,
    parameters: { ...defaultParameters(u.kind), ...u.parameters },
    fuel: u.fuel ?? null,
    ports: u.ports.map((p) => ({ name: p.name, slot: p.slot, fluid: p.fluid ?? null, boundaryT_K: p.boundaryT_K ?? null, account: p.account ?? null })),
  };
}

function engineLinks(u: UnitModel): EngineLink[] {
  return u.links.map((l, i) => {
    const unc = l.uncertainty ?? defaultUncertainty(l.quantity, l.unit);
    return {
      id: `${u.name}-${i}`,
      portName: l.port ?? null,
      quantity: l.quantity,
      tagName: l.tag,
      engUnit: l.unit,
      basis: l.basis ?? null,
      uncertaintyMode: unc.mode,
      uncertainty: unc.value,
      validMin: l.validMin ?? null,
      validMax: l.validMax ?? null,
      validFromMs: 0,
      validToMs: null,
    };
  });
}

describe('the demo: PRV1 passing steam', () => {
  const model = demoModel();
  const prv = model.units.find((u) => u.name === 'PRV1')!;
  const tg = model.units.find((u) => u.name === 'TG1')!;
  const { plan } = resolvePlan(OPTS);
  const hours = new Hours(generate(OPTS).files);
  const site: EngineSite = {
    p_atm_Pa: model.site.p_atm_Pa!,
    T0_K: model.site.deadState.T0_K,
    p0_Pa: model.site.deadState.p0_Pa,
    t0Tag: { name: model.site.deadState.T0Tag!.tag, engUnit: model.site.deadState.T0Tag!.unit },
    currency: model.site.currency,
    prices: model.site.prices,
  };
  const stateOf = (u: UnitModel) => {
    const unit = engineUnit(u);
    const links = engineLinks(u);
    const tags = [...new Set([...links.map((l) => l.tagName), site.t0Tag!.name])];
    return hours.hourStarts().map((h): RuleHour => {
      const th = new Map<string, TagHour>();
      for (const t of tags) {
        const s = hours.byTag.get(t)?.get(h);
        if (s)
          th.set(t, { mean: s.mean, min: s.min, max: s.max, std: s.stdDev, samples: s.sampleCount, coveredFraction: s.coveredFraction, nonNumeric: s.nonNumericCount, outOfRange: s.outOfRangeCount, flatline: s.flatline });
      }
      const r = computeUnitHour({ unit, links, tagHours: th, site, hourStartMs: h, cost: null });
      return { hourStartMs: h, state: r.state, destruction_W: r.destruction_W, destructionCost_per_h: null, efficiency: r.efficiency };
    });
  };
  const prvHours = stateOf(prv);
  const tgRunning = new Set(stateOf(tg).filter((h) => h.state === 'steady' || h.state === 'unsettled').map((h) => h.hourStartMs));

  it('self-consistency: the demo model declares PRV1 normally idle while TG1 runs', () => {
    expect(prv.normallyIdle).toEqual({ when: 'always', whileRunning: ['TG1'] });
  });

  it('self-consistency: the idle rule finds the passing within hours of its start, and nothing before it', () => {
    const runs = idleRuns(prvHours, prv.normallyIdle!, DEMO_TIME_ZONE, (ms) => tgRunning.has(ms));
    expect(runs.length).toBeGreaterThanOrEqual(1);
    const start = plan.valvePassingStartMs!;
    expect(runs.every((r) => r.lastMs >= start)).toBe(true);
    const first = runs[0]!;
    // the leak starts at 10:30: the first hour it runs in is 10:00 (half the hour) or 11:00
    expect(first.fromMs).toBeGreaterThanOrEqual(start - HOUR_ms);
    expect(first.fromMs).toBeLessThanOrEqual(start + 2 * HOUR_ms);
    expect(first.signalMs - first.fromMs).toBe(3 * HOUR_ms);
    // it runs around the clock from then on: most hours after the start are in a long run
    const after = prvHours.filter((h) => h.hourStartMs >= start + HOUR_ms).length;
    expect(runs.reduce((a, r) => a + r.hours, 0)).toBeGreaterThan(0.8 * after);
    // throttling about 0.8-1.8 t/h from 40 to 4 bar(g) destroys tens of kW
    expect(first.meanDestruction_W!).toBeGreaterThan(20_000);
  });

  it('self-consistency: the TG1 inspection, when PRV1 carries the LP demand by design, raises nothing; without the TG1 condition it would', () => {
    const { fromMs, toMs } = plan.turbineOutage!;
    const inspection = prvHours.filter((h) => h.hourStartMs >= fromMs && h.hourStartMs < toMs);
    expect(inspection.filter((h) => h.state === 'steady' || h.state === 'unsettled').length).toBeGreaterThan(4);
    const bare = idleRuns(prvHours, { when: 'always' }, DEMO_TIME_ZONE);
    expect(bare.some((r) => r.fromMs < toMs && r.lastMs >= fromMs)).toBe(true);
    const withTg = idleRuns(prvHours, prv.normallyIdle!, DEMO_TIME_ZONE, (ms) => tgRunning.has(ms));
    expect(withTg.some((r) => r.fromMs < toMs && r.lastMs >= fromMs)).toBe(false);
  });
});
