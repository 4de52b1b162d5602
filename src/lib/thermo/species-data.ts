/**
 * NASA Glenn 9-coefficient ideal-gas polynomials (two ranges, 200-1000 K and 1000-6000 K) for the
 * species of fuel, air and flue gas, copied as data from the CEA thermodynamic database
 * (thermo.inp, release 9/09/04) of McBride, Zehe & Gordon, NASA/TP-2002-211556.
 *
 * Per range: cp/R = a1 T^-2 + a2 T^-1 + a3 + a4 T + a5 T^2 + a6 T^3 + a7 T^4;
 * H/(R T) adds b1/T, S/R adds b2 (the integration constants). H is absolute: at 298.15 K it equals
 * the enthalpy of formation from the reference elements. Standard-state pressure 1 bar.
 * The `source` string is the data reference printed in the thermo.inp header line of each block.
 * The published check values in docs/reference/check-values.md (section 2) prove these blocks.
 */

/** Chemical elements tracked by the combustion balance. */
export type Element = 'C' | 'H' | 'O' | 'N' | 'S' | 'Ar';

export interface NasaRange {
  readonly Tmin_K: number;
  readonly Tmax_K: number;
  /** a1..a7 of the NASA 9-coefficient form [-] (with T in K) */
  readonly a: readonly [number, number, number, number, number, number, number];
  /** b1 [K] (enthalpy constant) and b2 [-] (entropy constant) */
  readonly b: readonly [number, number];
}

export interface NasaSpeciesData {
  /** atoms per molecule */
  readonly elements: Partial<Record<Element, number>>;
  /** data reference from the thermo.inp block header */
  readonly source: string;
  /** molar mass [g/mol] as printed in thermo.inp */
  readonly M_g_per_mol: number;
  /** enthalpy of formation at 298.15 K [J/mol] as printed in thermo.inp */
  readonly hf298_J_per_mol: number;
  readonly ranges: readonly [NasaRange, NasaRange];
}

