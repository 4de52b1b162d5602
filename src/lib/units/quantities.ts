/**
 * The physical quantities a tag can carry, each with the SI unit that Lossline stores inside.
 * JSON-friendly: `quantities` maps a quantity to its SI unit name; `quantityList` adds a label.
 */

/** SI unit of each quantity (values are display names; the numbers inside are always in these). */
export const quantities = {
  /** Absolute pressure. Gauge units are shifted by the site's atmospheric pressure. */
  pressure: 'Pa',
  /** Pressure difference (differential pressure, draft, uncertainty of a pressure): no gauge shift. */
  pressureDifference: 'Pa',
  /** Thermodynamic temperature. */
  temperature: 'K',
  /** Temperature difference (approach, rise, uncertainty of a temperature): no offset. */
  temperatureDifference: 'K',
  massFlow: 'kg/s',
  /** Volume flow at flowing (actual) conditions. */
  volumeFlow: 'm3/s',
  /**
   * Gas flow stated as a volume at reference conditions (Nm3/h, Sm3/h, scfm ...). The reference
   * differs between conventions, so inside it is carried as the ideal-gas amount-of-substance flow
   * n = p_ref V_ref / (R T_ref) [mol/s], which makes every convention comparable.
   */
  standardVolumeFlow: 'mol/s',
  power: 'W',
  heatFlow: 'W',
  energy: 'J',
  specificEnthalpy: 'J/kg',
  /** Mole, volume or mass fraction; the dry/wet basis and the kind of fraction are flags (see describeUnit). */
  fraction: '1',
  density: 'kg/m3',
  speed: 'm/s',
  length: 'm',
} as const;

export type Quantity = keyof typeof quantities;

const LABELS: Record<Quantity, string> = {
  pressure: 'pressure (absolute)',
  pressureDifference: 'pressure difference',
  temperature: 'temperature',
  temperatureDifference: 'temperature difference',
  massFlow: 'mass flow',
  volumeFlow: 'volume flow (actual)',
  standardVolumeFlow: 'gas volume flow at reference conditions',
  power: 'power',
  heatFlow: 'heat flow',
  energy: 'energy',
  specificEnthalpy: 'specific enthalpy',
  fraction: 'fraction',
  density: 'density',
  speed: 'speed',
  length: 'length',
};

/** Quantities as a JSON-friendly list: [{ quantity, siUnit, label }]. */
export const quantityList: ReadonlyArray<{ quantity: Quantity; siUnit: string; label: string }> = (
  Object.keys(quantities) as Quantity[]
).map((q) => ({ quantity: q, siUnit: quantities[q], label: LABELS[q] }));

/** True when `q` names a known quantity. */
export function isQuantity(q: string): q is Quantity {
  return Object.prototype.hasOwnProperty.call(quantities, q);
}
