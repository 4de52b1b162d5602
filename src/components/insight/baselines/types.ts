/** The shapes the baselines API answers with (src/server/services/baselines.ts), for the islands. */
import type { BaselineTerm } from '~/lib/analytics/baseline';
import { BASELINE_TERM_WORDS } from '~/lib/words';
export type { BaselineTerm };

export type { BaselineSummary, FitView, ModelSummary } from '~/lib/baseline-view';


/** Terms in words (src/lib/words). */
export const TERM_LABELS: Record<BaselineTerm, string> = {
  load: BASELINE_TERM_WORDS.load.label,
  T_amb: BASELINE_TERM_WORDS.T_amb.label,
  'load^2': BASELINE_TERM_WORDS['load^2'].label,
  'T_amb^2': BASELINE_TERM_WORDS['T_amb^2'].label,
  'load*T_amb': BASELINE_TERM_WORDS['load*T_amb'].label,
};
export const ALL_TERMS: BaselineTerm[] = ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'];
