/**
 * Numbers of a site written for people: SI in, the site's display unit and locale out, through the
 * one formatter (src/lib/format.ts). Screens, mails and reports build one writer per site. Pure.
 */
import { fixed, localeStyle, sizeDecimals, withU, type NumberStyle } from '../format';
import { DEFAULT_DISPLAY_UNITS, displayScale, type DisplayUnits, type ShownQuantity } from './display';

export interface SiteWriter {
  readonly units: DisplayUnits;
  /** The separators of the site's locale, for numbers without a unit. */
  readonly style: NumberStyle;
  /** The unit a quantity is shown in ('kW', '°C', 'bar(g)', '%'; '' for none). */
  unit(q: ShownQuantity): string;
  /** The unit of a difference or an uncertainty of a quantity ('bar' for bar(g), 'K' or '°C'). */
  deltaUnit(q: ShownQuantity): string;
  /** A value [SI] in the shown unit as a number (null for none). */
  shown(v_SI: number | null | undefined, q: ShownQuantity): number | null;
  /** A value [SI] written in the shown unit, without the unit; decimals by size unless given. */
  value(v_SI: number | null | undefined, q: ShownQuantity, decimals?: number): string;
  /** A difference or uncertainty [SI] written in the shown unit (no offset). */
  delta(d_SI: number | null | undefined, q: ShownQuantity, decimals?: number): string;
  /** A value and its expanded uncertainty [SI] at the decimals U asks for, with the unit: "412 kW ± 18 kW". */
  withU(v_SI: number | null | undefined, U_SI: number | null | undefined, q: ShownQuantity, decimals?: number): string;
  /** A plain number in the site's locale. */
  number(v: number | null | undefined, decimals: number): string;
}

const NONE = '–';

/** What a writer needs of a site: its display units and its atmosphere for gauge pressures [Pa]. */
export interface SiteDisplayUnits {
  units: DisplayUnits;
  p_atm_Pa: number;
}

/** The writer of a site's display (the defaults when none is given). */
export const writerOf = (d: SiteDisplayUnits | null | undefined): SiteWriter => siteWriter(d?.units, d?.p_atm_Pa);

/** A signed value [SI] with its U: "+412 kW ± 18 kW", "−3.2 MW"; the sign is written before the figure. */
export function signedWithU(w: SiteWriter, v_SI: number | null | undefined, U_SI: number | null | undefined, q: ShownQuantity, minus = '−'): string {
  if (v_SI === null || v_SI === undefined || !Number.isFinite(v_SI)) return NONE;
  const body = w.withU(Math.abs(v_SI), U_SI, q);
  return /^0([.,]0*)?( |$)/.test(body) ? body : `${v_SI >= 0 ? '+' : minus}${body}`;
}

/** A writer for a site's display units; `p_atm_Pa` shifts gauge pressures. */
export function siteWriter(units: DisplayUnits = DEFAULT_DISPLAY_UNITS, p_atm_Pa = 101325): SiteWriter {
  const style: NumberStyle = { ...localeStyle(units.locale), none: NONE };
  const scale = (q: ShownQuantity) => displayScale(q, units, p_atm_Pa);
  const shown = (v: number | null | undefined, q: ShownQuantity) => {
    if (v === null || v === undefined || !Number.isFinite(v)) return null;
    const s = scale(q);
    return v * s.factor + s.offset;
  };
  const deltaUnit = (q: ShownQuantity) => scale(q).unit.replace(/\((g|a)\)$/, '');
  const dp = (x: number | null, decimals?: number) => decimals ?? sizeDecimals(Math.abs(x ?? 0));
  return {
    units,
    style,
    unit: (q) => scale(q).unit,
    deltaUnit,
    shown,
    value: (v, q, decimals) => {
      const x = shown(v, q);
      return fixed(x, dp(x, decimals), style);
    },
    delta: (d, q, decimals) => {
      const x = d === null || d === undefined || !Number.isFinite(d) ? null : d * scale(q).factor;
      return fixed(x, dp(x, decimals), style);
    },
    withU: (v, U, q, decimals) => {
      const x = shown(v, q);
      const u = U === null || U === undefined || !Number.isFinite(U) ? null : Math.abs(U * scale(q).factor);
      const unit = scale(q).unit;
      if (x === null) return NONE;
      if (u === null || u === 0) return `${fixed(x, dp(x, decimals), style)}${unit ? ` ${unit}` : ''}`;
      const du = deltaUnit(q);
      return withU(x, u, { ...style, decimals: dp(x, decimals) }).replace(' ± ', `${unit ? ` ${unit}` : ''} ± `) + (du ? ` ${du}` : '');
    },
    number: (v, decimals) => fixed(v, decimals, style),
  };
}
