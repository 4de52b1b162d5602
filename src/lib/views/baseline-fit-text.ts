/**
 * The baseline builder's shaping: the unit's hours in a sentence, a term switched on or off (in the
 * terms' fixed order) and a version's reference period in site-local days. Pure.
 */
import { QUADRATIC_TERMS, type BaselineTerm } from '../analytics/baseline';
import { siteDay } from '../site-time';
import { fixed } from '../format';

/** A unit's computed hours as GET /api/units/{unitId}/baselines answers them (ISO instants). */
export interface HourSpan {
  first: string | null;
  last: string | null;
  hours: number;
  steady: number;
}

/** What the builder says of the unit's hours while they are looked up, when there are none, or their span. */
export function spanText(span: HourSpan | null, timeZone: string): string {
  if (span === null) return 'Looking up the unit’s hours…';
  if (span.hours === 0 || !span.first || !span.last) return 'This unit has no computed hours yet.';
  return `${fixed(span.hours, 0)} computed hours from ${siteDay(span.first, timeZone)} to ${siteDay(span.last, timeZone)}, ${fixed(span.steady, 0)} of them steady. Only steady hours are fitted.`;
}

/** The terms with `t` switched: taken out when present, else put in at its place in the terms' order. */
export function toggledTerms(cur: readonly BaselineTerm[], t: BaselineTerm): BaselineTerm[] {
  return cur.includes(t) ? cur.filter((x) => x !== t) : QUADRATIC_TERMS.filter((x) => x === t || cur.includes(x));
}

/** A reference period [from, to) as its first and last site-local day: "2024-01-01 to 2024-01-31". */
export function periodDaysText(periodFrom: string, periodTo: string, timeZone: string): string {
  return `${siteDay(periodFrom, timeZone)} to ${siteDay(Date.parse(periodTo) - 1, timeZone)}`;
}
