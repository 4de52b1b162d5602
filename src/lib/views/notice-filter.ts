/**
 * The notice list's filter: its query (the same parameters GET /api/notices takes, defaults left out)
 * and the sites and units to choose from, from the notices there are. Pure.
 */
export type StatusFilter = 'not-closed' | 'open' | 'acknowledged' | 'closed' | 'all';
export type NoticeSort = 'cost' | 'newest';

export interface ListFilter {
  status: StatusFilter;
  siteId: string;
  unitId: string;
  sort: NoticeSort;
}

/** The filter as a query string; '' for every notice, largest cost first. */
export function noticeQuery(f: ListFilter): string {
  const q = new URLSearchParams();
  if (f.status !== 'all') q.set('status', f.status);
  if (f.siteId) q.set('siteId', f.siteId);
  if (f.unitId) q.set('unitId', f.unitId);
  if (f.sort !== 'cost') q.set('sort', f.sort);
  return q.toString();
}

type Named = { siteId: string; siteName: string; unitId: string; unitName: string };
const byName = (a: [string, string], b: [string, string]) => a[1].localeCompare(b[1]);

/** The sites of the notices, once each, by name: [id, name]. */
export function siteChoices(all: readonly Named[]): [string, string][] {
  return [...new Map(all.map((n) => [n.siteId, n.siteName])).entries()].sort(byName);
}

/** The units of the notices (of one site when `siteId` is given), once each, by name: [id, name]. */
export function unitChoices(all: readonly Named[], siteId: string): [string, string][] {
  return [...new Map(all.filter((n) => !siteId || n.siteId === siteId).map((n) => [n.unitId, n.unitName])).entries()].sort(byName);
}
