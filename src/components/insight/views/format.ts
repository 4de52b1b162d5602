/**
 * Display formatting of the views: SI values from the API to the units people read (%, kW or MW,
 * MWh), always with the unit and, where known, the expanded uncertainty; instants in the site's clock.
 */
import { fixed, pairU, sizeDecimals, withU } from '~/lib/format';
import { siteStamp } from '~/lib/site-time';
import type { SiteWriter } from '~/lib/units/writer';

export { pairU };
import type { HourState } from '~/lib/hour-states';
export type { HourState };

export const STATE_LABELS: Record<HourState, string> = {
  steady: 'steady',
  unsettled: 'unsettled',
  idle: 'idle',
  suspect: 'suspect',
};

const dec = (v: number, decimals: number): string => fixed(v, decimals);

/** Efficiency [-] as "71.3 %" or "71.3 % ± 1.2 %" (the decimals of U when it is known). */
export function pct(v: number | null | undefined, U?: number | null, decimals = 1): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return withU(v * 100, U === null || U === undefined ? null : U * 100, { unit: '%', decimals });
}

/** The site's chosen power unit (its display units, through its writer) as { unit, factor: W per shown unit }. */
export function sitePowerUnit(w: SiteWriter): { unit: string; factor: number } {
  const perW = w.shown(1, 'power');
  return { unit: w.unit('power'), factor: perW ? 1 / perW : 1e3 };
}

/** A display unit for powers [W] of this size: kW below 10 MW, MW above (for figures of no site; a site's pages use sitePowerUnit). */
export function powerUnit(maxAbs_W: number): { unit: 'kW' | 'MW'; factor: number } {
  return maxAbs_W >= 1e7 ? { unit: 'MW', factor: 1e6 } : { unit: 'kW', factor: 1e3 };
}

function powerDecimals(v: number): number {
  const a = Math.abs(v);
  return a >= 100 ? 0 : a >= 10 ? 1 : 2;
}

/** Power [W] as "412 kW" or "412 kW ± 18 kW" in the given (or a fitting) unit. */
export function power(v_W: number | null | undefined, U_W?: number | null, unit?: { unit: string; factor: number }): string {
  if (v_W === null || v_W === undefined || !Number.isFinite(v_W)) return '—';
  const u = unit ?? powerUnit(Math.abs(v_W));
  const x = v_W / u.factor;
  return withU(x, U_W === null || U_W === undefined ? null : U_W / u.factor, { unit: u.unit, decimals: powerDecimals(x) });
}

/** Energy [MWh] with about three significant figures. */
export function mwh(v: number | null | undefined, decimals?: number): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return dec(v, decimals ?? mwhDecimals(Math.abs(v)));
}

export const mwhDecimals = sizeDecimals;

/** Decimals of money: whole units, cents below 100. */
export const moneyDecimals = (v: number): number => (Math.abs(v) < 100 ? 2 : 0);

/** Money in the site's currency, whole units (cents below 100). */
export function money(v: number | null | undefined, currency?: string): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const s = dec(v, moneyDecimals(v));
  return currency ? `${s} ${currency}` : s;
}

export function num(v: number | null | undefined, decimals = 0): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return dec(v, decimals);
}

/** An instant in the site's clock. */
export const siteTime = (ms: number, timeZone: string, pattern = 'EEE d MMM yyyy, HH:mm'): string => siteStamp(ms, timeZone, pattern);

/** A load with its unit as the engine reports it ('-' means a fraction of rating). */
export function load(v: number | null | undefined, unit: string | null, w?: SiteWriter): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  if (!unit || unit === '-' || unit === '1') return `${dec(v * 100, 1)} % of rating`;
  if (unit === 'W') return w ? w.withU(v, null, 'power') : power(v);
  return `${dec(v, Math.abs(v) >= 100 ? 0 : 2)} ${unit.replace('kg/s', 'kg/s')}`;
}

/** Axis label of the load for the scatter. */
export function loadAxis(unit: string | null, w?: SiteWriter): { label: string; scale: number; suffix: string } {
  if (!unit || unit === '-' || unit === '1') return { label: 'Load [% of rating]', scale: 100, suffix: ' %' };
  if (unit === 'W') {
    const pu = w ? sitePowerUnit(w) : { unit: 'kW', factor: 1e3 };
    return { label: `Load [${pu.unit}]`, scale: 1 / pu.factor, suffix: ` ${pu.unit}` };
  }
  return { label: `Load [${unit}]`, scale: 1, suffix: ` ${unit}` };
}
