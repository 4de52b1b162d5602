/**
 * Rendered HTML kept in the web process's read cache (src/server/hours-cache.ts): the overview's site
 * sections (src/components/KeptHtml.astro), so that 50 people asking for the overview cost one
 * rendering of each site's table, not 50.
 *
 * `generation` is hoursGeneration() read before the figures the HTML is drawn from: a change
 * notified after that moves the generation on, so HTML drawn from older figures is never found again
 * (and the notification empties the cache anyway). `key` names everything else the HTML shows that
 * the read cache does not hear (what the person's role adds, words that move with the clock). While
 * the cache is not listening, `render` runs every time.
 */
import { cachedHours } from './hours-cache';

export function keptHtml(key: string, generation: number, render: () => Promise<string>): Promise<string> {
  return cachedHours(`html:${generation}:${key}`, render);
}
