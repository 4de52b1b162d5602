/** A plant model file of the engine's reference units (./cases.ts), with invented prices. */
import { P_ATM_Pa, type EngineCase } from './cases';

export const GAS_PRICE = 30; // EUR/MWh (LHV), invented
export const POWER_PRICE = 90; // EUR/MWh, invented

/** A case's unit name in words ("heat exchanger"), so the pages never show a kind code as a name. */
export const unitNameOf = (c: { id: string }) => c.id.replace(/-/g, ' ');

export function modelOf(name: string, cases: EngineCase[]) {
  return {
    format: 'lossline-plant-model',
    version: 1,
    site: {
      name,
      timeZone: 'UTC',
      p_atm_Pa: P_ATM_Pa,
      deadState: { T0_K: 298.15, p0_Pa: 101325 },
      currency: 'EUR',
      prices: [
        { name: 'pipeline gas', kind: 'fuel', price_per_MWh: GAS_PRICE, currency: 'EUR' },
        { name: 'grid', kind: 'electricity', price_per_MWh: POWER_PRICE, currency: 'EUR' },
      ],
    },
    units: cases.map((c) => ({
      name: unitNameOf(c),
      kind: c.kind,
      parameters: c.parameters,
      ...(c.fuel ? { fuel: c.fuel } : {}),
      ports: c.ports,
      links: c.links.map((l) => ({
        ...(l.port ? { port: l.port } : {}),
        quantity: l.quantity,
        tag: l.tag,
        unit: l.unit,
        ...(l.basis ? { basis: l.basis } : {}),
        ...(l.uncertainty ? { uncertainty: l.uncertainty } : {}),
      })),
    })),
  };
}

