/**
 * The unit registry: for every quantity, the units a plant historian exports, each reduced to an
 * affine map onto SI,  value_SI = value x factor + offset  (+ p_atm for gauge pressure units).
 *
 * Factors are built from the exact defining constants in ./constants.ts; the entry's `source`
 * names the table that lists it.
 *
 * @see NIST Special Publication 811 (2008), Appendix B.8 and B.9.
 */
import {
  BTU_IT_J,
  CALORIE_IT_J,
  CELSIUS_ZERO_K,
  FOOT_m,
  INCH_m,
  MERCURY_CONVENTIONAL_kg_per_m3,
  MOLAR_GAS_CONSTANT_J_per_molK,
  POUND_FORCE_N,
  POUND_kg,
  STANDARD_ATMOSPHERE_Pa,
  STANDARD_GRAVITY_m_per_s2,
  WATER_CONVENTIONAL_kg_per_m3,
} from './constants';
import type { Quantity } from './quantities';
import { DAY_S, HOUR_S } from '../time';

/** Reference conditions of a gas volume stated "at normal/standard conditions". */
export interface ReferenceConditions {
  /** Reference temperature [K]. */
  readonly T_K: number;
  /** Reference pressure (absolute) [Pa]. */
  readonly p_Pa: number;
  /** Human-readable statement of the convention, shown beside a tag link. */
  readonly label: string;
}

/** One unit of one quantity: value_SI = value * factor + offset (+ p_atm if gauge). */
export interface UnitEntry {
  /** Canonical spelling (what parseUnit returns). */
  readonly unit: string;
  readonly label: string;
  /** SI per unit [SI/unit]. */
  readonly factor: number;
  /** Additive offset in SI, applied after the factor (temperature scales) [SI]. */
  readonly offset: number;
  /** Gauge pressure: the site's atmospheric pressure is added after the factor. */
  readonly gauge: boolean;
  /** Reference conditions of a standard volume flow unit. */
  readonly reference?: ReferenceConditions;
  /** Where the factor comes from. */
  readonly source: string;
}

const B8 = 'NIST SP 811 (2008) Appendix B.8';
const EXACT = 'exact by definition of the SI prefix or unit';

/** 0 degC, 101.325 kPa: "normal" cubic metre (DIN 1343). */
export const NORMAL_REFERENCE: ReferenceConditions = {
  T_K: CELSIUS_ZERO_K,
  p_Pa: STANDARD_ATMOSPHERE_Pa,
  label: '0 degC, 101.325 kPa',
};
/** 15 degC, 101.325 kPa: "standard" cubic metre (ISO 13443). */
export const STANDARD_REFERENCE: ReferenceConditions = {
  T_K: CELSIUS_ZERO_K + 15,
  p_Pa: STANDARD_ATMOSPHERE_Pa,
  label: '15 degC, 101.325 kPa',
};
/** 60 degF, 14.696 psia: "standard" cubic foot (U.S. gas practice). */
export const SCF_REFERENCE: ReferenceConditions = {
  T_K: ((60 + 459.67) * 5) / 9,
  p_Pa: (14.696 * POUND_FORCE_N) / (INCH_m * INCH_m),
  label: '60 degF, 14.696 psia',
};

const PSI_Pa = POUND_FORCE_N / (INCH_m * INCH_m);
const KGF_PER_CM2_Pa = STANDARD_GRAVITY_m_per_s2 / 1e-4;
const FT3_m3 = FOOT_m ** 3;
const US_GALLON_m3 = 231 * INCH_m ** 3;
const HP_W = 550 * FOOT_m * POUND_FORCE_N;

type Spec = [unit: string, label: string, factor: number, source: string, extra?: Partial<Pick<UnitEntry, 'offset' | 'gauge' | 'reference'>>];

function table(specs: Spec[]): readonly UnitEntry[] {
  return specs.map(([unit, label, factor, source, extra]) => ({
    unit,
    label,
    factor,
    source,
    offset: extra?.offset ?? 0,
    gauge: extra?.gauge ?? false,
    ...(extra?.reference ? { reference: extra.reference } : {}),
  }));
}

