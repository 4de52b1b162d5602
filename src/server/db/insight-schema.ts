// Tables of baselines, drift notices and reports (issue: insight). Owned by the insight work.
export {};
