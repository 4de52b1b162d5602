/**
 * Numbers as people read them, one rule for pages, islands, mails and reports:
 * - a fixed count of decimals, never "-0.0" (a value that rounds to zero shows without its sign);
 * - digits grouped by three with a thin space (SI Brochure, 9th ed., 5.4.4), or a given separator;
 * - a value with its expanded uncertainty U: U to two significant digits and the value to the same
 *   decimal place (JCGM 100:2008, 7.2.6), "1 567 ± 70", never "1 567 ± 69.95".
 * - a limit or setting as a person set it, without trailing zeros: `upTo` (at most n decimals) and
 *   `figures` (at most n significant figures). Reason texts, notes, mails and messages use these too,
 *   never toFixed, toLocaleString or a raw `${number}`.
 * A site's locale gives its separators through `localeStyle('de-DE')` (1.234,5); without one the
 * thin space groups and the point marks decimals. Pure.
 */

/** The grouping separator of displays: a thin space. */
export const THIN_SPACE = '\u2009';

export interface NumberStyle {
  /** Separator of thousands; '' for none (machine-read CSV). Default THIN_SPACE. */
  group?: string;
  /** What an absent or non-finite value shows as. Default '—'. */
  none?: string;
  /** Decimal marker; default '.'. */
  decimal?: string;
}

/** The grouping and decimal separators of a locale ('en-GB': ',' and '.'); thin space and '.' for an unknown one. */
export function localeStyle(locale: string | null | undefined): { group: string; decimal: string } {
  try {
    const parts = new Intl.NumberFormat(locale ?? undefined, { useGrouping: true }).formatToParts(12345.6);
    const group = parts.find((p) => p.type === 'group')?.value ?? THIN_SPACE;
    const decimal = parts.find((p) => p.type === 'decimal')?.value ?? '.';
    return { group: group === '\u00a0' || group === '\u202f' ? THIN_SPACE : group, decimal };
  } catch {
    return { group: THIN_SPACE, decimal: '.' };
  }
}

const absent = (v: number | null | undefined): v is null | undefined => v === null || v === undefined || !Number.isFinite(v);

/** A number with `decimals` decimals, grouped, never "-0". */
export function fixed(v: number | null | undefined, decimals: number, style: NumberStyle = {}): string {
  if (absent(v)) return style.none ?? '—';
  let s = v.toFixed(Math.max(0, Math.min(20, Math.round(decimals))));
  if (/^-0(\.0*)?$/.test(s)) s = s.slice(1);
  const group = style.group ?? THIN_SPACE;
  const [int, frac] = s.split('.') as [string, string | undefined];
  const sign = int.startsWith('-') ? '-' : '';
  const grouped = group ? (sign ? int.slice(1) : int).replace(/\B(?=(\d{3})+(?!\d))/g, group) : sign ? int.slice(1) : int;
  return sign + grouped + (frac !== undefined ? `${style.decimal ?? '.'}${frac}` : '');
}

/**
 * Decimals that show an uncertainty with two significant digits (0 for U >= 10), at most `max`.
 * @param U expanded uncertainty in the unit shown, > 0
 */
export function decimalsForU(U: number, max = 6): number {
  if (!(U > 0) || !Number.isFinite(U)) return 0;
  return Math.min(max, Math.max(0, 1 - Math.floor(Math.log10(U))));
}

export interface UStyle extends NumberStyle {
  /** Decimals when there is no uncertainty to match (default 1). */
  decimals?: number;
  /** Unit written after the value and after U ('kW', '%'); none by default. */
  unit?: string;
  /** Written between value and unit; default a space. */
  unitSpace?: string;
}

/**
 * A value with its expanded uncertainty, both at the decimals U asks for: "412 kW ± 18 kW".
 * Without U (null, not finite or 0) the value alone at style.decimals.
 */
