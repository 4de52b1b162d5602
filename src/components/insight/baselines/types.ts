/** The shapes the baselines API answers with (src/server/services/baselines.ts), for the islands. */
import type { BaselineTerm } from '~/lib/analytics/baseline';
export type { BaselineTerm };

export type { BaselineSummary, FitView, ModelSummary } from '~/lib/baseline-view';


export const TERM_LABELS: Record<BaselineTerm, string> = {
  load: 'load',
  T_amb: 'T_amb',
  'load^2': 'load²',
  'T_amb^2': 'T_amb²',
  'load*T_amb': 'load × T_amb',
};
export const ALL_TERMS: BaselineTerm[] = ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'];
