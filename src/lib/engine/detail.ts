/**
 * The audit trail of a unit hour (the hour opened up): inputs with their sources, port states, terms,
 * the balance and its checks, the uncertainty with its largest contributors, the tag hours used, the
 * cost basis and the notes. Built on first read only: the job stores the lean row, and the page that
 * opens an hour rebuilds it (src/server/services/engine.ts rebuildUnitHour).
 */
import type { BalanceChecks, BalanceRun, DeadState } from './checks';
import { ENGINE_VERSION, TOP_CONTRIBUTORS, finiteOrNull } from './constants';
import type { LinkSet } from './linkset';
import type { InputEntry, MappedUnit } from './map';
import type { UnitHourInput } from './types';

/** Everything the audit trail is built from. */
export interface DetailInputs {
  input: UnitHourInput;
  set: LinkSet;
  dead: DeadState;
  mapped: MappedUnit | null;
  minLoad: number;
  run: BalanceRun;
  checks: BalanceChecks;
  notes: string[];
}

type Unc = NonNullable<BalanceRun['unc']>;

/** GUM: each input's share of the variance of efficiency and destruction, the largest first. */
function contributorsOf(unc: Unc, entries: InputEntry[]): Record<string, unknown>[] {
  const contributors: Record<string, unknown>[] = [];
  const varE = unc.efficiency ? unc.efficiency.u ** 2 : 0;
  const varD = unc.destruction_W.u ** 2;
  entries.forEach((e, i) => {
    if (!(e.u > 0)) return;
    const cE = unc.sensitivity.efficiency[i]!;
    const cD = unc.sensitivity.destruction_W[i]!;
    contributors.push({
      input: e.name,
      ...(e.source.kind === 'tag' ? { tag: e.source.tag } : {}),
      u_SI: e.u,
      c_efficiency: finiteOrNull(cE),
      c_destruction: finiteOrNull(cD),
      share_efficiency: varE > 0 ? finiteOrNull((cE * e.u) ** 2 / varE) : null,
      share_destruction: varD > 0 ? finiteOrNull((cD * e.u) ** 2 / varD) : null,
    });
  });
  const key = unc.efficiency ? 'share_efficiency' : 'share_destruction';
  contributors.sort((a, b) => ((b[key] as number) ?? 0) - ((a[key] as number) ?? 0));
  contributors.splice(TOP_CONTRIBUTORS);
  return contributors;
}

const uOf = (x: { u: number; U: number }) => ({ u: finiteOrNull(x.u), U: finiteOrNull(x.U) });

function uncertaintyOf(unc: Unc | null, entries: InputEntry[]) {
  if (!unc) return null;
  return {
    k: unc.k,
    method: 'GUM first order, central differences through the whole calculation (JCGM 100:2008 5.1.2)',
    fuel_W: uOf(unc.fuel_W),
    product_W: unc.product_W ? uOf(unc.product_W) : null,
    loss_W: uOf(unc.loss_W),
    destruction_W: uOf(unc.destruction_W),
    efficiency: unc.efficiency ? uOf(unc.efficiency) : null,
    contributors: contributorsOf(unc, entries),
    unavailable: unc.unavailable,
  };
}

function portsOf(d: DetailInputs) {
  const balance = d.run.balance;
  if (!balance) return [];
  const boiler = d.mapped?.balanceKind === 'boiler';
  return Object.entries(balance.ports).map(([name, p]) => ({
    name,
    direction: p.direction,
    mDot_kg_per_s: p.mDot_kg_per_s,
    p_Pa: p.state.p,
    T_K: p.state.T,
    h_J_per_kg: p.state.h,
    s_J_per_kgK: p.state.s,
    x: p.state.x,
    phase: p.state.phase,
    psi_J_per_kg: p.state.psi,
    eCh_J_per_kg: p.state.eCh,
    exergy_W: p.mDot_kg_per_s * (p.state.psi + (boiler ? (p.state.eCh ?? 0) : 0)),
    flags: p.state.flags,
  }));
}

function balanceOf(d: DetailInputs) {
  const balance = d.run.balance;
  if (!balance) return null;
  const { entropy, massShare } = d.checks;
  return {
    fuel_W: balance.fuel_W,
    product_W: balance.product_W,
    loss_W: balance.loss_W,
    destruction_W: balance.destruction_W,
    efficiency: balance.efficiency,
    entropyGeneration_W_per_K: finiteOrNull(balance.entropyGeneration_W_per_K),
    T0Sgen_W: finiteOrNull(d.dead.T0_K * balance.entropyGeneration_W_per_K),
    gouyStodolaResidual_W: finiteOrNull(balance.gouyStodolaResidual_W),
    entropyCheckShare: entropy ? finiteOrNull(entropy.share) : null,
    massResidual_kg_per_s: balance.massResidual_kg_per_s,
    massClosureShare: finiteOrNull(massShare),
    energyResidual_W: balance.energyResidual_W,
    energyClosure_pct: balance.energyClosure_pct,
    extras: Object.fromEntries(Object.entries(balance.extras).map(([k, v]) => [k, finiteOrNull(v)])),
    flags: balance.flags,
  };
}

function tagHoursOf(d: DetailInputs) {
  const { input, set } = d;
  return set.usedTags.map((t) => {
    const l = set.linkOfTag.get(t);
    const th = input.tagHours.get(t);
    return {
      tag: t,
      ...(l
        ? { linkId: l.id, port: l.portName, quantity: l.quantity, engUnit: l.engUnit, uncertainty: { mode: l.uncertaintyMode, value: l.uncertainty }, validMin: l.validMin, validMax: l.validMax, validFromMs: l.validFromMs, validToMs: l.validToMs }
        : { role: input.site.t0Tag?.name === t ? 'ambient temperature (dead state)' : 'flue-gas O2 of the source boiler' }),
      hour: th ?? null,
    };
  });
}

/** The audit trail of the hour (JSON-safe). */
export function detailOf(d: DetailInputs): Record<string, unknown> {
  const { input, mapped, run } = d;
  const cost = input.cost;
  return {
    engine: ENGINE_VERSION,
    kind: input.unit.kind,
    balanceKind: mapped?.balanceKind ?? null,
    deadState: d.dead,
    load: mapped ? { ...mapped.load, value: finiteOrNull(mapped.load.value), minLoad: d.minLoad } : null,
    plan: mapped?.ports ?? [],
    inputs: run.entries.map((e) => ({ name: e.name, value: finiteOrNull(e.value), u: e.u, source: e.source })),
    ports: portsOf(d),
    terms: run.balance?.terms ?? [],
    balance: balanceOf(d),
    balanceError: run.balanceError,
    uncertainty: uncertaintyOf(run.unc, run.entries),
    tagHours: tagHoursOf(d),
    cost: cost ? { cF_per_J: cost.cF_per_J, cF_per_MWh: cost.cF_per_J * 3.6e9, basis: cost.basis, currency: input.site.currency } : null,
    notes: d.notes,
  };
}
