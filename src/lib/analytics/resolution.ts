/**
 * What an instrument can resolve, for the steady-state test's spread limits (./steady.ts): no limit is
 * below the spread a tag's instrument cannot resolve at the hour's reading.
 */
/** What a tag's instrument can resolve: its standard uncertainty and range, in the unit of the statistics. */
export interface InstrumentResolution {
  /** Standard uncertainty, absolute [unit of the statistics]. */
  uAbs?: number;
  /** Standard uncertainty relative to the reading [-] (0.01 for 1 % of reading). */
  uRel?: number;
  /** Span of the instrument, validMax - validMin [unit of the statistics]; null/absent when unknown. */
  span?: number | null;
}

/**
 * Share of the span below which a relative (% of reading) uncertainty stops shrinking with the
 * reading [-]: 0.1, a 10:1 turndown. Common practice (flow meters are specified in % of reading over
 * a turndown of about 10:1 for vortex and magnetic meters, less for orifice plates); configurable by
 * giving the tag an absolute uncertainty instead.
 */
export const LOW_RANGE_FRACTION = 0.1;

/**
 * The spread an instrument cannot resolve at a reading: factor x u, with u the absolute standard
 * uncertainty plus the relative one taken of max(|mean|, LOW_RANGE_FRACTION x span).
 *
 * @param mean the hour's mean [unit of the statistics]
 * @param inst the instrument's uncertainty and span (see InstrumentResolution); absent gives 0
 * @param factor multiple of u [-]; default 2 (the expanded uncertainty U, k = 2)
 * @returns the smallest spread limit the tag can have this hour [unit of the statistics]
 */
export function resolvableSpread(mean: number, inst: InstrumentResolution | undefined, factor = 2): number {
  return resolvableSpreadOf(inst ? resolutionTerms(inst) : null, mean, factor);
}

/** An instrument's terms of resolvableSpread that do not depend on the reading (a caller testing many hours keeps them). */
export interface ResolutionTerms {
  uAbs: number;
  uRel: number;
  /** LOW_RANGE_FRACTION x span (0 without a span) */
  low: number;
}

export function resolutionTerms(inst: InstrumentResolution): ResolutionTerms {
  const span = inst.span !== null && inst.span !== undefined && Number.isFinite(inst.span) && inst.span > 0 ? inst.span : 0;
  return { uAbs: inst.uAbs ?? 0, uRel: inst.uRel ?? 0, low: LOW_RANGE_FRACTION * span };
}

/** resolvableSpread from the instrument's kept terms (null: no instrument, 0). */
export function resolvableSpreadOf(t: ResolutionTerms | null, mean: number, factor = 2): number {
  if (!t || !Number.isFinite(mean)) return 0;
  const u = t.uAbs + t.uRel * Math.max(Math.abs(mean), t.low);
  return Number.isFinite(u) && u > 0 ? factor * u : 0;
}
