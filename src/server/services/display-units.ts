/**
 * A site's display units as the pages, mails and reports use them: the admin's choices (sites.display_units)
 * over the defaults derived from the units of the site's current tag links (src/lib/units/display.ts).
 * Read outside a transaction, they are kept in the web process's read cache (src/server/hours-cache.ts),
 * which the database empties at the commit of any change to sites or tag links (migration
 * web-display-cache): the overview and the unit pages then cost no display query.
 */
import { and, eq, isNull } from 'drizzle-orm';
import { LINK_QUANTITIES } from '~/lib/plant/kinds';
import { deriveDisplayUnits, resolveDisplayUnits, type DisplayUnits } from '~/lib/units/display';
import { db } from '../db/client';
import { sites, tagLinks } from '../db/schema';
import { AppError } from '../errors';
import { cachedHours } from '../hours-cache';

type Reader = Pick<ReturnType<typeof db>, 'select'>;

/** What a page needs to write a site's numbers: the display units, the atmosphere for gauge pressure and the currency. */
export interface SiteDisplay {
  units: DisplayUnits;
  /** True when an admin chose them; false when they follow the tags. */
  chosen: boolean;
  p_atm_Pa: number;
  currency: string;
}

/**
 * The display units of a site. Without a reader, from the read cache when nothing about sites or tag
 * links has changed since they were read (a copy: callers may change it); with one (a transaction),
 * always read through it.
 */
export async function siteDisplay(siteId: string, r?: Reader): Promise<SiteDisplay> {
  if (r) return readSiteDisplay(siteId, r);
  const kept = await cachedHours(`site-display:${siteId}`, () => readSiteDisplay(siteId, db()));
  return { ...kept, units: { ...kept.units } };
}

async function readSiteDisplay(siteId: string, r: Reader): Promise<SiteDisplay> {
  const [site] = await r.select({ displayUnits: sites.displayUnits, p_atm_Pa: sites.p_atm_Pa, currency: sites.currency }).from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  const links = await r.select({ quantity: tagLinks.quantity, unit: tagLinks.engUnit }).from(tagLinks).where(and(eq(tagLinks.siteId, siteId), isNull(tagLinks.validTo)));
  const derived = deriveDisplayUnits(links.map((l) => ({ quantity: LINK_QUANTITIES[l.quantity]?.quantity ?? l.quantity, unit: l.unit })));
  const chosen = site.displayUnits !== null && Object.keys(site.displayUnits).length > 0;
  return { units: resolveDisplayUnits(site.displayUnits, derived), chosen, p_atm_Pa: site.p_atm_Pa, currency: site.currency };
}
