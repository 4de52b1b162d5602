/**
 * The shapes of a unit's trend as the API answers them: one definition for the server
 * (src/server/services/views.ts) and the islands that draw it (src/components/insight/views). Types only.
 */
export type HourState = 'steady' | 'unsettled' | 'idle' | 'suspect';
export type StateCounts = Record<HourState, number>;

/** The baseline's prediction for one hour with its k = 2 band. Efficiency [-], destruction [W]. */
export interface ExpectedHour {
  efficiency: number | null;
  efficiencyLo: number | null;
  efficiencyHi: number | null;
  destruction_W: number | null;
  destructionLo_W: number | null;
  destructionHi_W: number | null;
}

/** A drift notice as the time axis and the report show it. */
export interface NoticeMark {
  id: string;
  unitId: string;
  unitName: string;
  direction: 'up' | 'down';
  status: 'open' | 'acknowledged' | 'closed';
  onsetMs: number;
  signalMs: number;
  hours: number;
  /** Mean measured minus expected destruction [W]. */
  extra_W: number;
  /** Uncertainty of that mean shift [W]; null when unknown. */
  shiftU_W: number | null;
  exceedsUncertainty: boolean | null;
  extraCost_per_day: number | null;
  currency: string;
}

/** One point of a trend: an hour (or a local day for long periods). Null figures break the line. */
export interface TrendPoint {
  /** Start of the hour or local day [ms]. */
  t: number;
  /** Hours of each state in the bucket. */
  states: StateCounts;
  /** Mean over the bucket's steady hours; null when it has none. Efficiency [-], destruction [W]. */
  efficiency: number | null;
  efficiency_U: number | null;
  destruction_W: number | null;
  destruction_U_W: number | null;
  load: number | null;
  T0_K: number | null;
  /** The baseline's prediction for the steady hours (mean over the bucket), with its k = 2 band. */
  expected: ExpectedHour | null;
  /** An hour's state and its first reasons (hourly buckets only). */
  state?: HourState | null;
  reasons?: string[];
}

/**
 * A run of hours of one non-steady state, shaded on the charts (for day buckets: a run of days most
 * of whose hours with data were of that state).
 */
export interface ContextSpan {
  state: Exclude<HourState, 'steady'>;
  fromMs: number;
  toMs: number;
  hours: number;
}
