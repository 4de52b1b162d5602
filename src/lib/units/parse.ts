/**
 * The unit-text normaliser: turns the spellings found in historian exports ('°C', 'deg C', 'bar(g)',
 * 'kg/cm²', 'T/H', 'm³/h', 'vol% dry') into Lossline's canonical unit names.
 */
import { aliases, registry } from './registry';
import type { Quantity } from './quantities';

/** Basis of a gas composition or gas flow: on dry gas or on wet (as-sampled) gas. */
export type GasBasis = 'dry' | 'wet';
/** What a fraction counts: volume (= mole for ideal gases), mole, or mass. */
export type FractionKind = 'volume' | 'mole' | 'mass';

/** Result of reading one unit text: canonical unit (or null) plus the flags written beside it. */
export interface UnitDescription {
  /** Canonical unit, or null when the text is not recognised. */
  readonly unit: string | null;
  /** 'dry' or 'wet' when the text states it ('vol% dry', 'ppmvd', 'Nm3/h (wet)'). */
  readonly basis?: GasBasis;
  /** For fractions: what is counted, when the text states it ('vol%', 'mol%', 'wt%', 'ppmw'). */
  readonly fractionKind?: FractionKind;
}

/**
 * Reduces a unit text to a lookup key: NFKC (superscripts to digits, '℃' to '°C'), degree signs to
 * 'deg', 'Δ' to 'delta', ' per ' to '/', drops spaces, brackets, '-', '_', '.', '·', '*', '^', and
 * maps '/hr', '/sec', '/day', '/minute' to '/h', '/s', '/d', '/min'.
 */
export function squashUnitText(text: string): string {
  let s = text.normalize('NFKC').trim();
  s = s.replace(/[°º˚]/g, 'deg').replace(/[Δ∆]/g, 'delta').replace(/[µμ]/g, 'u');
  s = s.replace(/\s+per\s+/gi, '/');
  s = s.replace(/[\s()[\]{}_\-.·⋅*^]/g, '');
  s = s
    .replace(/\/(hrs?|hours?)$/i, '/h')
    .replace(/\/(secs?|seconds?)$/i, '/s')
    .replace(/\/(days?)$/i, '/d')
    .replace(/\/(mins?|minutes?)$/i, '/min');
  return s;
}

/** Every canonical unit in the registry (a unit may serve several quantities). */
const canonicalUnits: ReadonlySet<string> = new Set(
  Object.values(registry).flatMap((entries) => entries.map((e) => e.unit)),
);

interface Maps {
  exact: Map<string, string>;
  /** Lower-cased key to canonical unit, or null where two units collide in lower case. */
  lower: Map<string, string | null>;
}

function buildMaps(): Maps {
  const exact = new Map<string, string>();
  const add = (spelling: string, unit: string): void => {
    const key = squashUnitText(spelling);
    if (key === '') return;
    const had = exact.get(key);
    if (had !== undefined && had !== unit) {
      throw new Error(`unit registry: spelling '${spelling}' maps to both '${had}' and '${unit}'`);
    }
    exact.set(key, unit);
  };
  for (const unit of canonicalUnits) add(unit, unit);
  for (const [unit, spellings] of Object.entries(aliases)) {
    if (!canonicalUnits.has(unit)) throw new Error(`unit registry: aliases given for unknown unit '${unit}'`);
    for (const s of spellings) add(s, unit);
  }
  const lower = new Map<string, string | null>();
  for (const [key, unit] of exact) {
    if (key.length < 2) continue; // 'C', 'F', 'K', 'W', 'J', 'm' match exactly only
    const lk = key.toLowerCase();
    const had = lower.get(lk);
    lower.set(lk, had === undefined || had === unit ? unit : null);
  }
  return { exact, lower };
}

const maps = buildMaps();
const cache = new Map<string, UnitDescription>();
const CACHE_LIMIT = 10_000;

const BASIS_RE = /(^|[\s(,;/_-])(dry|wet|db|wb)(?=[\s),;_-]|$)/i;
const FRACTION_RE = /%|percent|pct|ppm|ppb/i;
const FRACTION_KIND_WORDS_RE = /\b(vol(ume)?|mol(e)?|wt|weight|mass)\b|v\/v|w\/w|m\/m|(?<=%)(vol|mol|wt|mass|v)|(vol|mol|wt|mass)(?=%)/gi;

