/**
 * Default standard uncertainty of a tag link, per quantity. *Common practice* (docs/domain.md
 * section 6), not a published standard: every link keeps its own value and admins edit it.
 *
 * A link's uncertainty is stored either 'absolute', in the link's own engineering unit (1.8 degF,
 * 0.01 barg), or 'relative', in percent of the reading.
 */
import { uncertaintyToSI } from '../units/convert';
import { canConvert } from '../units/convert';
import { LINK_QUANTITIES, type LinkQuantity } from './kinds';

export type UncertaintyMode = 'absolute' | 'relative';

export interface LinkUncertainty {
  /** 'absolute': in the link's engineering unit; 'relative': percent of reading [%]. */
  readonly mode: UncertaintyMode;
  readonly value: number;
}

/** Defaults in SI (absolute) or percent (relative), with where each comes from. */
export const DEFAULT_UNCERTAINTY: Readonly<Record<LinkQuantity, { mode: UncertaintyMode; value: number; why: string }>> = {
  // RTDs and thermocouples 0.5-2 K: the middle of the band.
  temperature: { mode: 'absolute', value: 1, why: 'common practice: RTDs and thermocouples 0.5-2 K' },
  // Transmitters 0.1-0.5 % of span; with no span on record, the top of the band taken of reading.
  pressure: { mode: 'relative', value: 0.5, why: 'common practice: transmitters 0.1-0.5 % of span (taken of reading)' },
  massFlow: { mode: 'relative', value: 1, why: 'common practice: orifice and vortex meters 0.5-2 % of reading' },
  volumeFlow: { mode: 'relative', value: 1, why: 'common practice: orifice and vortex meters 0.5-2 % of reading' },
  standardVolumeFlow: { mode: 'relative', value: 1, why: 'common practice: orifice and vortex meters 0.5-2 % of reading' },
  power: { mode: 'relative', value: 0.5, why: 'common practice: electrical power meters 0.2-0.5 %' },
  powerIn: { mode: 'relative', value: 0.5, why: 'common practice: electrical power meters 0.2-0.5 %' },
  powerOut: { mode: 'relative', value: 0.5, why: 'common practice: electrical power meters 0.2-0.5 %' },
  heatFlow: { mode: 'relative', value: 2, why: 'common practice: a flow (0.5-2 %) times a temperature difference' },
  // Not in docs/domain.md; a typical flue-gas analyser figure, to be confirmed per site.
  o2Fraction: { mode: 'absolute', value: 0.002, why: 'common practice: flue-gas O2 analysers about 0.2 %-points' },
  vapourFraction: { mode: 'absolute', value: 0.02, why: 'common practice: an estimate, vapour fraction is rarely metered' },
};

/**
 * The default uncertainty of a new link, expressed the way it is stored: relative in percent, or
 * absolute in the link's engineering unit (1 K becomes 1.8 for a degF tag, 0.002 becomes 0.2 for '%').
 *
 * @param quantity what the link measures
 * @param unitText the link's engineering unit (must convert for the quantity)
 * @returns { mode, value } rounded to 6 significant figures
 */
export function defaultUncertainty(quantity: LinkQuantity, unitText: string): LinkUncertainty {
  const d = DEFAULT_UNCERTAINTY[quantity];
  if (d.mode === 'relative') return { mode: 'relative', value: d.value };
  const q = LINK_QUANTITIES[quantity].quantity;
  if (!canConvert(unitText, q)) return { mode: 'absolute', value: d.value };
  const perUnit_SI = uncertaintyToSI(1, unitText, q);
  return { mode: 'absolute', value: Number((d.value / perUnit_SI).toPrecision(6)) };
}
