/**
 * Number formatting of the report: fixed decimals chosen per quantity, a thin grouping space, units
 * said in the column heads. Pure.
 */
import { decimalsForU, fixed as fixedNumber, sizeDecimals, withU } from '~/lib/format';
import type { SiteWriter } from '~/lib/units/writer';

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

/**
 * The report's numbers in a site's display units and number style (src/lib/units/writer.ts): the PDF
 * groups thousands and marks decimals as the site's locale does; the CSV (`plain`) keeps a decimal
 * point and no grouping so that spreadsheets read numbers, in the same units. '' when absent.
 */
export function reportNumbers(w: SiteWriter, plain = false) {
  const style = plain ? { group: '', decimal: '.', none: '' } : { group: w.style.group, decimal: w.style.decimal, none: '' };
  const num = (v: number | null | undefined, decimals: number) => fixedNumber(v, decimals, style);
  const numU = (v: number | null | undefined, U: number | null | undefined, decimals: number) => withU(v, U, { ...style, decimals });
  const shown = (W: number | null | undefined) => w.shown(W, 'power');
  const size = (x: number | null) => sizeDecimals(Math.abs(x ?? 0));
  return {
    fixed: num,
    fixedU: numU,
    /** Efficiency [-] in percent. */
    pct: (v: number | null | undefined, decimals = 1) => (v === null || v === undefined ? '' : num(v * 100, decimals)),
    /** The unit power is shown in ('kW', 'MW'). */
    powerUnit: w.unit('power'),
    /** A power [W] in the site's unit, about three significant figures. */
    power: (W: number | null | undefined) => num(shown(W), size(shown(W))),
    /** A power [W] and its U, both at the decimals U asks for: "1.57 ± 0.07". */
    powerU: (W: number | null | undefined, U: number | null | undefined) => {
      const u = U === null || U === undefined ? null : Math.abs(shown(U) ?? 0);
      return numU(shown(W), u, size(shown(W)));
    },
    /** A power's U alone, at the decimals it asks for (for a column of its own). */
    powerOnlyU: (U: number | null | undefined) => {
      const u = U === null || U === undefined ? null : Math.abs(shown(U) ?? 0);
      return u === null ? '' : num(u, u > 0 ? decimalsForU(u) : 0);
    },
    /** A power at the decimals its U asks for (the value beside powerOnlyU). */
    powerAtU: (W: number | null | undefined, U: number | null | undefined) => {
      const u = U === null || U === undefined ? null : Math.abs(shown(U) ?? 0);
      return num(shown(W), u ? decimalsForU(u) : size(shown(W)));
    },
  };
}
