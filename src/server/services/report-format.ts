/**
 * Number formatting of the report: fixed decimals chosen per quantity, a thin grouping space, units
 * said in the column heads. Pure.
 */

/** A number with a fixed count of decimals, '' when absent. `group` puts a space every three digits. */
export function fixed(v: number | null | undefined, decimals: number, group = false): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '';
  const s = v.toFixed(decimals);
  if (!group) return s;
  const [int, frac] = s.split('.');
  const sign = int!.startsWith('-') ? '-' : '';
  const digits = sign ? int!.slice(1) : int!;
  const grouped = digits.replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
  return sign + grouped + (frac !== undefined ? '.' + frac : '');
}

/** Decimals that keep about three significant figures of MWh without pretending more. */
export function mwhDecimals(maxAbs: number): number {
  if (maxAbs >= 100) return 0;
  if (maxAbs >= 10) return 1;
  if (maxAbs >= 1) return 2;
  return 3;
}

/** Efficiency [-] to percent with one decimal. */
export const pct = (v: number | null | undefined, decimals = 1) => (v === null || v === undefined ? '' : fixed(v * 100, decimals));

/** Power [W] to kW with no decimals (or one below 10 kW). */
export const kW = (v: number | null | undefined) => (v === null || v === undefined ? '' : fixed(v / 1000, Math.abs(v) < 10_000 ? 1 : 0, true));

/** "a ± b" when b is known. */
export const pm = (a: string, b: string) => (a && b ? `${a} ± ${b}` : a);
