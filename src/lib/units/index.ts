/**
 * Engineering units of tags to SI and back. Pure: no I/O.
 * @see NIST Special Publication 811 (2008), Appendix B.
 */
export { quantities, quantityList, isQuantity, type Quantity } from './quantities';
export {
  registry,
  aliases,
  NORMAL_REFERENCE,
  STANDARD_REFERENCE,
  SCF_REFERENCE,
  type UnitEntry,
  type ReferenceConditions,
} from './registry';
export { parseUnit, describeUnit, suggestUnits, squashUnitText, type UnitDescription, type GasBasis, type FractionKind } from './parse';
export {
  toSI,
  fromSI,
  converterFor,
  uncertaintyToSI,
  unitsFor,
  canConvert,
  unitEntry,
  isGaugeUnit,
  referenceConditionsOf,
  volumeFlowToMassFlow,
  type UnitContext,
  type Converter,
  type GasDensitySpec,
} from './convert';
export { UnitError, type UnitErrorCode } from './errors';
export * as unitConstants from './constants';
