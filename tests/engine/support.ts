/** Builders shared by the engine tests: a case as the pure engine's input. */
import type { EngineLink, EngineSite, EngineUnit, TagHour, UnitHourInput } from '~/lib/engine';
import { P_ATM_Pa, steadyHour, type EngineCase } from './cases';

export const HOUR0 = Date.UTC(2024, 2, 1, 10);

export function siteOf(over: Partial<EngineSite> = {}): EngineSite {
  return { p_atm_Pa: P_ATM_Pa, T0_K: 298.15, p0_Pa: 101325, t0Tag: null, currency: 'EUR', prices: [], ...over };
}

export function unitOf(c: EngineCase): EngineUnit {
  return {
    id: `unit-${c.id}`,
    name: c.id,
    kind: c.kind,
    parameters: c.parameters,
    fuel: c.fuel ?? null,
    ports: c.ports.map((p) => ({ name: p.name, slot: p.slot, fluid: p.fluid, boundaryT_K: null, account: null })),
  };
}

export function linksOf(c: EngineCase): EngineLink[] {
  return c.links.map((l, i) => ({
    id: `link-${c.id}-${i}`,
    portName: l.port ?? null,
    quantity: l.quantity,
    tagName: l.tag,
    engUnit: l.unit,
    basis: l.basis ?? null,
    uncertaintyMode: l.uncertainty?.mode ?? (l.quantity === 'temperature' ? 'absolute' : 'relative'),
    uncertainty: l.uncertainty?.value ?? (l.quantity === 'temperature' ? 1 : l.quantity === 'o2Fraction' ? 0.2 : 1),
    validMin: null,
    validMax: null,
    validFromMs: 0,
    validToMs: null,
  }));
}

/** The case's readings as steady tag hours, with per-tag changes. */
export function hoursOf(c: EngineCase, change: Record<string, Partial<TagHour> | null> = {}): Map<string, TagHour> {
  const m = new Map<string, TagHour>();
  for (const l of c.links) {
    if (change[l.tag] === null) continue;
    m.set(l.tag, { ...steadyHour(l.reading), ...(change[l.tag] ?? {}) });
  }
  return m;
}

export function inputOf(c: EngineCase, change: Record<string, Partial<TagHour> | null> = {}, over: Partial<UnitHourInput> = {}): UnitHourInput {
  return { unit: unitOf(c), links: linksOf(c), tagHours: hoursOf(c, change), site: siteOf(), hourStartMs: HOUR0, cost: null, ...over };
}
