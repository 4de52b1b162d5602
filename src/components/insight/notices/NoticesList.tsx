import { useEffect, useMemo, useState } from 'react';
import { StateMark } from '~/components/StateMark';
import { Notice as Message } from '~/components/plant/common';
import { call, messageOf, type Message as Msg } from '~/components/api';
import { at, atZ } from '../baselines/looks';
import { LIFE_LOOK, NOTICE_LOOK, TREND_LOOK, noticeFigures, type Notice } from './looks';
import { noticeQuery, siteChoices, unitChoices, type ListFilter, type NoticeSort, type StatusFilter } from '~/lib/views/notice-filter';
import { GridTable, num } from '~/components/ui/GridTable';

export type { ListFilter };

const STATUS_WORDS: Record<StatusFilter, string> = { 'not-closed': 'open and seen', open: 'open', acknowledged: 'seen', closed: 'closed', all: 'all, closed included' };
const STATUS_CHOICES = Object.entries(STATUS_WORDS) as [StatusFilter, string][];
const SORT_CHOICES: [NoticeSort, string][] = [
  ['cost', 'largest cost per day now first'],
  ['newest', 'newest first'],
];

/** One filter of the list: a labelled choice of [value, words]. */
function FilterSelect(p: { label: string; testId: string; value: string; choices: readonly (readonly [string, string])[]; onChange: (v: string) => void }) {
  return (
    <label className="flex flex-col gap-1">
      <span className="label">{p.label}</span>
      <select className="field" value={p.value} onChange={(e) => p.onChange(e.target.value)} data-testid={p.testId}>
        {p.choices.map(([v, words]) => (
          <option key={v} value={v}>
            {words}
          </option>
        ))}
      </select>
    </label>
  );
}

/**
 * Every notice (newest first, for the choices of site and unit) and those the filter lets through
 * (null while read); the filter goes into the page's address.
 */
function useNotices(f: ListFilter) {
  const [notices, setNotices] = useState<Notice[] | null>(null);
  const [all, setAll] = useState<Notice[]>([]);
  const [message, setMessage] = useState<Msg>(null);

  useEffect(() => {
    call<{ notices: Notice[] }>('/api/notices?sort=newest')
      .then((d) => setAll(d.notices))
      .catch(() => undefined);
  }, []);

  useEffect(() => {
    let live = true;
    setNotices(null);
    const q = noticeQuery(f);
    if (typeof window !== 'undefined') window.history.replaceState(null, '', `${window.location.pathname}${q ? `?${q}` : '?status=all'}`);
    call<{ notices: Notice[] }>(`/api/notices${q ? `?${q}` : ''}`)
      .then((d) => live && setNotices(d.notices))
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [f]);

  return { notices, all, message };
}

/** One notice's row: status, kind, unit, site, onset, the figure now, cost per day, shift and whether beyond uncertainty. */
function NoticeRow({ n }: { n: Notice }) {
  const look = NOTICE_LOOK[n.status]!;
  const fig = noticeFigures(n);
  const life = n.life === 'live' && n.trend ? TREND_LOOK[n.trend] : LIFE_LOOK[n.life];
  return (
    <tr data-testid={`notice-${n.unitName}`}>
      <td>
        <StateMark shape={look.shape} className={look.className} label={look.label} />
      </td>
      <td>{n.kindWord}</td>
      <td>
        <a href={`/notices/${n.id}`}>{n.unitName}</a>
      </td>
      <td>{n.siteName}</td>
      <td>
        {at(n.onsetHour, n.timeZone)} <span className="text-xs text-ink-faint">{n.timeZone}</span>
      </td>
      <td className="num text-copper-deep">
        {n.kind === 'drift' ? `${fig.parts(n.headline_W, n.headlineU_W)[0]} ${fig.unit}` : fig.power(n.headline_W)}{' '}
        <span className="text-xs text-ink-faint">{n.kind === 'drift' && n.headlineU_W !== null ? `${fig.parts(n.headline_W, n.headlineU_W)[1]} ${fig.unit}` : ''}</span>
      </td>
      <td className="num">{n.headlineCost_per_day === null ? '–' : `${n.currency} ${fig.money(n.headlineCost_per_day)}`}</td>
      <td>
        <StateMark shape={life.shape} className={life.className} label={n.life === 'faded' && n.fadedSince ? `faded since ${atZ(n.fadedSince, n.timeZone)}` : life.label} />
      </td>
      <td>{n.kind !== 'drift' ? '–' : n.headlineExceeds === null ? 'not known' : n.headlineExceeds ? 'yes' : 'no'}</td>
    </tr>
  );
}

/** The notices, one row each. */
function NoticeTable({ notices }: { notices: Notice[] }) {
  return (
    <div className="overflow-x-auto">
      <GridTable testId="notice-list" columns={['Status', 'Kind', 'Unit', 'Site', 'Since', num('Extra destruction now (drift) or destruction'), num('Cost per day now (last 24 steady hours)'), 'Shift', 'Beyond uncertainty']}>
        {notices.map((n) => (
          <NoticeRow key={n.id} n={n} />
        ))}
      </GridTable>
    </div>
  );
}

/**
 * Drift notices, those not closed first and the largest current cost per day first; filters by
 * status, site and unit (kept in the page's address, the same query parameters the API takes).
 */
export default function NoticesList({ initial }: { initial?: Partial<ListFilter> }) {
  const [f, setF] = useState<ListFilter>({ status: 'not-closed', siteId: '', unitId: '', sort: 'cost', ...initial });
  const { notices, all, message } = useNotices(f);
  const sites = useMemo(() => siteChoices(all), [all]);
  const units = useMemo(() => unitChoices(all, f.siteId), [all, f.siteId]);

  return (
    <section className="card">
      <div className="mb-3 flex flex-wrap items-end gap-4 text-sm">
        <FilterSelect label="Status" testId="filter-status" value={f.status} choices={STATUS_CHOICES} onChange={(v) => setF({ ...f, status: v as StatusFilter })} />
        <FilterSelect label="Site" testId="filter-site" value={f.siteId} choices={[['', 'every site'], ...sites]} onChange={(v) => setF({ ...f, siteId: v, unitId: '' })} />
        <FilterSelect label="Unit" testId="filter-unit" value={f.unitId} choices={[['', 'every unit'], ...units]} onChange={(v) => setF({ ...f, unitId: v })} />
        <FilterSelect label="Order" testId="filter-sort" value={f.sort} choices={SORT_CHOICES} onChange={(v) => setF({ ...f, sort: v as NoticeSort })} />
      </div>
      <Message message={message} />
      {notices === null ? (
        !message && (
          <p className="text-sm text-ink-faint" role="status">
            Loading notices…
          </p>
        )
      ) : notices.length === 0 ? (
        <p className="text-sm text-ink-faint" data-testid="no-notices">
          {f.status === 'not-closed' && !f.siteId && !f.unitId
            ? 'No open drift notice. Every unit with a baseline is where it is expected to be.'
            : 'No drift notice matches these filters.'}
        </p>
      ) : (
        <NoticeTable notices={notices} />
      )}
    </section>
  );
}