const pressureLinear: Spec[] = [
  ['Pa', 'pascal', 1, EXACT],
  ['hPa', 'hectopascal', 100, EXACT],
  ['kPa', 'kilopascal', 1e3, EXACT],
  ['MPa', 'megapascal', 1e6, EXACT],
  ['bar', 'bar', 1e5, `${B8}: bar`],
  ['mbar', 'millibar', 100, `${B8}: millibar`],
  ['psi', 'pound-force per square inch', PSI_Pa, `${B8}: pound-force per square inch (lbf/in2)`],
  ['kg/cm2', 'kilogram-force per square centimetre (technical atmosphere, at)', KGF_PER_CM2_Pa, `${B8}: kilogram-force per square centimeter`],
  ['atm', 'standard atmosphere', STANDARD_ATMOSPHERE_Pa, `${B8}: atmosphere, standard`],
  ['mmHg', 'millimetre of mercury, conventional', 1e-3 * MERCURY_CONVENTIONAL_kg_per_m3 * STANDARD_GRAVITY_m_per_s2, `${B8}: millimeter of mercury, conventional`],
  ['Torr', 'torr (1/760 atm)', STANDARD_ATMOSPHERE_Pa / 760, `${B8}: torr`],
  ['inHg', 'inch of mercury, conventional', INCH_m * MERCURY_CONVENTIONAL_kg_per_m3 * STANDARD_GRAVITY_m_per_s2, `${B8}: inch of mercury, conventional`],
  ['inH2O', 'inch of water, conventional', INCH_m * WATER_CONVENTIONAL_kg_per_m3 * STANDARD_GRAVITY_m_per_s2, `${B8}: inch of water, conventional`],
  ['mmH2O', 'millimetre of water, conventional', 1e-3 * WATER_CONVENTIONAL_kg_per_m3 * STANDARD_GRAVITY_m_per_s2, `${B8}: millimeter of water, conventional`],
  ['mH2O', 'metre of water, conventional', WATER_CONVENTIONAL_kg_per_m3 * STANDARD_GRAVITY_m_per_s2, 'conventional water column: 1 m x 1000 kg/m3 x g_n'],
];

const pressureGaugeAbs: Spec[] = [
  ['barg', 'bar, gauge', 1e5, `${B8}: bar; plus site atmosphere`, { gauge: true }],
  ['mbarg', 'millibar, gauge', 100, `${B8}: millibar; plus site atmosphere`, { gauge: true }],
  ['kPag', 'kilopascal, gauge', 1e3, 'SI prefix; plus site atmosphere', { gauge: true }],
  ['MPag', 'megapascal, gauge', 1e6, 'SI prefix; plus site atmosphere', { gauge: true }],
  ['psig', 'pound-force per square inch, gauge', PSI_Pa, `${B8}: pound-force per square inch; plus site atmosphere`, { gauge: true }],
  ['kg/cm2g', 'kilogram-force per square centimetre, gauge', KGF_PER_CM2_Pa, `${B8}: kilogram-force per square centimeter; plus site atmosphere`, { gauge: true }],
  ['bara', 'bar, absolute', 1e5, `${B8}: bar`],
  ['kPaa', 'kilopascal, absolute', 1e3, EXACT],
  ['MPaa', 'megapascal, absolute', 1e6, EXACT],
  ['psia', 'pound-force per square inch, absolute', PSI_Pa, `${B8}: pound-force per square inch`],
  ['kg/cm2a', 'kilogram-force per square centimetre, absolute', KGF_PER_CM2_Pa, `${B8}: kilogram-force per square centimeter`],
];

const powerUnits: Spec[] = [
  ['W', 'watt', 1, EXACT],
  ['kW', 'kilowatt', 1e3, EXACT],
  ['MW', 'megawatt', 1e6, EXACT],
  ['GW', 'gigawatt', 1e9, EXACT],
  ['hp', 'horsepower, mechanical (550 ft lbf/s)', HP_W, `${B8}: horsepower (550 ft lbf/s)`],
  ['Btu/h', 'British thermal unit (IT) per hour', BTU_IT_J / HOUR_S, `${B8}: British thermal unit_IT per hour`],
  ['kBtu/h', 'thousand Btu (IT) per hour (MBH)', (1e3 * BTU_IT_J) / HOUR_S, `${B8}: British thermal unit_IT per hour, x 1e3`],
  ['MMBtu/h', 'million Btu (IT) per hour', (1e6 * BTU_IT_J) / HOUR_S, `${B8}: British thermal unit_IT per hour, x 1e6`],
  ['kcal/h', 'kilocalorie (IT) per hour', (1e3 * CALORIE_IT_J) / HOUR_S, `${B8}: calorie_IT, per hour`],
  ['Gcal/h', 'gigacalorie (IT) per hour', (1e9 * CALORIE_IT_J) / HOUR_S, `${B8}: calorie_IT, per hour`],
  ['MJ/h', 'megajoule per hour', 1e6 / HOUR_S, EXACT],
  ['GJ/h', 'gigajoule per hour', 1e9 / HOUR_S, EXACT],
  ['TR', 'ton of refrigeration (12 000 Btu_IT/h)', (12000 * BTU_IT_J) / HOUR_S, `${B8}: ton of refrigeration (12 000 Btu_IT/h)`],
];

