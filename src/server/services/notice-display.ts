/**
 * Notices with their site's display units (src/lib/notice-view.ts `display`), for the product's own
 * pages and the notice mails; the API under /api/v1 keeps SI and goes without.
 */
import type { NoticeView } from '~/lib/notice-view';
import type { SiteDisplayUnits } from '~/lib/units/writer';
import { db } from '../db/client';
import { siteDisplay } from './display-units';

type Reader = Parameters<typeof siteDisplay>[1];

/** The display units of each of these sites, looked up once per site. */
export async function displaysOf(siteIds: Iterable<string>, r: Reader = db()): Promise<Map<string, SiteDisplayUnits>> {
  const out = new Map<string, SiteDisplayUnits>();
  for (const id of new Set(siteIds)) {
    const d = await siteDisplay(id, r);
    out.set(id, { units: d.units, p_atm_Pa: d.p_atm_Pa });
  }
  return out;
}

/** The notices, each with its site's display units. */
export async function withDisplay<T extends Pick<NoticeView, 'siteId'>>(views: T[], r: Reader = db()): Promise<(T & { display: SiteDisplayUnits })[]> {
  const d = await displaysOf(views.map((v) => v.siteId), r);
  return views.map((v) => ({ ...v, display: d.get(v.siteId)! }));
}

/** One notice with its site's display units. */
export async function oneWithDisplay<T extends Pick<NoticeView, 'siteId'>>(view: T, r: Reader = db()): Promise<T & { display: SiteDisplayUnits }> {
  return (await withDisplay([view], r))[0]!;
}
