/**
 * Thinning of what a chart draws: a scatter of thousands of hours looks the same with a few hundred
 * evenly chosen ones, and the page then loads in a fraction of the bytes. Pure; no I/O.
 */

/**
 * At most `max` items of a list, evenly spread over it (every k-th, first and last kept), in order.
 * A list no longer than `max` comes back as it is.
 */
export function thinEvenly<T>(items: readonly T[], max: number): T[] {
  if (items.length <= max) return [...items];
  if (max <= 1) return items.slice(0, Math.max(0, max));
  const out: T[] = [];
  const step = (items.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) out.push(items[Math.round(i * step)]!);
  return out;
}
