import { useCallback, useEffect, useState } from 'react';
import { call } from '~/components/api';
import type { UnitHourView } from '~/lib/views/unit-hour';
import { unitHoursUrl } from '~/lib/views/unit-hours-range';

/**
 * A unit's hours over a range (GET /api/v1/units/{unitId}/hours): null while they are read, the
 * error's words, and `load` to read them again. Read whenever the range changes.
 */
export function useUnitHours(unitId: string, range: () => { from: string; to: string }) {
  const [rows, setRows] = useState<UnitHourView[] | null>(null);
  const [error, setError] = useState<string | null>(null);

  const load = useCallback(async () => {
    setRows(null);
    setError(null);
    const r = range();
    if (!(r.to > r.from)) return setError('The last day must not be before the first.');
    const data = await call<{ hours: UnitHourView[] }>(unitHoursUrl(unitId, r)).catch((e: Error) => e);
    if (data instanceof Error) return setError(data.message);
    setRows(data.hours);
  }, [range, unitId]);

  useEffect(() => {
    void load();
  }, [load]);

  return { rows, error, load };
}
