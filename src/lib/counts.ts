/**
 * Sentences that count things, written so that they read well at 0 and 1 too ("no drift notices
 * outstanding", "1 drift notice outstanding", "3 drift notices outstanding"), never "0 drift notices"
 * or "1 files". Pure: no locale of the browser; the count is written by the one formatter
 * (src/lib/format.ts), thousands grouped with a thin space as every other number on the pages.
 */
import { fixed } from './format';

/** A count with its noun: 'no files', '1 file', '2 files', '12 345 files' (thin space). */
export function counted(n: number, one: string, many: string, none = `no ${many}`): string {
  if (n === 0) return none;
  if (n === 1) return `1 ${one}`;
  return `${fixed(n, 0)} ${many}`;
}

/** The noun alone, singular for exactly 1 ('file', 'files'). */
export function plural(n: number, one: string, many: string): string {
  return n === 1 ? one : many;
}

/** Parts of a list that are not zero, joined: 'two missing · one conflict'; '' when all are zero. */
export function nonZeroParts(parts: readonly [number, string, string][], sep = ', '): string {
  return parts
    .filter(([n]) => n !== 0)
    .map(([n, one, many]) => counted(n, one, many))
    .join(sep);
}