const temperatureAsDifference: Spec[] = [
  ['K', 'kelvin', 1, EXACT],
  ['degC', 'degree Celsius (as a difference)', 1, `${B8}: degree Celsius (interval)`],
  ['degF', 'degree Fahrenheit (as a difference)', 5 / 9, `${B8}: degree Fahrenheit (interval)`],
  ['degR', 'degree Rankine (as a difference)', 5 / 9, `${B8}: degree Rankine (interval)`],
  ['degC-diff', 'degree Celsius difference', 1, `${B8}: degree Celsius (interval)`],
  ['degF-diff', 'degree Fahrenheit difference', 5 / 9, `${B8}: degree Fahrenheit (interval)`],
];

function standardFlow(unit: string, label: string, volume_m3: number, per_s: number, ref: ReferenceConditions): Spec {
  // n = p V / (R T) at the reference conditions, per second.
  const factor = ((volume_m3 / per_s) * ref.p_Pa) / (MOLAR_GAS_CONSTANT_J_per_molK * ref.T_K);
  return [unit, `${label} at ${ref.label}`, factor, `ideal gas at ${ref.label}; volume factors ${B8}`, { reference: ref }];
}

/** Every quantity's units, in display order. */
export const registry: Readonly<Record<Quantity, readonly UnitEntry[]>> = {
  pressure: table([...pressureLinear, ...pressureGaugeAbs]),
  pressureDifference: table(pressureLinear),
  temperature: table([
    ['K', 'kelvin', 1, EXACT],
    ['degC', 'degree Celsius', 1, `${B8}: degree Celsius, T/K = t/degC + 273.15`, { offset: CELSIUS_ZERO_K }],
    ['degF', 'degree Fahrenheit', 5 / 9, `${B8}: degree Fahrenheit, T/K = (t/degF + 459.67)/1.8`, { offset: (459.67 * 5) / 9 }],
    ['degR', 'degree Rankine', 5 / 9, `${B8}: degree Rankine, T/K = (T/degR)/1.8`],
  ]),
  temperatureDifference: table(temperatureAsDifference),
  massFlow: table([
    ['kg/s', 'kilogram per second', 1, EXACT],
    ['g/s', 'gram per second', 1e-3, EXACT],
    ['kg/min', 'kilogram per minute', 1 / 60, EXACT],
    ['kg/h', 'kilogram per hour', 1 / HOUR_S, EXACT],
    ['t/h', 'tonne per hour', 1e3 / HOUR_S, `${B8}: ton, metric`],
    ['t/d', 'tonne per day', 1e3 / DAY_S, `${B8}: ton, metric`],
    ['lb/s', 'pound per second', POUND_kg, `${B8}: pound (avoirdupois) per second`],
    ['lb/min', 'pound per minute', POUND_kg / 60, `${B8}: pound (avoirdupois) per minute`],
    ['lb/h', 'pound per hour', POUND_kg / HOUR_S, `${B8}: pound (avoirdupois) per hour`],
    ['klb/h', 'thousand pounds per hour', (1e3 * POUND_kg) / HOUR_S, `${B8}: pound (avoirdupois) per hour, x 1e3`],
  ]),
  volumeFlow: table([
    ['m3/s', 'cubic metre per second (actual)', 1, EXACT],
    ['m3/min', 'cubic metre per minute (actual)', 1 / 60, EXACT],
    ['m3/h', 'cubic metre per hour (actual)', 1 / HOUR_S, EXACT],
    ['m3/d', 'cubic metre per day (actual)', 1 / DAY_S, EXACT],
    ['l/s', 'litre per second', 1e-3, `${B8}: liter`],
    ['l/min', 'litre per minute', 1e-3 / 60, `${B8}: liter`],
    ['l/h', 'litre per hour', 1e-3 / HOUR_S, `${B8}: liter`],
    ['ft3/s', 'cubic foot per second (actual)', FT3_m3, `${B8}: cubic foot per second`],
    ['ft3/min', 'cubic foot per minute (actual, acfm)', FT3_m3 / 60, `${B8}: cubic foot per minute`],
    ['ft3/h', 'cubic foot per hour (actual)', FT3_m3 / HOUR_S, `${B8}: cubic foot per hour`],
    ['gal/min', 'U.S. gallon per minute', US_GALLON_m3 / 60, `${B8}: gallon (U.S.) per minute (gpm)`],
  ]),
  standardVolumeFlow: table([
    standardFlow('Nm3/s', 'normal cubic metre per second', 1, 1, NORMAL_REFERENCE),
    standardFlow('Nm3/h', 'normal cubic metre per hour', 1, HOUR_S, NORMAL_REFERENCE),
    standardFlow('kNm3/h', 'thousand normal cubic metres per hour', 1e3, HOUR_S, NORMAL_REFERENCE),
    standardFlow('Nm3/d', 'normal cubic metre per day', 1, DAY_S, NORMAL_REFERENCE),
    standardFlow('Sm3/h', 'standard cubic metre per hour', 1, HOUR_S, STANDARD_REFERENCE),
    standardFlow('Sm3/d', 'standard cubic metre per day', 1, DAY_S, STANDARD_REFERENCE),
    standardFlow('scfm', 'standard cubic foot per minute', FT3_m3, 60, SCF_REFERENCE),
    standardFlow('scfh', 'standard cubic foot per hour', FT3_m3, HOUR_S, SCF_REFERENCE),
    standardFlow('MMscfd', 'million standard cubic feet per day', 1e6 * FT3_m3, DAY_S, SCF_REFERENCE),
  ]),
  power: table(powerUnits),
  heatFlow: table(powerUnits),
  energy: table([
    ['J', 'joule', 1, EXACT],
    ['kJ', 'kilojoule', 1e3, EXACT],
    ['MJ', 'megajoule', 1e6, EXACT],
    ['GJ', 'gigajoule', 1e9, EXACT],
    ['TJ', 'terajoule', 1e12, EXACT],
    ['Wh', 'watt hour', HOUR_S, `${B8}: watt hour`],
    ['kWh', 'kilowatt hour', 1e3 * HOUR_S, `${B8}: kilowatt hour`],
    ['MWh', 'megawatt hour', 1e6 * HOUR_S, `${B8}: kilowatt hour, x 1e3`],
    ['GWh', 'gigawatt hour', 1e9 * HOUR_S, `${B8}: kilowatt hour, x 1e6`],
    ['Btu', 'British thermal unit (IT)', BTU_IT_J, `${B8}: British thermal unit_IT`],
    ['MMBtu', 'million Btu (IT)', 1e6 * BTU_IT_J, `${B8}: British thermal unit_IT, x 1e6`],
    ['therm', 'therm (100 000 Btu_IT)', 1e5 * BTU_IT_J, `${B8}: therm (EC) 1.05506 E+08 J; here 1e5 Btu_IT exactly`],
    ['therm(US)', 'therm (U.S.)', 1.054804e8, `${B8}: therm (U.S.)`],
    ['kcal', 'kilocalorie (IT)', 1e3 * CALORIE_IT_J, `${B8}: calorie_IT`],
    ['Mcal', 'megacalorie (IT)', 1e6 * CALORIE_IT_J, `${B8}: calorie_IT`],
    ['Gcal', 'gigacalorie (IT)', 1e9 * CALORIE_IT_J, `${B8}: calorie_IT`],
  ]),
  specificEnthalpy: table([
    ['J/kg', 'joule per kilogram', 1, EXACT],
    ['kJ/kg', 'kilojoule per kilogram', 1e3, EXACT],
    ['MJ/kg', 'megajoule per kilogram', 1e6, EXACT],
    ['Btu/lb', 'Btu (IT) per pound', BTU_IT_J / POUND_kg, `${B8}: British thermal unit_IT per pound`],
    ['kcal/kg', 'kilocalorie (IT) per kilogram', 1e3 * CALORIE_IT_J, `${B8}: kilocalorie_IT per gram, / 1e3`],
  ]),
  fraction: table([
    ['1', 'fraction', 1, EXACT],
    ['%', 'percent', 1e-2, EXACT],
    ['ppm', 'parts per million', 1e-6, EXACT],
    ['ppb', 'parts per billion', 1e-9, EXACT],
  ]),
  density: table([
    ['kg/m3', 'kilogram per cubic metre', 1, EXACT],
    ['g/cm3', 'gram per cubic centimetre', 1e3, EXACT],
    ['g/l', 'gram per litre', 1, EXACT],
    ['lb/ft3', 'pound per cubic foot', POUND_kg / FT3_m3, `${B8}: pound per cubic foot`],
  ]),
  speed: table([
    ['m/s', 'metre per second', 1, EXACT],
    ['km/h', 'kilometre per hour', 1e3 / HOUR_S, EXACT],
    ['ft/s', 'foot per second', FOOT_m, `${B8}: foot per second`],
    ['ft/min', 'foot per minute', FOOT_m / 60, `${B8}: foot per minute`],
  ]),
  length: table([
    ['m', 'metre', 1, EXACT],
    ['mm', 'millimetre', 1e-3, EXACT],
    ['cm', 'centimetre', 1e-2, EXACT],
    ['km', 'kilometre', 1e3, EXACT],
    ['in', 'inch', INCH_m, `${B8}: inch`],
    ['ft', 'foot', FOOT_m, `${B8}: foot`],
  ]),
};

