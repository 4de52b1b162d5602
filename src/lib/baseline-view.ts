/**
 * A baseline version as the API answers it: one definition for the server
 * (src/server/services/baselines.ts) and the islands (src/components/insight/baselines), and the
 * label that names a version wherever it is shown (its page, a notice, a mail).
 */
import type { BaselineModel, BaselineTerm, Guideline14Check } from './analytics/baseline';
import type { FitTrust } from './analytics/fit-trust';
import { siteDay } from './site-time';

/** The label of a baseline version; the period end is shown as its last day (the end is exclusive). */
export function baselineLabel(version: number, periodFrom: Date, periodTo: Date, timeZone: string): string {
  return `Baseline v${version} (${siteDay(periodFrom, timeZone)} to ${siteDay(periodTo.getTime() - 1, timeZone)})`;
}

export type BaselineStatus = 'draft' | 'active' | 'discarded' | 'retired';

export interface ModelSummary {
  coefficients: BaselineModel['coefficients'];
  stats: { n: number; p: number; s: number; r2: number; ybar: number; cvRmse: number; nmbe: number };
  guideline14: Guideline14Check;
}

/** A baseline version as screens and other services see it. */
export interface BaselineSummary {
  id: string;
  unitId: string;
  unitName: string;
  unitKind: string;
  siteId: string;
  siteName: string;
  timeZone: string;
  version: number;
  status: BaselineStatus;
  periodFrom: string;
  periodTo: string;
  terms: BaselineTerm[];
  hours: number;
  loadUnit: string | null;
  note: string | null;
  efficiency: ModelSummary | null;
  destruction: ModelSummary;
  /** Both models meet the hourly Guideline 14 criteria (efficiency only when the unit has one). */
  meetsGuideline14: boolean;
  /** Whether the fit saw enough hours and load to be trusted, and to be accepted (src/lib/analytics/fit-trust.ts). */
  trust: FitTrust;
  createdBy: string | null;
  createdAt: string;
  decidedBy: string | null;
  decidedAt: string | null;
  retiredAt: string | null;
  /** How charts name it: 'Baseline v3 (2026-01-05 to 2026-02-01)', dates in the site's time zone. */
  label: string;
}

/** A reference hour of a baseline with the fitted values. Efficiency [-], destruction [W], T0 [K]. */
export interface FitPoint {
  hourStart: string;
  load: number;
  T0_K: number;
  efficiency: number | null;
  destruction_W: number;
  expectedEfficiency: number | null;
  expectedDestruction_W: number;
}

/** GET /api/baselines/:id fit: the reference hours and the fitted curve against load at the mean T0. */
export interface FitView {
  points: FitPoint[];
  curve: { load: number; efficiency: number | null; destruction_W: number }[];
  meanT0_K: number;
  /** Steady reference hours of the fit; `points` holds at most a few hundred of them, evenly chosen. */
  totalPoints?: number;
}
