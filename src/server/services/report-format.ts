/**
 * Number formatting of the report: fixed decimals chosen per quantity, a thin grouping space, units
 * said in the column heads. Pure.
 */
import { fixed as fixedNumber, sizeDecimals, withU } from '~/lib/format';

/** A number with a fixed count of decimals (src/lib/format.ts), '' when absent. `group` puts a space every three digits. */
export function fixed(v: number | null | undefined, decimals: number, group = false): string {
  return fixedNumber(v, decimals, { group: group ? ' ' : '', none: '' });
}

/** Decimals that keep about three significant figures of MWh without pretending more. */
export const mwhDecimals = sizeDecimals;

/** Value and U at the decimals U asks for, "a ± b" ('' when absent); `group` as for fixed. */
export function fixedU(v: number | null | undefined, U: number | null | undefined, decimals: number, group = false): string {
  return withU(v, U, { decimals, group: group ? ' ' : '', none: '' });
}

/** Efficiency [-] to percent with one decimal. */
export const pct = (v: number | null | undefined, decimals = 1) => (v === null || v === undefined ? '' : fixed(v * 100, decimals));

/** Power [W] to kW with no decimals (or one below 10 kW). */
export const kW = (v: number | null | undefined) => (v === null || v === undefined ? '' : fixed(v / 1000, Math.abs(v) < 10_000 ? 1 : 0, true));

/** "a ± b" when b is known. */
export const pm = (a: string, b: string) => (a && b ? `${a} ± ${b}` : a);