export const NASA_SPECIES = {
  CH4: {
    elements: { C: 1, H: 4 },
    source: 'Gurvich,1991 pt1 p44 pt2 p36.',
    M_g_per_mol: 16.04246,
    hf298_J_per_mol: -74600.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-176685.0998, 2786.18102, -12.0257785, 0.0391761929, -3.61905443e-05, 2.026853043e-08, -4.97670549e-12], b: [-23313.1436, 89.0432275] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [3730042.76, -13835.01485, 20.49107091, -0.001961974759, 4.72731304e-07, -3.72881469e-11, 1.623737207e-15], b: [75320.6691, -121.9124889] },
    ],
  },
  C2H6: {
    elements: { C: 2, H: 6 },
    source: 'Ethane. Pamidimukkala,1982.',
    M_g_per_mol: 30.06904,
    hf298_J_per_mol: -83851.544,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-186204.4161, 3406.19186, -19.51705092, 0.0756583559, -8.20417322e-05, 5.0611358e-08, -1.319281992e-11], b: [-27029.3289, 129.8140496] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [5025782.13, -20330.22397, 33.2255293, -0.00383670341, 7.23840586e-07, -7.3191825e-11, 3.065468699e-15], b: [111596.395, -203.9410584] },
    ],
  },
  C3H8: {
    elements: { C: 3, H: 8 },
    source: 'Hf:TRC(10/85) w1350. Chao,1973.',
    M_g_per_mol: 44.09562,
    hf298_J_per_mol: -104680.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-243314.4337, 4656.27081, -29.39466091, 0.1188952745, -0.0001376308269, 8.81482391e-08, -2.342987994e-11], b: [-35403.3527, 184.1749277] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [6420731.68, -26597.91134, 45.3435684, -0.00502066392, 9.47121694e-07, -9.57540523e-11, 4.00967288e-15], b: [145558.2459, -281.8374734] },
    ],
  },
  CO: {
    elements: { C: 1, O: 1 },
    source: 'Gurvich,1979 pt1 p25 pt2 p29.',
    M_g_per_mol: 28.0101,
    hf298_J_per_mol: -110535.196,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [14890.45326, -292.2285939, 5.72452717, -0.00817623503, 1.456903469e-05, -1.087746302e-08, 3.027941827e-12], b: [-13031.31878, -7.85924135] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [461919.725, -1944.704863, 5.91671418, -0.000566428283, 1.39881454e-07, -1.787680361e-11, 9.62093557e-16], b: [-2466.261084, -13.87413108] },
    ],
  },
  H2: {
    elements: { H: 2 },
    source: 'Ref-Elm. Gurvich,1978 pt1 p103 pt2 p31.',
    M_g_per_mol: 2.01588,
    hf298_J_per_mol: 0.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [40783.2321, -800.918604, 8.21470201, -0.01269714457, 1.753605076e-05, -1.20286027e-08, 3.36809349e-12], b: [2682.484665, -30.43788844] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [560812.801, -837.150474, 2.975364532, 0.001252249124, -3.74071619e-07, 5.9366252e-11, -3.6069941e-15], b: [5339.82441, -2.202774769] },
    ],
  },
  SO2: {
    elements: { S: 1, O: 2 },
    source: 'Gurvich,1989 pt1 p288 pt2 p175.',
    M_g_per_mol: 64.0638,
    hf298_J_per_mol: -296810.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-53108.4214, 909.031167, -2.356891244, 0.02204449885, -2.510781471e-05, 1.446300484e-08, -3.36907094e-12], b: [-41137.5208, 40.45512519] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [-112764.0116, -825.226138, 7.61617863, -0.000199932761, 5.65563143e-08, -5.45431661e-12, 2.918294102e-16], b: [-33513.0869, -16.55776085] },
    ],
  },
  Ar: {
    elements: { Ar: 1 },
    source: 'Ref-Elm. Moore,1971. Gordon,1999.',
    M_g_per_mol: 39.948,
    hf298_J_per_mol: 0.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [0.0, 0.0, 2.5, 0.0, 0.0, 0.0, 0.0], b: [-745.375, 4.37967491] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [20.10538475, -0.0599266107, 2.500069401, -3.99214116e-08, 1.20527214e-11, -1.819015576e-15, 1.078576636e-19], b: [-744.993961, 4.37918011] },
    ],
  },
  CO2: {
    elements: { C: 1, O: 2 },
    source: 'Gurvich,1991 pt1 p27 pt2 p24.',
    M_g_per_mol: 44.0095,
    hf298_J_per_mol: -393510.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [49436.5054, -626.411601, 5.30172524, 0.002503813816, -2.127308728e-07, -7.68998878e-10, 2.849677801e-13], b: [-45281.9846, -7.04827944] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [117696.2419, -1788.791477, 8.29152319, -9.22315678e-05, 4.86367688e-09, -1.891053312e-12, 6.33003659e-16], b: [-39083.5059, -26.52669281] },
    ],
  },
  H2O: {
    elements: { H: 2, O: 1 },
    source: 'Hf:Cox,1989. Woolley,1987. TRC(10/88) tuv25.',
    M_g_per_mol: 18.01528,
    hf298_J_per_mol: -241826.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-39479.6083, 575.573102, 0.931782653, 0.00722271286, -7.34255737e-06, 4.95504349e-09, -1.336933246e-12], b: [-33039.7431, 17.24205775] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [1034972.096, -2412.698562, 4.64611078, 0.002291998307, -6.83683048e-07, 9.42646893e-11, -4.82238053e-15], b: [-13842.86509, -7.97814851] },
    ],
  },
  N2: {
    elements: { N: 2 },
    source: 'Ref-Elm. Gurvich,1978 pt1 p280 pt2 p207.',
    M_g_per_mol: 28.0134,
    hf298_J_per_mol: 0.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [22103.71497, -381.846182, 6.08273836, -0.00853091441, 1.384646189e-05, -9.62579362e-09, 2.519705809e-12], b: [710.846086, -10.76003744] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [587712.406, -2239.249073, 6.06694922, -0.00061396855, 1.491806679e-07, -1.923105485e-11, 1.061954386e-15], b: [12832.10415, -15.86640027] },
    ],
  },
  O2: {
    elements: { O: 2 },
    source: 'Ref-Elm. Gurvich,1989 pt1 p94 pt2 p9.',
    M_g_per_mol: 31.9988,
    hf298_J_per_mol: 0.0,
    ranges: [
      { Tmin_K: 200.0, Tmax_K: 1000.0, a: [-34255.6342, 484.700097, 1.119010961, 0.00429388924, -6.83630052e-07, -2.0233727e-09, 1.039040018e-12], b: [-3391.45487, 18.4969947] },
      { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [-1037939.022, 2344.830282, 1.819732036, 0.001267847582, -2.188067988e-07, 2.053719572e-11, -8.19346705e-16], b: [-16890.10929, 17.38716506] },
    ],
  },
} as const satisfies Record<string, NasaSpeciesData>;

/**
 * The thermo.inp 'Air' block (Gordon 1982; mole %: N2 78.084, O2 20.9476, Ar 0.9365, CO2 0.0319).
 * Kept only to cross-check the dry-air mixture built from the pure species.
 */
export const NASA_AIR_BLOCK = {
  elements: {},
  source: 'Mole%:N2 78.084,O2 20.9476,Ar .9365,CO2 .0319.Gordon,1982.Reac',
  M_g_per_mol: 28.9651159,
  hf298_J_per_mol: -125.53,
  ranges: [
    { Tmin_K: 200.0, Tmax_K: 1000.0, a: [10099.5016, -196.827561, 5.00915511, -0.00576101373, 1.06685993e-05, -7.94029797e-09, 2.18523191e-12], b: [-176.796731, -3.921504225] },
    { Tmin_K: 1000.0, Tmax_K: 6000.0, a: [241521.443, -1257.8746, 5.14455867, -0.000213854179, 7.06522784e-08, -1.07148349e-11, 6.57780015e-16], b: [6462.26319, -8.147411905] },
  ],
} as const satisfies NasaSpeciesData;
