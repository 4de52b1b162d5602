/**
 * A unit's limits as the limits form (src/components/insight/UnitLimitsForm.tsx) shows and sends them:
 * the answer of GET/PUT /api/units/:unitId/limits, its fields as typed text, and the body a save sends.
 * Pure; the server checks the body (src/server/services/unit-rules.ts).
 */

/** GET or PUT /api/units/:unitId/limits, under `limits`. */
export interface UnitLimits {
  /** Cost of destruction per day above which an hour crosses [site currency/day]; null for none. */
  maxCost_per_day: number | null;
  /** Exergy efficiency below which a steady hour crosses [-]; null for none. */
  minEfficiency: number | null;
  /** Hours in a row across a limit that open a notice. */
  hours: number;
  currency: string;
  /** The unit's normally-idle declaration in words; null when it has none. */
  normallyIdle: string | null;
  updatedAt: string | null;
}

/** The form's fields as typed: efficiency in %, empty for none. */
export interface UnitLimitsFields {
  cost: string;
  eff: string;
  hours: string;
}

/** A typed number, a comma taken as the decimal mark; null when the field is empty. */
export const typedNumber = (s: string): number | null => (s.trim() === '' ? null : Number(s.replace(',', '.')));

/** The fields showing saved limits: the efficiency as a percentage to one decimal. */
export function limitsFields(l: UnitLimits): UnitLimitsFields {
  return {
    cost: l.maxCost_per_day === null ? '' : String(l.maxCost_per_day),
    eff: l.minEfficiency === null ? '' : String(Math.round(l.minEfficiency * 1000) / 10),
    hours: String(l.hours),
  };
}

/** The body a save sends: the efficiency back as a fraction. */
export function limitsBody(f: UnitLimitsFields): { maxCost_per_day: number | null; minEfficiency: number | null; hours: number } {
  const pct = typedNumber(f.eff);
  return { maxCost_per_day: typedNumber(f.cost), minEfficiency: pct === null ? null : pct / 100, hours: Number(f.hours) };
}
