/**
 * The states of a unit hour (docs/design.md "Hour states"), one list for the engine, the database,
 * the views, reports and islands. Only steady hours feed efficiency, destruction and cost figures.
 */
import { isOneOf } from './one-of';
export const HOUR_STATES = ['steady', 'unsettled', 'idle', 'suspect'] as const;
export type HourState = (typeof HOUR_STATES)[number];

/** The states an hour is counted in and shown as context, not drawn in the figures. */
export const CONTEXT_STATES = ['unsettled', 'idle', 'suspect'] as const satisfies readonly HourState[];
export type ContextState = (typeof CONTEXT_STATES)[number];

/** How severe a state is, for ordering an hour's reasons most severe first: suspect, idle, unsettled, steady. */
export const STATE_SEVERITY: Readonly<Record<HourState, number>> = { suspect: 3, idle: 2, unsettled: 1, steady: 0 };

/** Hours of each state. */
export type StateCounts = Record<HourState, number>;

/** No hours of any state. */
export const zeroStateCounts = (): StateCounts => ({ steady: 0, unsettled: 0, idle: 0, suspect: 0 });

export const isHourState = (s: unknown): s is HourState => isOneOf(HOUR_STATES, s);
