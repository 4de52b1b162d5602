import { significant } from '~/lib/format';
import { displayScale, type DisplayUnits } from '~/lib/units/display';
import { coefficientsInDisplay, type Coefficients } from '~/lib/units/baseline-units';
import { siteWriter } from '~/lib/units/writer';
import { BASELINE_TERM_WORDS } from '~/lib/words';
import type { BaselineSummary } from './types';
import { GridTable, num } from '~/components/ui/GridTable';

export interface SiteDisplayProp {
  units: DisplayUnits;
  p_atm_Pa: number;
}

/** The scales a baseline is shown in: load (power or mass flow), T_amb and the results, in the site's units. */
export function baselineScales(b: BaselineSummary, display?: SiteDisplayProp) {
  const w = siteWriter(display?.units, display?.p_atm_Pa);
  const loadQ = b.loadUnit === 'kg/s' ? 'massFlow' : 'power';
  const load = displayScale(loadQ, w.units);
  const T = displayScale('temperature', w.units);
  const power = displayScale('power', w.units);
  return { w, loadQ, load, T, power } as const;
}

/**
 * The fitted coefficients in the site's units: destruction in its power unit and efficiency in %, per
 * unit of load and of ambient temperature as the site shows them (src/lib/units/baseline-units.ts).
 */
export function BaselineCoefficients({ b, display }: { b: BaselineSummary; display?: SiteDisplayProp }) {
  const { w, load, T, power } = baselineScales(b, display);
  const dest = coefficientsInDisplay(b.destruction.coefficients as Coefficients, load.factor, T.offset, power.factor);
  const eff = b.efficiency ? coefficientsInDisplay(b.efficiency.coefficients as Coefficients, load.factor, T.offset, 100) : null;
  const per: Record<string, string> = {
    intercept: '',
    load: ` per ${load.unit}`,
    T_amb: ` per ${T.unit === 'K' ? 'K' : '°C'}`,
    'load^2': ` per (${load.unit})²`,
    'T_amb^2': ` per (${T.unit === 'K' ? 'K' : '°C'})²`,
    'load*T_amb': ` per ${load.unit} and ${T.unit === 'K' ? 'K' : '°C'}`,
  };
  const terms = (['intercept', 'load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'] as const).filter((t) => dest[t] !== undefined || (eff && eff[t] !== undefined));
  return (
    <GridTable
      className="mt-3 text-xs"
      testId="fit-coefficients"
      caption={<>Load in {load.unit}, ambient temperature (the hour's T0) in {T.unit}; three significant figures.</>}
      columns={['Term', num(<>Destruction [{power.unit}]</>), num('Efficiency [%]')]}
    >
        {terms.map((t) => (
          <tr key={t}>
            <td>
              {BASELINE_TERM_WORDS[t].label}
              <span className="text-ink-faint">{per[t]}</span>
            </td>
            <td className="num">{significant(dest[t], 3, { ...w.style, none: '–' })}</td>
            <td className="num">{eff ? significant(eff[t], 3, { ...w.style, none: '–' }) : '–'}</td>
          </tr>
        ))}
    </GridTable>
  );
}
