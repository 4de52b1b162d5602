// Tables of the hourly exergy engine and insight (unit hours, baselines, drift notices).
export {};
