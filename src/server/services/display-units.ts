/**
 * A site's display units as the pages, mails and reports use them: the admin's choices (sites.display_units)
 * over the defaults derived from the units of the site's current tag links (src/lib/units/display.ts).
 */
import { and, eq, isNull } from 'drizzle-orm';
import { LINK_QUANTITIES } from '~/lib/plant/kinds';
import { deriveDisplayUnits, resolveDisplayUnits, type DisplayUnits } from '~/lib/units/display';
import { db } from '../db/client';
import { sites, tagLinks } from '../db/schema';
import { AppError } from '../errors';

type Reader = Pick<ReturnType<typeof db>, 'select'>;

/** What a page needs to write a site's numbers: the display units, the atmosphere for gauge pressure and the currency. */
export interface SiteDisplay {
  units: DisplayUnits;
  /** True when an admin chose them; false when they follow the tags. */
  chosen: boolean;
  p_atm_Pa: number;
  currency: string;
}

/** The display units of a site. */
export async function siteDisplay(siteId: string, r: Reader = db()): Promise<SiteDisplay> {
  const [site] = await r.select({ displayUnits: sites.displayUnits, p_atm_Pa: sites.p_atm_Pa, currency: sites.currency }).from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  const links = await r.select({ quantity: tagLinks.quantity, unit: tagLinks.engUnit }).from(tagLinks).where(and(eq(tagLinks.siteId, siteId), isNull(tagLinks.validTo)));
  const derived = deriveDisplayUnits(links.map((l) => ({ quantity: LINK_QUANTITIES[l.quantity]?.quantity ?? l.quantity, unit: l.unit })));
  const chosen = site.displayUnits !== null && Object.keys(site.displayUnits).length > 0;
  return { units: resolveDisplayUnits(site.displayUnits, derived), chosen, p_atm_Pa: site.p_atm_Pa, currency: site.currency };
}
