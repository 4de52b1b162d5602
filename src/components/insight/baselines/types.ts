/** The shapes the baselines API answers with (src/server/services/baselines.ts), for the islands. */
export type BaselineTerm = 'load' | 'T_amb' | 'load^2' | 'T_amb^2' | 'load*T_amb';

export interface ModelSummary {
  coefficients: { intercept: number } & Partial<Record<BaselineTerm, number>>;
  stats: { n: number; p: number; s: number; r2: number; ybar: number; cvRmse: number; nmbe: number };
  guideline14: { meets: boolean; cvRmseOk: boolean; nmbeOk: boolean; cvRmseMax: number; nmbeMax: number };
}

export interface BaselineSummary {
  id: string;
  unitId: string;
  unitName: string;
  unitKind: string;
  siteId: string;
  siteName: string;
  timeZone: string;
  version: number;
  status: 'draft' | 'active' | 'discarded' | 'retired';
  periodFrom: string;
  periodTo: string;
  terms: BaselineTerm[];
  hours: number;
  loadUnit: string | null;
  note: string | null;
  efficiency: ModelSummary | null;
  destruction: ModelSummary;
  meetsGuideline14: boolean;
  createdBy: string | null;
  createdAt: string;
  decidedBy: string | null;
  decidedAt: string | null;
  retiredAt: string | null;
  label: string;
}

export interface FitView {
  points: { hourStart: string; load: number; T0_K: number; efficiency: number | null; destruction_W: number; expectedEfficiency: number | null; expectedDestruction_W: number }[];
  curve: { load: number; efficiency: number | null; destruction_W: number }[];
  meanT0_K: number;
}

export const TERM_LABELS: Record<BaselineTerm, string> = {
  load: 'load',
  T_amb: 'T_amb',
  'load^2': 'load²',
  'T_amb^2': 'T_amb²',
  'load*T_amb': 'load × T_amb',
};
export const ALL_TERMS: BaselineTerm[] = ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'];
