/**
 * The reads of /api/v1 about one site (docs/api.md): the site with its settings in the model file's
 * shape, its units with ids, its notices, the active baseline per unit, its uploads; each list paged
 * by cursor (src/server/paging.ts). They reuse the services the screens use, so a figure is the same
 * on a page and in the API.
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import type { PageQuery } from '~/lib/api/paging';
import type { BaselineItem, BaselinesPage } from '~/lib/api/baselines';
import type { NoticeItem, NoticesPage } from '~/lib/api/notices';
import type { SiteAnswer, UnitItem, UnitsPage } from '~/lib/api/sites';
import type { UploadItem, UploadsPage } from '~/lib/api/uploads';
import type { BaselineSummary } from '~/lib/baseline-view';
import type { NoticeView } from '~/lib/notice-view';
import { isId } from '../access';
import { db } from '../db/client';
import { uploads } from '../db/schema';
import { decodeCursor, pageFromRows, pageOfArray } from '../paging';
import { activeBaseline } from './baselines';
import { listNotices } from './notice-read';
import { getSite, siteOverview } from './plant';
import { uploadView } from './uploads';

/** The site and its settings, named as in the plant model file. */
export async function siteAnswer(siteId: string): Promise<SiteAnswer> {
  const overview = await siteOverview(siteId);
  const site = overview.site;
  return { id: site.id, settings: overview.settings, createdAt: site.createdAt.toISOString(), updatedAt: site.updatedAt.toISOString() };
}

/** The site's units by name, with the ids of the unit, its ports and its current link versions. */
export async function unitsPage(siteId: string, page: PageQuery): Promise<UnitsPage> {
  const { units } = await siteOverview(siteId);
  const items: UnitItem[] = units.map(({ status, ...u }) => ({
    ...u,
    status: {
      complete: status.complete,
      missing: status.missing.map((m) => ({ ...m, quantities: m.quantities && [...m.quantities] })),
      conflicts: status.conflicts.map((c) => ({ ...c, quantities: c.quantities && [...c.quantities] })),
    },
  }));
  return pageOfArray('units', items, page, 2, (u) => [u.name, u.id]);
}

const noticeItem = (n: NoticeView): NoticeItem => ({ ...n, ruleCrossed: n.ruleCrossed && [...n.ruleCrossed] });

/** The site's notices, newest first (by the hour they were opened). */
export async function noticesPage(
  siteId: string,
  filter: { status: 'open' | 'acknowledged' | 'closed' | 'not-closed' | 'all'; unitId?: string },
  page: PageQuery,
): Promise<NoticesPage> {
  await getSite(siteId);
  const all = await listNotices({ siteId, unitId: filter.unitId, status: filter.status === 'all' ? undefined : filter.status, limit: 1_000_000 });
  const out = pageOfArray('notices', all, page, 2, (n) => [-Date.parse(n.openedAt), n.id]);
  return { items: out.items.map(noticeItem), nextCursor: out.nextCursor };
}

const baselineItem = (b: BaselineSummary): BaselineItem => ({ ...b, terms: [...b.terms] });

/** Each unit of the site (by name) with its active baseline and the baseline's fit statistics. */
export async function baselinesPage(siteId: string, page: PageQuery): Promise<BaselinesPage> {
  const { units } = await siteOverview(siteId);
  const list = units.map((u) => ({ unitId: u.id, unitName: u.name, unitKind: u.kind as string }));
  const out = pageOfArray('baselines', list, page, 2, (u) => [u.unitName, u.unitId]);
  const items = await Promise.all(
    out.items.map(async (u) => {
      const active = await activeBaseline(u.unitId);
      return { ...u, active: active && baselineItem(active) };
    }),
  );
  return { items, nextCursor: out.nextCursor };
}

export function uploadItem(u: typeof uploads.$inferSelect): UploadItem {
  const v = uploadView(u);
  return { ...v, summary: v.summary ?? null, createdAt: v.createdAt.toISOString(), finishedAt: v.finishedAt?.toISOString() ?? null };
}

/** The instant as PostgreSQL keeps it (microseconds), for a cursor that neither skips nor repeats. */
const createdText = sql<string>`to_char(${uploads.createdAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

/** The site's uploads, newest first, each with its state and report. */
export async function uploadsPage(siteId: string, filter: { status?: UploadItem['status'] }, page: PageQuery): Promise<UploadsPage> {
  await getSite(siteId);
  const after = decodeCursor(
    'uploads',
    page.cursor,
    2,
    ([at, id]) => typeof at === 'string' && /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{6}Z$/.test(at) && isId(id),
  );
  const rows = await db()
    .select({ row: uploads, at: createdText })
    .from(uploads)
    .where(
      and(
        eq(uploads.siteId, siteId),
        filter.status ? eq(uploads.status, filter.status) : undefined,
        after ? sql`(${uploads.createdAt}, ${uploads.id}) < (${String(after[0])}::timestamptz, ${String(after[1])}::uuid)` : undefined,
      ),
    )
    .orderBy(desc(uploads.createdAt), desc(uploads.id))
    .limit(page.limit + 1);
  const out = pageFromRows('uploads', rows, page.limit, (r) => [r.at, r.row.id]);
  return { items: out.items.map((r) => uploadItem(r.row)), nextCursor: out.nextCursor };
}
