/**
 * Conversion of tag values between engineering units and SI. SI inside, always: absolute pressure
 * [Pa], temperature [K], mass flow [kg/s] ... (see ./quantities.ts).
 *
 * Every unit is an affine map  value_SI = value x factor + offset; gauge pressure units add the
 * site's atmospheric pressure (passed in ctx.p_atm_Pa). Plain pressure units (bar, psi, kPa, kg/cm2)
 * are taken as absolute; a gauge reading must say so ('barg', 'psig', 'bar(g)').
 *
 * @see NIST Special Publication 811 (2008), Appendix B.8 and B.9.
 */
import { MOLAR_GAS_CONSTANT_J_per_molK } from './constants';
import { UnitError } from './errors';
import { parseUnit, suggestUnits } from './parse';
import { isQuantity, quantities, type Quantity } from './quantities';
import { registry, type ReferenceConditions, type UnitEntry } from './registry';

/** Site context a conversion may need. */
export interface UnitContext {
  /** Site atmospheric pressure (absolute) [Pa]; needed for gauge pressure units. */
  readonly p_atm_Pa?: number;
}

/** A precompiled conversion for hot loops: value_SI = value * factor + offset. */
export interface Converter {
  readonly unit: string;
  readonly quantity: Quantity;
  /** SI per unit [SI/unit]. */
  readonly factor: number;
  /** Offset in SI (temperature scale zero, or site atmosphere for gauge units) [SI]. */
  readonly offset: number;
  toSI(value: number): number;
  fromSI(value_SI: number): number;
}

/** Plausible site atmospheric pressure [Pa]: sea level to high-altitude plants. */
const P_ATM_MIN_Pa = 2e4;
const P_ATM_MAX_Pa = 1.2e5;

const byQuantity = new Map<Quantity, Map<string, UnitEntry>>(
  (Object.keys(registry) as Quantity[]).map((q) => [q, new Map(registry[q].map((e) => [e.unit, e]))]),
);

function quantitiesOfUnit(unit: string): Quantity[] {
  return [...byQuantity.entries()].filter(([, m]) => m.has(unit)).map(([q]) => q);
}

function requireQuantity(quantity: string, unitText: string): Quantity {
  if (!isQuantity(quantity)) {
    throw new UnitError(
      'UNKNOWN_QUANTITY',
      unitText,
      quantity,
      `Unknown quantity '${quantity}' (for unit '${unitText}'). Known quantities: ${Object.keys(quantities).join(', ')}.`,
    );
  }
  return quantity;
}

/**
 * The registry entry of a unit text for a quantity.
 *
 * @throws UnitError UNKNOWN_UNIT (with suggestions), UNKNOWN_QUANTITY, WRONG_QUANTITY
 */
export function unitEntry(unitText: string, quantity: Quantity): UnitEntry {
  const q = requireQuantity(quantity, unitText);
  const unit = parseUnit(unitText);
  if (unit === null) {
    const suggestions = suggestUnits(unitText, q);
    throw new UnitError(
      'UNKNOWN_UNIT',
      unitText,
      q,
      `Unknown unit '${unitText}' for quantity ${q}. Did you mean ${suggestions.map((s) => `'${s}'`).join(', ')}? ` +
        `Units of ${q}: ${unitsFor(q).join(', ')}.`,
      suggestions,
    );
  }
  const entry = byQuantity.get(q)!.get(unit);
  if (!entry) {
    const others = quantitiesOfUnit(unit);
    const suggestions = suggestUnits(unitText, q);
    throw new UnitError(
      'WRONG_QUANTITY',
      unitText,
      q,
      `Unit '${unitText}' (${unit}) is a unit of ${others.join(' or ')}, not of ${q}. ` +
        `Units of ${q}: ${unitsFor(q).join(', ')}.`,
      suggestions,
    );
  }
  return entry;
}

function atmosphere(entry: UnitEntry, quantity: Quantity, ctx: UnitContext | undefined): number {
  const p = ctx?.p_atm_Pa;
  if (p === undefined) {
    throw new UnitError(
      'MISSING_CONTEXT',
      entry.unit,
      quantity,
      `Unit '${entry.unit}' is a gauge pressure; converting it to absolute needs the site's atmospheric pressure ` +
        `(ctx.p_atm_Pa, in Pa, e.g. 101325).`,
    );
  }
  if (!(p >= P_ATM_MIN_Pa && p <= P_ATM_MAX_Pa)) {
    throw new UnitError(
      'INVALID_ARGUMENT',
      entry.unit,
      quantity,
      `Site atmospheric pressure p_atm_Pa = ${p} is outside ${P_ATM_MIN_Pa}..${P_ATM_MAX_Pa} Pa; pass it in Pa (not kPa or bar).`,
    );
  }
  return p;
}

