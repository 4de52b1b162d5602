import { Caution } from '../Caution';
import { HourBalance, HourFootnote, HourReasons } from './HourBalance';
import { HourContributors, HourInputs, HourPorts, HourTagHours, HourTerms } from './HourTables';
import { useHourDetail } from './useHourDetail';
import type { UnitInfo } from '~/lib/views/unit-hour';
import { siteWriter } from '~/lib/units/writer';

/**
 * One hour opened up: every port's state, every term, F P L D, uncertainty, reasons, the tag hours and
 * links used. Shown inside ./HourPanel.tsx, which carries the title, the link and the close button.
 * The sections are ./HourBalance.tsx and ./HourTables.tsx; their words come from
 * src/lib/views/hour-audit-text.ts.
 */
export function HourDetail({ unit, hourStart }: { unit: UnitInfo; hourStart: string }) {
  const { hour, error } = useHourDetail(unit.id, hourStart);
  const w = siteWriter(unit.display?.units, unit.display?.p_atm_Pa);

  if (error) return <p className="notice-error">{error}</p>;
  if (!hour) return <p className="text-sm text-ink-soft">Opening the hour…</p>;
  const d = hour.detail;

  return (
    <div className="space-y-5" data-testid="hour-figures">
      <Caution className="caution" />
      <HourReasons hour={hour} />
      {d?.balance && <HourBalance hour={hour} b={d.balance} cost={d.cost} currency={unit.currency} w={w} />}
      {d && d.ports.length > 0 && <HourPorts d={d} w={w} />}
      {d && d.terms.length > 0 && <HourTerms terms={d.terms} w={w} />}
      {d?.uncertainty && <HourContributors uncertainty={d.uncertainty} w={w} />}
      {d && d.tagHours.length > 0 && <HourTagHours tagHours={d.tagHours} timeZone={unit.timeZone} />}
      {d && d.inputs.length > 0 && <HourInputs inputs={d.inputs} w={w} />}
      <HourFootnote hour={hour} unit={unit} w={w} />
    </div>
  );
}
