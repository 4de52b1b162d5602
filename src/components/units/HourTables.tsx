import { fmt } from './format';
import type { HourAudit } from '~/lib/views/unit-hour';
import { deltaText, linkUncertaintyText, linkValidityText, measuresText, ROLE_WORD, sourceText, tagQualityText, valueText } from '~/lib/views/hour-audit-text';
import type { SiteWriter } from '~/lib/units/writer';
import { inputWords } from '~/lib/words';
import { GridTable, num } from '~/components/ui/GridTable';

/** Every port's state and exergy flow, with where its state and flow came from. */
export function HourPorts({ d, w }: { d: HourAudit; w: SiteWriter }) {
  const plan = new Map(d.plan.map((p) => [p.name, p]));
  return (
    <div className="overflow-x-auto">
      <h3 className="mb-1 font-medium">Port states</h3>
      <GridTable testId="hour-ports" columns={['Port', 'Fluid', 'State from', 'Flow from', num(<>Flow [{w.unit('massFlow')}]</>), num(<>p [{w.unit('pressure')}]</>), num(<>T [{w.unit('temperature')}]</>), num('h [kJ/kg]'), num('s [kJ/(kg K)]'), num('x [-]'), num('ψ [kJ/kg]'), num(<>Exergy flow [{w.unit('power')}]</>)]}>
        {d.ports.map((p) => (
          <tr key={p.name}>
            <td>
              {p.name} <span className="text-xs text-ink-faint">({p.direction})</span>
            </td>
            <td>{plan.get(p.name)?.fluid ?? (p.name === 'air' ? 'air (ambient)' : '')}</td>
            <td className="text-xs">{plan.get(p.name)?.state ?? 'at the dead state'}</td>
            <td className="text-xs">{plan.get(p.name)?.flow ?? 'from the combustion balance'}</td>
            <td className="num">{w.value(p.mDot_kg_per_s, 'massFlow', 3)}</td>
            <td className="num">{w.value(p.p_Pa, 'pressure', 3)}</td>
            <td className="num">{w.value(p.T_K, 'temperature', 2)}</td>
            <td className="num">{fmt(p.h_J_per_kg, 2, 1e-3)}</td>
            <td className="num">{fmt(p.s_J_per_kgK, 4, 1e-3)}</td>
            <td className="num">{p.x === null ? '–' : fmt(p.x, 4)}</td>
            <td className="num">{fmt(p.psi_J_per_kg, 2, 1e-3)}</td>
            <td className="num">{w.value(p.exergy_W, 'power')}</td>
          </tr>
        ))}
      </GridTable>
      {d.balanceKind === 'boiler' && (
        <p className="mt-1 text-xs text-ink-soft">The boiler's exergy flows include the chemical exergy of fuel, air and flue gas.</p>
      )}
    </div>
  );
}

/** The terms of F = P + L + D and what each counts as. */
export function HourTerms({ terms, w }: { terms: HourAudit['terms']; w: SiteWriter }) {
  return (
    <div>
      <h3 className="mb-1 font-medium">Terms of the balance (F = P + L + D)</h3>
      <GridTable className="max-w-2xl" testId="hour-terms" columns={['Term', 'Counts as', num(<>Exergy [{w.unit('power')}]</>)]}>
        {terms.map((t, i) => (
          <tr key={i}>
            <td>{t.label}</td>
            <td>{ROLE_WORD[t.role] ?? t.role}</td>
            <td className="num">{w.value(t.exergy_W, 'power')}</td>
          </tr>
        ))}
      </GridTable>
    </div>
  );
}

/** The inputs that weigh most in the variance of the efficiency and of D. */
export function HourContributors({ uncertainty, w }: { uncertainty: NonNullable<HourAudit['uncertainty']>; w: SiteWriter }) {
  return (
    <div>
      <h3 className="mb-1 font-medium">Biggest uncertainty contributors</h3>
      <p className="mb-1 text-xs text-ink-soft">
        {uncertainty.method}; coverage factor k = {uncertainty.k}.
      </p>
      <GridTable className="max-w-3xl" testId="hour-contributors" columns={['Input', 'Tag', num('Standard uncertainty u'), num('Share of the variance of the efficiency [%]'), num('Share of the variance of D [%]')]}>
        {uncertainty.contributors.map((c) => (
          <tr key={c.input}>
            <td>{inputWords(c.input).label}</td>
            <td>{c.tag ?? ''}</td>
            <td className="num">{deltaText(c.u_SI, inputWords(c.input).quantity, w)}</td>
            <td className="num">{fmt(c.share_efficiency, 1, 100)}</td>
            <td className="num">{fmt(c.share_destruction, 1, 100)}</td>
          </tr>
        ))}
      </GridTable>
    </div>
  );
}

/** The tag hours the balance used, their quality, and the links that bound them. */
export function HourTagHours({ tagHours, timeZone }: { tagHours: HourAudit['tagHours']; timeZone: string }) {
  return (
    <div className="overflow-x-auto">
      <h3 className="mb-1 font-medium">Tag hours and links used</h3>
      <GridTable testId="hour-tags" columns={['Tag', 'Measures', 'Unit', num('Mean'), num('Min'), num('Max'), num('Samples'), num('Covered [%]'), 'Quality', 'Link uncertainty', <>Link valid ({timeZone})</>]}>
        {tagHours.map((t) => (
          <tr key={t.tag}>
            <td className="font-mono text-xs">{t.tag}</td>
            <td>{measuresText(t)}</td>
            <td>{t.engUnit ?? ''}</td>
            <td className="num">{fmt(t.hour?.mean ?? null, 3)}</td>
            <td className="num">{fmt(t.hour?.min ?? null, 3)}</td>
            <td className="num">{fmt(t.hour?.max ?? null, 3)}</td>
            <td className="num">{t.hour ? t.hour.samples : '–'}</td>
            <td className="num">{t.hour ? fmt(t.hour.coveredFraction, 0, 100) : '–'}</td>
            <td className="text-xs">{tagQualityText(t.hour)}</td>
            <td className="text-xs">{linkUncertaintyText(t)}</td>
            <td className="text-xs">{linkValidityText(t, timeZone)}</td>
          </tr>
        ))}
      </GridTable>
    </div>
  );
}

/** Every value the balance was given, its uncertainty and where it came from (folded away). */
export function HourInputs({ inputs, w }: { inputs: HourAudit['inputs']; w: SiteWriter }) {
  return (
    <details>
      <summary className="cursor-pointer font-medium">Values the balance was given</summary>
      <GridTable className="mt-2 max-w-4xl" testId="hour-inputs" columns={['Entry', num('Value'), num('Standard uncertainty u'), 'From']}>
        {inputs.map((i) => (
          <tr key={i.name}>
            <td>{inputWords(i.name).label}</td>
            <td className="num">{valueText(i.value, inputWords(i.name).quantity, w)}</td>
            <td className="num">{deltaText(i.u, inputWords(i.name).quantity, w)}</td>
            <td className="text-xs">{sourceText(i.source, w)}</td>
          </tr>
        ))}
      </GridTable>
    </details>
  );
}
