/**
 * The reading options of one site, built from plain data (its tags, the quantities of its linked
 * tags, its time window and good quality codes): the same options in the worker's main thread (for
 * re-reads of overlapped hours) and in the reader's thread (ingest-thread.ts), which is given only
 * data, never functions.
 */
import { valueLimitsFor } from '~/lib/ingest';
import { isLinkQuantity, unitsQuantityOf } from '~/lib/plant/kinds';
import type { RereadOptions } from './ingest-merge';

/** What a read needs to know of one of the site's tags. */
export interface SiteTagFacts {
  name: string;
  kind: string;
  flatlineLimitSeconds: number;
  validMin: number | null;
  validMax: number | null;
  unitHint: string | null;
}

/** The quantity and unit the plant model gives a linked tag (it knows them better than the file). */
export interface TagLinkFacts {
  name: string;
  quantity: string;
  engUnit: string;
}

export interface SiteReadFacts {
  timeZone: string;
  timeWindow: { minMs: number; maxMs: number };
  goodQualityCodes: string[];
  tags: SiteTagFacts[];
  links: TagLinkFacts[];
}

export function readOptionsOf(facts: SiteReadFacts): RereadOptions {
  const byName = new Map(facts.tags.map((t) => [t.name, t]));
  const linkOf = new Map(facts.links.map((l) => [l.name, l]));
  return {
    timeZone: facts.timeZone,
    timeWindow: facts.timeWindow,
    goodQualityCodes: facts.goodQualityCodes,
    valueLimits: (tag, unit) => {
      const link = linkOf.get(tag);
      if (link && isLinkQuantity(link.quantity)) return valueLimitsFor(link.engUnit, unitsQuantityOf(link.quantity));
      return valueLimitsFor(unit ?? byName.get(tag)?.unitHint ?? null);
    },
    tagOptions: (tag) => {
      const t = byName.get(tag);
      if (!t) return {};
      return {
        kind: t.kind === 'status' ? 'status' : 'analog',
        flatlineLimitSeconds: t.flatlineLimitSeconds,
        validMin: t.validMin ?? undefined,
        validMax: t.validMax ?? undefined,
      };
    },
  };
}
