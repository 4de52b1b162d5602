/**
 * The hour table of a unit page: the instants of a range of site-local days, the address of its
 * hours (JSON or CSV) and the count of its hours by state. Pure.
 */
import { counted } from '../counts';
import { fixed } from '../format';
import { HOUR_STATES } from '../hour-states';
import { siteDayStart } from '../site-time';
import { DAY_MS } from '../time';

/**
 * The range [from, to) as ISO instants: from the start of the first site-local day (yyyy-MM-dd) to
 * 24 hours after the start of the last. A day that is no date throws (as toISOString does).
 */
export function dayRange(fromDay: string, toDay: string, timeZone: string): { from: string; to: string } {
  const from = new Date(siteDayStart(fromDay, timeZone) ?? Number.NaN).toISOString();
  const to = new Date((siteDayStart(toDay, timeZone) ?? Number.NaN) + DAY_MS).toISOString();
  return { from, to };
}

/** GET /api/v1/units/{unitId}/hours of a range, or its CSV. */
export function unitHoursUrl(unitId: string, range: { from: string; to: string }, csv = false): string {
  return `/api/v1/units/${unitId}/hours?from=${encodeURIComponent(range.from)}&to=${encodeURIComponent(range.to)}${csv ? '&format=csv' : ''}`;
}

/** "24 hours: 20 steady, 3 unsettled, 1 idle": the hours and those of each state there are, in the states' order. */
export function stateCountsText(rows: readonly { state: string }[]): string {
  const counts = rows.reduce<Record<string, number>>((m, r) => ((m[r.state] = (m[r.state] ?? 0) + 1), m), {});
  const parts = HOUR_STATES.filter((s) => counts[s]).map((s) => `${fixed(counts[s]!, 0)} ${s}`);
  return `${counted(rows.length, 'hour', 'hours')}: ${parts.join(', ')}`;
}
