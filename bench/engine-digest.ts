/**
 * A digest of what the engine produces, to hold a speed change to "the same to the last bit":
 * the rows (with and without uncertainty: state, reasons, figures, uncertainties, cost, model
 * version, inputs hash) of bench hours with random flaws, and the audit trails of every eighth hour.
 * Run it on the tree before a change and on the tree after; the digests must be equal.
 *
 *   node --import tsx bench/engine-digest.ts               8,000 unit hours
 *   node --import tsx bench/engine-digest.ts --hours=400   hours per unit (default 160 x 50 units)
 *
 * Flaws (seeded, so every run makes the same hours): a swinging tag (spread up to 12 % of the mean),
 * a missing tag, a frozen tag, samples out of range, a poorly covered tag, status words, a spread
 * given as a standard deviation only, low loads (idle hours) and shifted readings (balances that do
 * not close: suspect hours).
 */
import { createHash } from 'node:crypto';
import { computeUnitHour, type TagHour, type UnitHourInput } from '~/lib/engine';
import { buildSite, hourOf, rng } from './engine';

const H = 3_600_000;
const T_START = Date.UTC(2025, 0, 1);

/** The numbers exactly: JSON writes the shortest text that reads back to the same double; -0 and NaN kept apart. */
function exact(_k: string, v: unknown) {
  if (typeof v === 'number') return Object.is(v, -0) ? '-0' : Number.isNaN(v) ? 'NaN' : v === Infinity ? 'Inf' : v === -Infinity ? '-Inf' : v;
  return v;
}

function flawed(tagHours: Map<string, TagHour>, r: () => number, loadBy: number, loadTags: Set<string>): Map<string, TagHour> {
  const out = new Map<string, TagHour>();
  const shiftAll = r() < 0.05;
  for (const [name, th0] of tagHours) {
    const th: TagHour = { ...th0 };
    if (loadTags.has(name) && th.mean !== null) {
      th.mean *= loadBy;
      th.min = th.min === null ? null : th.min * loadBy;
      th.max = th.max === null ? null : th.max * loadBy;
      th.std = th.std === null ? null : th.std * loadBy;
    }
    if (shiftAll && th.mean !== null && r() < 0.5) {
      const f = 1 + (r() - 0.5) * 0.2;
      th.mean *= f;
      th.min = th.min === null ? null : th.min * f;
      th.max = th.max === null ? null : th.max * f;
    }
    const x = r();
    if (x < 0.02) continue; // missing
    if (x < 0.04) th.flatline = true;
    else if (x < 0.06) th.outOfRange = 3;
    else if (x < 0.08) th.coveredFraction = 0.4;
    else if (x < 0.09) th.nonNumeric = 20;
    else if (x < 0.1) th.samples = 0;
    else if (x < 0.13 && th.mean !== null) {
      const half = Math.abs(th.mean) * 0.06 * r();
      th.min = th.mean - half;
      th.max = th.mean + half;
    } else if (x < 0.15) {
      th.min = null;
      th.max = null;
    }
    out.set(name, th);
  }
  return out;
}

function main() {
  const args = new Map(process.argv.slice(2).map((a) => [a.replace(/^--/, '').split('=')[0]!, a.split('=')[1] ?? 'true']));
  const hours = Number(args.get('hours') ?? 160);
  const units = buildSite();
  const r = rng(4242);
  const rows = createHash('sha256');
  const details = createHash('sha256');
  const states: Record<string, number> = {};
  let n = 0;
  for (let h = 0; h < hours; h++) {
    for (const u of units) {
      const loadTags = new Set(u.tags.filter((t) => t.load).map((t) => t.name));
      const y = r();
      const loadBy = y < 0.05 ? 0.02 * r() : y < 0.1 ? 0.3 + r() : 1;
      const tagHours = flawed(hourOf(u, h, r), r, loadBy, loadTags);
      const input: UnitHourInput = { ...u.input, tagHours, hourStartMs: T_START + h * H };
      const a = computeUnitHour(input, { uncertainty: true });
      const b = computeUnitHour(input, { uncertainty: false });
      rows.update(JSON.stringify(a, exact)).update('\n').update(JSON.stringify(b, exact)).update('\n');
      if (n % 8 === 0) details.update(JSON.stringify(a.detail, exact)).update('\n').update(JSON.stringify(b.detail, exact)).update('\n');
      states[a.state] = (states[a.state] ?? 0) + 1;
      n++;
    }
  }
  console.log(`unit hours: ${n}; states (with uncertainty): ${JSON.stringify(states)}`);
  console.log(`rows digest:   ${rows.digest('hex')}`);
  console.log(`details digest: ${details.digest('hex')}`);
}

main();
