import { useEffect, useState } from 'react';
import { StateMark } from '../../StateMark';
import { Notice as Message, call, messageOf, type Message as Msg } from '../../plant/common';
import { at } from '../baselines/looks';
import { NOTICE_LOOK, money, signedKW, type Notice } from './looks';

/** Drift notices, open first; filter to those not closed or show all. */
export default function NoticesList() {
  const [filter, setFilter] = useState<'not-closed' | 'all'>('not-closed');
  const [notices, setNotices] = useState<Notice[] | null>(null);
  const [message, setMessage] = useState<Msg>(null);

  useEffect(() => {
    let live = true;
    setNotices(null);
    call<{ notices: Notice[] }>(filter === 'all' ? '/api/notices' : '/api/notices?status=not-closed')
      .then((d) => live && setNotices(d.notices))
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [filter]);

  return (
    <section className="card">
      <div className="mb-3 flex flex-wrap items-center gap-4 text-sm">
        <label className="flex items-center gap-1">
          <input type="radio" name="notice-filter" checked={filter === 'not-closed'} onChange={() => setFilter('not-closed')} /> Open and seen
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" name="notice-filter" checked={filter === 'all'} onChange={() => setFilter('all')} /> All, closed included
        </label>
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
          {filter === 'all' ? 'No drift notice has been opened yet.' : 'No open drift notice. Every unit with a baseline is where it is expected to be.'}
        </p>
      ) : (
        <div className="overflow-x-auto">
          <table className="grid-table" data-testid="notice-list">
            <thead>
              <tr>
                <th>Status</th>
                <th>Kind</th>
                <th>Unit</th>
                <th>Site</th>
                <th>Since</th>
                <th className="num">Extra destruction (drift) or destruction [kW]</th>
                <th className="num">Cost per day</th>
                <th>Beyond uncertainty</th>
              </tr>
            </thead>
            <tbody>
              {notices.map((n) => {
                const look = NOTICE_LOOK[n.status]!;
                return (
                  <tr key={n.id} data-testid={`notice-${n.unitName}`}>
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
                    <td className="num text-copper-deep">{n.kind === 'drift' ? signedKW(n.extra_W) : (n.extra_W / 1000).toFixed(1)}</td>
                    <td className="num">{n.extraCost_per_day === null ? '–' : `${n.currency} ${money(n.extraCost_per_day)}`}</td>
                    <td>{n.kind !== 'drift' ? '–' : n.exceedsUncertainty === null ? 'not known' : n.exceedsUncertainty ? 'yes' : 'no'}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
