/**
 * The loss ledger's data (LedgerView.tsx): the ledger and the flow of a site over a period, and the
 * period as the server resolved it for the period picker.
 */
import { useEffect, useState } from 'react';
import { useApi } from '~/components/api';
import type { FlowAnswer, LedgerAnswer } from '~/lib/views/ledger';
import { periodQuery, type PeriodInfo, type PeriodValue } from './PeriodPicker';

export function useLedger(siteId: string, value: PeriodValue) {
  const q = periodQuery(value);
  const ledger = useApi<LedgerAnswer>(siteId ? `/api/sites/${siteId}/ledger?${q}` : null);
  const flow = useApi<FlowAnswer>(siteId ? `/api/sites/${siteId}/flow?${q}` : null);
  const [info, setInfo] = useState<PeriodInfo | null>(null);
  useEffect(() => {
    if (ledger.data) setInfo({ ...ledger.data.period, timeZone: ledger.data.site.timeZone, opened: ledger.data.opened });
  }, [ledger.data]);
  return { q, ledger, flow, info };
}