/**
 * Precompiled converter for a unit of a quantity, for hot loops.
 *
 * @param unitText unit as written in the export or canonical ('barg', '°C', 't/h')
 * @param quantity quantity the tag carries
 * @param ctx site context; ctx.p_atm_Pa [Pa] is required for gauge pressure units
 * @throws UnitError when the unit is unknown, belongs to another quantity, or context is missing
 * @see NIST SP 811 (2008) Appendix B.8
 */
export function converterFor(unitText: string, quantity: Quantity, ctx?: UnitContext): Converter {
  const entry = unitEntry(unitText, quantity);
  const factor = entry.factor;
  const offset = entry.offset + (entry.gauge ? atmosphere(entry, quantity, ctx) : 0);
  return {
    unit: entry.unit,
    quantity,
    factor,
    offset,
    toSI: (value: number) => value * factor + offset,
    fromSI: (value_SI: number) => (value_SI - offset) / factor,
  };
}

/**
 * Converts a value in an engineering unit to SI (absolute pressure, kelvin, kg/s ...).
 *
 * @param value value in `unitText` [unit]
 * @param unitText unit as exported ('bar(g)', '°F', 'klb/h')
 * @param quantity quantity of the tag
 * @param ctx site context (p_atm_Pa [Pa] for gauge units)
 * @returns value in the quantity's SI unit [SI]
 * @see NIST SP 811 (2008) Appendix B.8
 */
export function toSI(value: number, unitText: string, quantity: Quantity, ctx?: UnitContext): number {
  return converterFor(unitText, quantity, ctx).toSI(value);
}

/**
 * Converts a value in SI back to an engineering unit, for display.
 *
 * @param value_SI value in the quantity's SI unit [SI]
 * @param unitText target unit
 * @param quantity quantity of the value
 * @param ctx site context (p_atm_Pa [Pa] for gauge units)
 * @returns value in `unitText` [unit]
 */
export function fromSI(value_SI: number, unitText: string, quantity: Quantity, ctx?: UnitContext): number {
  return converterFor(unitText, quantity, ctx).fromSI(value_SI);
}

/**
 * Converts an uncertainty (or any difference) to SI: the factor only, no temperature offset and no
 * gauge shift, so 1 degF of uncertainty is 5/9 K and 0.1 barg is 1e4 Pa.
 *
 * @param u uncertainty in `unitText` [unit], >= 0
 * @param unitText unit of the uncertainty (same as the tag's unit)
 * @param quantity quantity of the tag (temperature, pressure ...)
 * @returns uncertainty in SI [SI]
 * @see JCGM 100:2008 (GUM) 5.1.2: sensitivities of a linear map are its factor.
 */
export function uncertaintyToSI(u: number, unitText: string, quantity: Quantity): number {
  if (!(u >= 0)) {
    throw new UnitError('INVALID_ARGUMENT', unitText, quantity, `Uncertainty must be a number >= 0, got ${u} ${unitText}.`);
  }
  return u * unitEntry(unitText, quantity).factor;
}

/** Canonical units of a quantity, in display order. */
export function unitsFor(quantity: Quantity): string[] {
  const q = requireQuantity(quantity, '');
  return registry[q].map((e) => e.unit);
}

/** True when the unit text is recognised and belongs to the quantity (no context is checked). */
export function canConvert(unitText: string, quantity: string): boolean {
  if (!isQuantity(quantity)) return false;
  const unit = parseUnit(unitText);
  return unit !== null && byQuantity.get(quantity)!.has(unit);
}

/** True when the unit is a gauge pressure unit (its conversion needs p_atm_Pa). */
export function isGaugeUnit(unitText: string): boolean {
  const unit = parseUnit(unitText);
  return unit !== null && byQuantity.get('pressure')!.get(unit)?.gauge === true;
}

