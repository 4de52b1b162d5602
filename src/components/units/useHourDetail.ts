import { useEffect, useState } from 'react';
import { call } from '~/components/api';
import type { UnitHourDetailView } from '~/lib/views/unit-hour';

/**
 * One hour of a unit with its audit trail (GET /api/v1/units/{unitId}/hours/{hour}): null while it is
 * read (again from nothing whenever the hour changes), or the error's words.
 */
export function useHourDetail(unitId: string, hourStart: string): { hour: UnitHourDetailView | null; error: string | null } {
  const [hour, setHour] = useState<UnitHourDetailView | null>(null);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    let live = true;
    setHour(null);
    setError(null);
    void (async () => {
      const data = await call<{ hour: UnitHourDetailView }>(`/api/v1/units/${unitId}/hours/${encodeURIComponent(hourStart)}`).catch((e: Error) => e);
      if (!live) return;
      if (data instanceof Error) setError(data.message);
      else setHour(data.hour);
    })();
    return () => {
      live = false;
    };
  }, [unitId, hourStart]);

  return { hour, error };
}
