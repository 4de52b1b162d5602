import { useState } from 'react';
import { Notice } from '~/components/plant/common';
import BaselineDetail from './BaselineDetail';
import { PeriodFields, TermsFieldset, VersionsSection, type UnitChoice } from './BaselineBuilderParts';
import DriftSettingsForm from './DriftSettingsForm';
import type { BaselineTerm } from './types';
import { useBaselineFit } from './useBaselineFit';
import { spanText } from '~/lib/views/baseline-fit-text';
import { submitTo } from '~/components/ui/Field';

export type { UnitChoice };

/**
 * Pick a unit, a reference period and terms; fit; read the statistics; accept or discard. The parts:
 * ./BaselineBuilderParts.tsx (fields, terms, versions), ./useBaselineFit.ts (reading and fitting).
 */
export default function BaselineBuilder({ units, initialUnitId, initialFrom = null }: { units: UnitChoice[]; initialUnitId: string | null; initialFrom?: string | null }) {
  const [unitId, setUnitId] = useState(initialUnitId && units.some((u) => u.id === initialUnitId) ? initialUnitId : (units[0]?.id ?? ''));
  const unit = units.find((u) => u.id === unitId) ?? null;
  const [terms, setTerms] = useState<BaselineTerm[]>(['load', 'T_amb']);
  const { span, versions, from, setFrom, to, setTo, message, busy, fitted, fit } = useBaselineFit(unit, initialUnitId, initialFrom);

  if (!units.length) {
    return (
      <p className="card text-sm text-ink-faint">
        No units yet. Units come from the <a href="/plant">plant model</a>; a baseline needs the unit's computed hours.
      </p>
    );
  }

  return (
    <div className="space-y-6">
      <form
        className="card space-y-4"
        onSubmit={submitTo(() => void fit(terms))}
        aria-label="Fit a baseline"
      >
        <PeriodFields units={units} unitId={unitId} setUnitId={setUnitId} timeZone={unit?.timeZone ?? null} from={from} setFrom={setFrom} to={to} setTo={setTo} />
        <p className="text-sm text-ink-soft" data-testid="hour-span" role="status">
          {spanText(span, unit?.timeZone ?? 'UTC')}
        </p>
        <TermsFieldset terms={terms} setTerms={setTerms} />
        <Notice message={message} />
        <button type="submit" className="btn btn-primary" disabled={busy || !unit}>
          {busy ? 'Fitting…' : 'Fit baseline'}
        </button>
      </form>

      {fitted && <BaselineDetail key={fitted} baselineId={fitted} canEdit />}

      {unit && <VersionsSection unitName={unit.name} versions={versions} />}
      {unit && <DriftSettingsForm unitId={unit.id} canEdit />}
    </div>
  );
}
