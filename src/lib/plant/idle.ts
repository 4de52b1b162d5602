/**
 * A unit declared normally idle (let-down and bypass valves, vents, standby pumps): always, or on a
 * weekly schedule in the site's clock, and optionally only while other units run (a bypass valve is
 * idle while its turbine runs; a standby pump while its duty pump runs). Part of a unit in the plant
 * model file (`normallyIdle`, docs/plant-model.md). Pure: the schema and its words; the rule that
 * judges hours against it is src/lib/analytics/unit-rules.ts.
 */
import { z } from 'zod';

export const WEEKDAYS = ['mon', 'tue', 'wed', 'thu', 'fri', 'sat', 'sun'] as const;
export type Weekday = (typeof WEEKDAYS)[number];

/** Consecutive hours of running before a notice opens, when the declaration does not say (common practice). */
export const DEFAULT_RULE_HOURS = 3;
export const MAX_RULE_HOURS = 24 * 30;

const clock = (what: string) =>
  z
    .string({ error: `Give the ${what} as a whole hour of the site's clock, "HH:00".` })
    .regex(/^([01]\d|2[0-4]):00$/, `The ${what} is a whole hour of the site's clock, "00:00" to "24:00".`);

/**
 * One weekly window of the site's clock: the hours from `from` to `to` on each of `days` (every day
 * when left out). `to` at or before `from` runs over midnight into the next day ("22:00" to "06:00").
 */
export const IdleWindowSchema = z.strictObject({
  days: z.array(z.enum(WEEKDAYS, { error: `A day is one of ${WEEKDAYS.join(', ')}.` })).min(1, 'Name at least one day, or leave "days" out for every day.').optional(),
  from: clock('start').default('00:00'),
  to: clock('end').default('24:00'),
});
export type IdleWindow = z.infer<typeof IdleWindowSchema>;

export const NormallyIdleSchema = z.strictObject({
  /** "always", or the weekly windows in which the unit should be idle. */
  when: z.union([z.literal('always'), z.array(IdleWindowSchema).min(1, 'Give at least one window, or "always".')], {
    error: 'Say when the unit should be idle: "always" or a list of windows { days, from, to }.',
  }),
  /** Only while these units of the site run (steady or unsettled hours). Left out: whatever else runs. */
  whileRunning: z.array(z.string().trim().min(1)).optional(),
  /** Consecutive hours of running that open a notice (more than this many) [h]. */
  hours: z.number({ error: 'Give the hours as a whole number.' }).int('Give the hours as a whole number.').min(1).max(MAX_RULE_HOURS).optional(),
});
export type NormallyIdle = z.infer<typeof NormallyIdleSchema>;

/** The declaration as written back to a file: defaults of windows left out when they are the defaults. */
export function tidyNormallyIdle(d: NormallyIdle): NormallyIdle {
  return {
    when:
      d.when === 'always'
        ? 'always'
        : d.when.map((w) => ({ ...(w.days ? { days: WEEKDAYS.filter((x) => w.days!.includes(x)) } : {}), from: w.from, to: w.to })),
    ...(d.whileRunning?.length ? { whileRunning: [...d.whileRunning] } : {}),
    ...(d.hours !== undefined ? { hours: d.hours } : {}),
  };
}

const DAY_WORDS: Record<Weekday, string> = { mon: 'Mon', tue: 'Tue', wed: 'Wed', thu: 'Thu', fri: 'Fri', sat: 'Sat', sun: 'Sun' };

/** "Mon-Fri" style words for a set of days. */
export function daysText(days: readonly Weekday[] | undefined): string {
  if (!days || days.length === 7) return 'every day';
  const idx = WEEKDAYS.map((d, i) => (days.includes(d) ? i : -1)).filter((i) => i >= 0);
  const parts: string[] = [];
  for (let i = 0; i < idx.length; ) {
    let j = i;
    while (j + 1 < idx.length && idx[j + 1] === idx[j]! + 1) j++;
    const a = DAY_WORDS[WEEKDAYS[idx[i]!]!];
    const b = DAY_WORDS[WEEKDAYS[idx[j]!]!];
    parts.push(j === i ? a : j === i + 1 ? `${a}, ${b}` : `${a}-${b}`);
    i = j + 1;
  }
  return parts.join(', ');
}

/** Plain words for a declaration: "always, while TG1 runs" or "Sat, Sun 00:00-24:00; Mon-Fri 22:00-06:00". */
export function normallyIdleText(d: NormallyIdle): string {
  const when = d.when === 'always' ? 'always' : d.when.map((w) => `${daysText(w.days)} ${w.from}-${w.to}`).join('; ');
  return d.whileRunning?.length ? `${when}, while ${d.whileRunning.join(' and ')} ${d.whileRunning.length === 1 ? 'runs' : 'run'}` : when;
}