/**
 * Spellings found in historian exports, by canonical unit. Matching ignores spaces, brackets,
 * '-', '_', '.', '*', '^'; maps degree signs to 'deg', superscripts to digits (NFKC) and '/hr',
 * '/sec', '/day' to '/h', '/s', '/d'; and falls back to a case-insensitive match when that is
 * unambiguous. The canonical spelling itself is always accepted.
 */
export const aliases: Readonly<Record<string, readonly string[]>> = {
  Pa: ['pascal', 'N/m2'],
  kPa: ['kilopascal'],
  MPa: ['megapascal', 'N/mm2'],
  bar: [],
  mbar: ['millibar'],
  psi: ['lbf/in2', 'lb/in2'],
  'kg/cm2': ['kgf/cm2', 'kp/cm2', 'at', 'ata'],
  atm: ['atmosphere'],
  mmHg: ['mm Hg'],
  Torr: ['torr'],
  inHg: ['in Hg', '"Hg'],
  inH2O: ['in H2O', 'inWC', 'inWG', 'in WC', '"WC', '"H2O', 'inch H2O', 'in wg'],
  mmH2O: ['mm H2O', 'mmWC', 'mmWG', 'mm WC', 'mmWS', 'mmAq'],
  mH2O: ['mWC', 'mWS'],
  barg: ['bar(g)', 'bar g', 'bar gauge', 'bar(gauge)', 'barü', 'barG'],
  mbarg: ['mbar(g)', 'mbar g', 'mbar gauge'],
  kPag: ['kPa(g)', 'kPa g', 'kPa gauge', 'kPaG'],
  MPag: ['MPa(g)', 'MPa g', 'MPa gauge', 'MPaG'],
  psig: ['psi(g)', 'psi g', 'psi gauge', 'lbf/in2g'],
  'kg/cm2g': ['kg/cm2(g)', 'kgf/cm2g', 'kgf/cm2(g)', 'kg/cm2 g', 'atg', 'atü', 'kg/cm2 gauge'],
  bara: ['bar(a)', 'bar a', 'bar abs', 'bar(abs)', 'bar absolute'],
  kPaa: ['kPa(a)', 'kPa a', 'kPa abs', 'kPa(abs)'],
  MPaa: ['MPa(a)', 'MPa a', 'MPa abs', 'MPa(abs)'],
  psia: ['psi(a)', 'psi a', 'psi abs', 'psi(abs)'],
  'kg/cm2a': ['kg/cm2(a)', 'kgf/cm2a', 'kgf/cm2(a)', 'kg/cm2 abs'],
  K: ['kelvin', 'degK', 'deg K', 'kelvins'],
  degC: ['C', 'deg C', 'degreeC', 'degree C', 'degrees C', 'degree Celsius', 'degrees Celsius', 'Celsius', 'centigrade', 'oC', 'Cel'],
  degF: ['F', 'deg F', 'degreeF', 'degree F', 'degrees F', 'degree Fahrenheit', 'degrees Fahrenheit', 'Fahrenheit', 'oF'],
  degR: ['deg R', 'degree Rankine', 'Rankine', 'oR'],
  'degC-diff': ['delta degC', 'delta C', 'deltaC', 'degC diff', 'degC difference', 'C diff', 'dC'],
  'degF-diff': ['delta degF', 'delta F', 'deltaF', 'degF diff', 'degF difference', 'F diff', 'dF'],
  'kg/s': ['kgs', 'kg/sec'],
  'kg/h': ['kgh', 'kg/hour', 'kgph'],
  't/h': ['tph', 'tonne/h', 'tonnes/h', 'te/h', 'mt/h', 'ton/h'],
  't/d': ['tpd', 'tonne/d', 'tonnes/d', 'te/d', 'mt/d'],
  'lb/s': ['lbs/s', 'lbm/s'],
  'lb/min': ['lbs/min', 'lbm/min'],
  'lb/h': ['lbs/h', 'lbm/h', 'pph', '#/h'],
  'klb/h': ['klbs/h', 'klbm/h', 'kpph', 'k#/h'],
  'm3/h': ['cmh', 'm3ph', 'am3/h'],
  'm3/s': ['am3/s'],
  'ft3/min': ['cfm', 'acfm', 'cuft/min'],
  'ft3/h': ['cfh', 'acfh', 'cuft/h'],
  'ft3/s': ['cfs', 'cuft/s'],
  'gal/min': ['gpm', 'usgpm', 'US gpm', 'gal(US)/min'],
  'l/s': ['L/s', 'lps'],
  'l/min': ['L/min', 'lpm'],
  'l/h': ['L/h', 'lph'],
  'Nm3/h': ['Nm3h', 'Nm3ph', 'm3(n)/h', 'm3n/h', 'Ncmh'],
  'Nm3/s': ['m3(n)/s', 'm3n/s'],
  'Nm3/d': ['m3(n)/d', 'm3n/d'],
  'kNm3/h': ['1000 Nm3/h', 'kNm3h'],
  'Sm3/h': ['Sm3h', 'm3(s)/h', 'Scmh'],
  'Sm3/d': ['m3(s)/d', 'Scmd'],
  scfm: ['SCFM', 'ft3/min(std)', 'std ft3/min'],
  scfh: ['SCFH', 'ft3/h(std)', 'std ft3/h'],
  MMscfd: ['MMSCFD', 'MMscf/d'],
  W: ['watt', 'watts', 'J/s'],
  kW: ['kilowatt', 'kilowatts', 'kJ/s'],
  MW: ['megawatt', 'megawatts', 'MJ/s'],
  hp: ['HP', 'bhp', 'horsepower'],
  'Btu/h': ['Btuh', 'BTU/h', 'Btu/hour', 'Btu(IT)/h'],
  'kBtu/h': ['MBH', 'kBtuh', 'MBtuh'],
  'MMBtu/h': ['MMBtuh', 'mmBtu/h', 'MMBtu(IT)/h'],
  'kcal/h': ['kcalh'],
  'Gcal/h': ['Gcalh'],
  TR: ['RT', 'ton refrigeration', 'tons refrigeration', 'TOR'],
  J: ['joule', 'joules'],
  kWh: ['kW h', 'kilowatt hour', 'kilowatt hours'],
  MWh: ['MW h', 'megawatt hour', 'megawatt hours'],
  Btu: ['BTU', 'Btu(IT)'],
  MMBtu: ['mmBtu', 'MMBTU'],
  therm: ['thm'],
  'therm(US)': ['US therm', 'thm(US)'],
  'Btu/lb': ['Btu/lbm', 'BTU/lb'],
  '1': ['fraction', 'frac', 'mol/mol', 'm3/m3', 'kg/kg', 'v/v', 'w/w', 'unitless', 'dimensionless'],
  '%': ['percent', 'pct', 'per cent'],
  ppm: ['ppmv', 'ppmw', 'ppmm', 'ppm(v)', 'ppm(w)', 'ppmvd', 'ppmvw'],
  ppb: ['ppbv', 'ppbw'],
  'g/l': ['g/L', 'gpl'],
  'lb/ft3': ['lb/cuft', 'lbm/ft3', 'pcf'],
  'km/h': ['kph', 'kmh'],
  'ft/s': ['fps'],
  'ft/min': ['fpm'],
  in: ['inch', 'inches', '"'],
  ft: ['foot', 'feet', "'"],
  m: ['metre', 'meter', 'metres', 'meters'],
};