function fractionKindOf(lower: string): FractionKind | undefined {
  if (/vol|v\/v|ppmv|ppbv/.test(lower)) return 'volume';
  if (/mol/.test(lower)) return 'mole';
  if (/wt|weight|mass|w\/w|m\/m|ppmw|ppmm|ppbw/.test(lower)) return 'mass';
  return undefined;
}

function lookup(text: string): string | null {
  const key = squashUnitText(text);
  if (key === '') return null;
  const exact = maps.exact.get(key);
  if (exact !== undefined) return exact;
  return maps.lower.get(key.toLowerCase()) ?? null;
}

/**
 * Reads a unit text with its flags: canonical unit, dry/wet basis, and for fractions what is
 * counted. Unknown text gives unit null (never throws).
 */
export function describeUnit(text: string): UnitDescription {
  const hit = cache.get(text);
  if (hit) return hit;
  let t = text.normalize('NFKC').trim();
  // Strip one pair of brackets around the whole text: "[bar]", "(kg/h)".
  const inner = /^[[(](.*)[\])]$/.exec(t)?.[1];
  if (inner !== undefined && !/[()[\]]/.test(inner)) t = inner.trim();
  let basis: GasBasis | undefined;
  const b = BASIS_RE.exec(t);
  const [match, lead, word] = b ?? [];
  if (b && match !== undefined && lead !== undefined && word !== undefined) {
    const w = word.toLowerCase();
    basis = w === 'dry' || w === 'db' ? 'dry' : 'wet';
    t = (t.slice(0, b.index) + lead + t.slice(b.index + match.length)).replace(/[\s,;(]+$/, '').replace(/\(\s*\)/, '').trim();
  } else if (/^pp[mb]vd$/i.test(t)) {
    basis = 'dry';
  }
  let unit: string | null;
  let fractionKind: FractionKind | undefined;
  if (t === '-') {
    unit = '1';
  } else if (FRACTION_RE.test(t)) {
    fractionKind = fractionKindOf(t.toLowerCase());
    unit = lookup(t) ?? lookup(t.replace(FRACTION_KIND_WORDS_RE, ''));
  } else {
    unit = lookup(t);
  }
  const out: UnitDescription = {
    unit,
    ...(basis ? { basis } : {}),
    ...(fractionKind ? { fractionKind } : {}),
  };
  if (cache.size < CACHE_LIMIT) cache.set(text, out);
  return out;
}

/**
 * Canonical unit for a unit text as exported by a historian, or null when unknown.
 *
 * @param text unit text as written in the export ('°C', 'bar(g)', 'T/H', 'm³/h', 'vol% dry')
 * @returns canonical unit ('degC', 'barg', 't/h', 'm3/h', '%') or null
 */
export function parseUnit(text: string): string | null {
  return describeUnit(text).unit;
}

function editDistance(a: string, b: string): number {
  // one row of the table: prev[j] is the distance of a[0, i) to b[0, j)
  const prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  let last = b.length; // distance of a[0, i) to all of b
  for (let i = 1; i <= a.length; i++) {
    let diag = i - 1; // prev[0] of the row before
    let left = i; // prev[j - 1] of this row
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const up = prev[j]!; // j <= b.length: inside the row
      left = Math.min(up + 1, left + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev[j] = left;
      diag = up;
    }
    last = left;
  }
  return last;
}

/**
 * Up to `max` canonical units whose spellings are closest to `text`, restricted to the units of
 * `quantity` when given. Used in error messages.
 */
export function suggestUnits(text: string, quantity?: Quantity, max = 3): string[] {
  const allowed = quantity ? new Set(registry[quantity].map((e) => e.unit)) : canonicalUnits;
  const key = squashUnitText(text).toLowerCase();
  const best = new Map<string, number>();
  for (const [spelling, unit] of maps.exact) {
    if (!allowed.has(unit)) continue;
    const d = editDistance(key, spelling.toLowerCase());
    const had = best.get(unit);
    if (had === undefined || d < had) best.set(unit, d);
  }
  const limit = Math.max(2, Math.ceil(key.length / 2));
  const ranked = [...best.entries()].filter(([, d]) => d <= limit).sort((x, y) => x[1] - y[1]);
  const picked = ranked.slice(0, max).map(([u]) => u);
  return picked.length > 0 ? picked : [...allowed].slice(0, max);
}
