/**
 * The normally-idle form of a unit's page (IdleDeclarationForm): its weekly rows as edited, and the
 * declaration it sends. Pure.
 */
import { DEFAULT_RULE_HOURS, WEEKDAYS, type NormallyIdle, type Weekday } from './idle';

/** One weekly window as the form edits it: every day listed, hours as 'HH:00'. */
export interface IdleWindowRow {
  days: Weekday[];
  from: string;
  to: string;
}

/** What the form holds: declared or not, always or at the rows' times, while which units run, and the hours. */
export interface IdleFormState {
  on: boolean;
  always: boolean;
  windows: IdleWindowRow[];
  waitFor: string[];
  /** As typed. */
  hours: string;
}

/** The row a new declaration starts with: the weekend, all day. */
export const FIRST_WINDOW: IdleWindowRow = { days: ['sat', 'sun'], from: '00:00', to: '24:00' };
/** The row "Add a time" adds: weekday nights. */
export const NEXT_WINDOW: IdleWindowRow = { days: ['mon', 'tue', 'wed', 'thu', 'fri'], from: '22:00', to: '06:00' };

/** The form's state for a stored declaration (null: none). */
export function idleFormState(initial: NormallyIdle | null): IdleFormState {
  return {
    on: initial !== null,
    always: initial === null || initial.when === 'always',
    windows: initial && initial.when !== 'always' ? initial.when.map((w) => ({ days: w.days ?? [...WEEKDAYS], from: w.from ?? '00:00', to: w.to ?? '24:00' })) : [FIRST_WINDOW],
    waitFor: initial?.whileRunning ?? [],
    hours: String(initial?.hours ?? DEFAULT_RULE_HOURS),
  };
}

/** The days of a row with `day` ticked or not, in week order. */
export function tickDay(days: readonly Weekday[], day: Weekday, on: boolean): Weekday[] {
  return on ? WEEKDAYS.filter((x) => x === day || days.includes(x)) : days.filter((x) => x !== day);
}

/**
 * The declaration to send (null: not declared idle): a row of all seven days leaves its days out, and
 * the hours are sent when they differ from the default or the stored declaration named them.
 */
export function idleDeclaration(s: IdleFormState, initial: NormallyIdle | null): NormallyIdle | null {
  if (!s.on) return null;
  const n = Number(s.hours);
  return {
    when: s.always ? 'always' : s.windows.map((w) => ({ ...(w.days.length === 7 ? {} : { days: w.days }), from: w.from, to: w.to })),
    ...(s.waitFor.length ? { whileRunning: s.waitFor } : {}),
    ...(n !== DEFAULT_RULE_HOURS || initial?.hours !== undefined ? { hours: n } : {}),
  };
}