/** Reference conditions of a standard volume flow unit ('Nm3/h' -> 0 degC, 101.325 kPa), else null. */
export function referenceConditionsOf(unitText: string): ReferenceConditions | null {
  const unit = parseUnit(unitText);
  if (unit === null) return null;
  return byQuantity.get('standardVolumeFlow')!.get(unit)?.reference ?? null;
}

/** What a gas volume flow needs to become a mass flow. */
export type GasDensitySpec =
  /** Molar mass [kg/mol]: ideal gas at the unit's reference conditions (standard volume units only). */
  | { readonly M_kg_per_mol: number }
  /** Density at the unit's own reference conditions [kg/m3] (standard volume units only). */
  | { readonly rhoRef_kg_per_m3: number }
  /** Density at flowing conditions [kg/m3] (actual volume units only). */
  | { readonly rho_kg_per_m3: number };

/**
 * Mass flow of a gas from a volume flow.
 *
 * Standard units (Nm3/h, Sm3/h, scfm ...): with a molar mass, ideal gas at the unit's reference
 * conditions, mDot = V_ref p_ref M / (R T_ref); with rhoRef, mDot = V_ref rhoRef (rhoRef must be the
 * density at that same reference, which also carries any real-gas correction).
 * Actual units (m3/h, acfm ...): mDot = V rho with the density at flowing conditions.
 *
 * @param value volume flow [unit]
 * @param unitText volume flow unit (standard or actual)
 * @param gas molar mass [kg/mol], or reference density [kg/m3], or actual density [kg/m3]
 * @returns mass flow [kg/s]
 * @throws UnitError when the unit is not a volume flow or the gas data do not fit the unit
 * @see NIST SP 811 (2008) Appendix B.8 (volume factors); ideal-gas law with R from the 2019 SI.
 */
export function volumeFlowToMassFlow(value: number, unitText: string, gas: GasDensitySpec): number {
  const unit = parseUnit(unitText);
  const std = unit === null ? undefined : byQuantity.get('standardVolumeFlow')!.get(unit);
  const act = unit === null ? undefined : byQuantity.get('volumeFlow')!.get(unit);
  if (std) {
    const ref = std.reference!;
    const n_mol_per_s = value * std.factor;
    if ('M_kg_per_mol' in gas) {
      positive(gas.M_kg_per_mol, 'M_kg_per_mol', unitText);
      return n_mol_per_s * gas.M_kg_per_mol;
    }
    if ('rhoRef_kg_per_m3' in gas) {
      positive(gas.rhoRef_kg_per_m3, 'rhoRef_kg_per_m3', unitText);
      const V_ref_m3_per_s = (n_mol_per_s * MOLAR_GAS_CONSTANT_J_per_molK * ref.T_K) / ref.p_Pa;
      return V_ref_m3_per_s * gas.rhoRef_kg_per_m3;
    }
    throw new UnitError(
      'INVALID_ARGUMENT',
      unitText,
      'standardVolumeFlow',
      `'${unitText}' is a volume at reference conditions (${ref.label}); give the gas molar mass (M_kg_per_mol) ` +
        `or its density at ${ref.label} (rhoRef_kg_per_m3), not an actual density.`,
    );
  }
  if (act) {
    if ('rho_kg_per_m3' in gas) {
      positive(gas.rho_kg_per_m3, 'rho_kg_per_m3', unitText);
      return value * act.factor * gas.rho_kg_per_m3;
    }
    throw new UnitError(
      'MISSING_CONTEXT',
      unitText,
      'volumeFlow',
      `'${unitText}' is an actual volume flow (at flowing pressure and temperature); converting it to mass flow ` +
        `needs the density at flowing conditions (rho_kg_per_m3).`,
    );
  }
  const suggestions = [...suggestUnits(unitText, 'standardVolumeFlow', 2), ...suggestUnits(unitText, 'volumeFlow', 2)];
  throw new UnitError(
    unit === null ? 'UNKNOWN_UNIT' : 'WRONG_QUANTITY',
    unitText,
    'volumeFlow',
    `'${unitText}' is not a volume flow unit. Did you mean ${suggestions.map((s) => `'${s}'`).join(', ')}?`,
    suggestions,
  );
}

function positive(x: number, name: string, unitText: string): void {
  if (!(x > 0 && Number.isFinite(x))) {
    throw new UnitError('INVALID_ARGUMENT', unitText, 'volumeFlow', `${name} must be a finite number > 0, got ${x}.`);
  }
}
