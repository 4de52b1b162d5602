/**
 * The loss ledger island: a site's units ranked by the cost of their exergy destruction over a period
 * of the site's clock, with the site totals and the exergy flow picture of the same period. The data
 * come from useLedger.ts, the ledger's card from LedgerTable.tsx.
 */
import { useState } from 'react';
import { ErrorNote, Loading } from './common';
import { FlowPicture } from './FlowPicture';
import FreshnessNote from './FreshnessNote';
import { LedgerSection } from './LedgerTable';
import { useLedger } from './useLedger';
import { Field, Options } from '~/components/ui/Field';
import { PeriodPicker, periodFromSearch, syncSearch, type PeriodInfo, type PeriodValue } from './PeriodPicker';

type LedgerSite = { id: string; name: string; timeZone: string; currency: string };

/** The site choice and the period picker above the ledger. */
function SiteAndPeriod({ sites, siteId, onSite, value, info, onPeriod }: { sites: LedgerSite[]; siteId: string; onSite: (id: string) => void; value: PeriodValue; info: PeriodInfo | null; onPeriod: (v: PeriodValue) => void }) {
  return (
    <div className="flex flex-wrap items-end gap-4">
      <Field id="ledger-site" label="Site">
        <select id="ledger-site" className="field" value={siteId} onChange={(e) => onSite(e.target.value)}>
          <Options choices={sites.map((s) => [s.id, s.name] as const)} />
        </select>
      </Field>
      <div className="flex-1">
        <PeriodPicker value={value} info={info} onChange={onPeriod} />
      </div>
    </div>
  );
}

export default function LedgerView({ sites, initialSiteId, initialSearch }: { sites: LedgerSite[]; initialSiteId: string | null; initialSearch: string }) {
  const [siteId, setSiteId] = useState<string>(initialSiteId && sites.some((s) => s.id === initialSiteId) ? initialSiteId : (sites[0]?.id ?? ''));
  const [value, setValue] = useState<PeriodValue>(() => periodFromSearch(initialSearch, 'month'));
  const { q, ledger, flow, info } = useLedger(siteId, value);
  const change = (v: PeriodValue) => {
    setValue(v);
    syncSearch({ site: siteId }, v);
  };
  const changeSite = (id: string) => {
    setSiteId(id);
    syncSearch({ site: id }, value);
  };

  if (!sites.length) return <p className="card text-sm text-ink-faint">No site yet. An admin sets up the plant model first.</p>;
  const l = ledger.data;

  return (
    <div className="space-y-4" data-testid="ledger-view">
      <SiteAndPeriod sites={sites} siteId={siteId} onSite={changeSite} value={value} info={info} onPeriod={change} />
      {ledger.error && <ErrorNote text={ledger.error} />}
      {ledger.loading && <Loading what="the ledger" />}
      {l && !ledger.loading && <FreshnessNote freshness={l.freshness} />}
      {l && !ledger.loading && <LedgerSection l={l} q={q} />}
      <section className="card">
        <h2>Exergy flow{flow.data ? `, ${flow.data.period.label}` : ''}</h2>
        {flow.error && <ErrorNote text={flow.error} />}
        {flow.loading && <Loading what="the flow" />}
        {flow.data && !flow.loading && <FlowPicture flow={flow.data} />}
      </section>
    </div>
  );
}