export function withU(v: number | null | undefined, U: number | null | undefined, style: UStyle = {}): string {
  if (absent(v)) return style.none ?? '—';
  const u = style.unit ? `${style.unitSpace ?? ' '}${style.unit}` : '';
  if (absent(U) || U === 0) return `${fixed(v, style.decimals ?? 1, style)}${u}`;
  const d = decimalsForU(Math.abs(U));
  return `${fixed(v, d, style)}${u} ± ${fixed(Math.abs(U), d, style)}${u}`;
}

/** Value and U as two texts at the decimals U asks for (for tables that place them apart). */
export function pairU(v: number | null | undefined, U: number | null | undefined, style: UStyle = {}): [string, string] {
  if (absent(U) || U === 0) return [fixed(v, style.decimals ?? 1, style), ''];
  const d = decimalsForU(Math.abs(U));
  return [fixed(v, d, style), fixed(Math.abs(U), d, style)];
}

/** Decimals that keep about three significant figures of a size [any unit] without pretending more. */
export function sizeDecimals(maxAbs: number): number {
  if (maxAbs >= 100) return 0;
  if (maxAbs >= 10) return 1;
  if (maxAbs >= 1) return 2;
  return 3;
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/**
 * A number to `digits` significant figures: fixed decimals from 0.001 up to a million, beyond that a
 * power of ten as people write it ("−9.20 × 10⁻⁹"), never the machine's e-notation. For fitted
 * coefficients and other numbers without an uncertainty to match.
 */
export function significant(v: number | null | undefined, digits = 3, style: NumberStyle = {}): string {
  if (absent(v)) return style.none ?? '—';
  if (v === 0) return fixed(0, Math.max(0, digits - 1), style);
  const exp = Math.floor(Math.log10(Math.abs(v)));
  if (exp >= -3 && exp < 6) return fixed(v, Math.max(0, digits - 1 - exp), style);
  // Below about 1e-308 the power 10 ** exp underflows to 0: the mantissa then comes from the exponent form.
  const scale = 10 ** exp;
  const mantissa = scale > 0 && Number.isFinite(scale) ? v / scale : Number(v.toExponential(15).split('e')[0]);
  const m = fixed(mantissa, Math.max(0, digits - 1), style);
  // Rounding the mantissa can reach 10 (9.996 -> 10.0): carry into the exponent.
  if (Math.abs(Number(m.replace(style.decimal ?? '.', '.'))) >= 10) return significant(Math.sign(v) * 10 ** (exp + 1), digits, style);
  const e = String(exp).split('').map((c) => SUPERSCRIPT[c] ?? c).join('');
  return `${m.replace(/^-/, '−')} × 10${e}`;
}

/** Drops the trailing zeros of a formatted number's decimals (and a decimal marker left alone): "62.50" -> "62.5", "400.00" -> "400". */
function dropZeros(s: string, decimal: string): string {
  const [head, tail] = s.split(' × ') as [string, string | undefined];
  const at = head.lastIndexOf(decimal);
  if (at < 0 || !/^\d+$/.test(head.slice(at + decimal.length))) return s;
  const frac = head.slice(at + decimal.length).replace(/0+$/, '');
  const out = frac ? `${head.slice(0, at)}${decimal}${frac}` : head.slice(0, at);
  return tail === undefined ? out : `${out} × ${tail}`;
}

/**
 * A number with at most `maxDecimals` decimals and no trailing zeros, grouped, never "-0": a limit or
 * setting as a person set it ("400", "62.5", "1 250.75").
 */
export function upTo(v: number | null | undefined, maxDecimals: number, style: NumberStyle = {}): string {
  if (absent(v)) return style.none ?? '—';
  return dropZeros(fixed(v, maxDecimals, style), style.decimal ?? '.');
}

/**
 * A number to at most `digits` significant figures without trailing zeros ("0.05", "1.23"; whole digits kept: "1 235"),
 * as `significant` writes it otherwise: for thresholds and sums whose trailing zeros would claim a
 * precision nobody set.
 */
export function figures(v: number | null | undefined, digits = 3, style: NumberStyle = {}): string {
  if (absent(v)) return style.none ?? '—';
  return dropZeros(significant(v, digits, style), style.decimal ?? '.');
}
