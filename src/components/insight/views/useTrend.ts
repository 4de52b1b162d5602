/**
 * The trend island's data: the chosen period (from the page's address, kept in step with it), the
 * unit's trend for it from /api/units/:id/trend, and what the server answered for the period.
 */
import { useEffect, useState } from 'react';
import { useApi } from '~/components/api';
import type { TrendAnswer } from '~/lib/views/trend';
import { periodFromSearch, periodQuery, syncSearch, type PeriodInfo, type PeriodValue } from './PeriodPicker';

export function useTrend(unitId: string, initialSearch: string) {
  const [value, setValue] = useState<PeriodValue>(() => periodFromSearch(initialSearch, 'week'));
  const url = `/api/units/${unitId}/trend?${periodQuery(value)}`;
  const { data, error, loading } = useApi<TrendAnswer>(url);
  const [info, setInfo] = useState<PeriodInfo | null>(null);
  useEffect(() => {
    if (data) setInfo({ ...data.period, timeZone: data.site.timeZone, opened: data.opened });
  }, [data]);
  const change = (v: PeriodValue) => {
    setValue(v);
    syncSearch({}, v);
  };
  return { value, change, info, data, error, loading };
}
