/**
 * Lengths of time, one definition for the whole product. Instants are UTC milliseconds; an hour of
 * the balances is a UTC hour [hourStart, hourStart + HOUR_MS).
 */

/** Milliseconds in a minute, an hour and a (24-hour) day [ms]. */
export const MINUTE_MS = 60_000;
export const HOUR_MS = 3_600_000;
export const DAY_MS = 86_400_000;

/** Seconds in an hour and a (24-hour) day [s]: a power [W] over an hour is HOUR_S joules. */
export const HOUR_S = 3600;
export const DAY_S = 86_400;

/** The start of the UTC hour holding an instant [ms]. */
export const hourFloor = (ms: number): number => Math.floor(ms / HOUR_MS) * HOUR_MS;
/** The first UTC hour start at or after an instant [ms]. */
export const hourCeil = (ms: number): number => Math.ceil(ms / HOUR_MS) * HOUR_MS;
