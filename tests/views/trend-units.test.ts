/**
 * The trend's power unit is the site's chosen display unit (src/components/insight/views/format.ts
 * `sitePowerUnit`, `load`, `loadAxis` with the site's writer), never one picked by the size of the
 * figures. Factors: NIST SP 811 (2008) Appendix B.8 (1 kW = 10³ W, 1 MW = 10⁶ W). Grouping: CLDR as
 * shipped in Node's Intl (en-GB ',' and de-DE '.').
 */
import { describe, expect, it } from 'vitest';
import { load, loadAxis, sitePowerUnit } from '~/components/insight/views/format';
import { DEFAULT_DISPLAY_UNITS } from '~/lib/units/display';
import { siteWriter } from '~/lib/units/writer';

describe("trend figures in the site's power unit", () => {
  it('a site in kW keeps kW for 20 MW; a site in MW keeps MW for 300 kW', () => {
    const kW = siteWriter({ ...DEFAULT_DISPLAY_UNITS, power: 'kW' });
    expect(sitePowerUnit(kW)).toEqual({ unit: 'kW', factor: 1e3 });
    // 20 000 000 W = 20 000 kW, grouped in en-GB.
    expect(kW.withU(20e6, null, 'power')).toBe('20,000 kW');
    const MW = siteWriter({ ...DEFAULT_DISPLAY_UNITS, power: 'MW', locale: 'de-DE' });
    const pu = sitePowerUnit(MW);
    expect(pu.unit).toBe('MW');
    expect(pu.factor).toBeCloseTo(1e6, 6);
    // 300 000 W = 0.3 MW (de-DE decimal comma).
    expect(load(300_000, 'W', MW)).toMatch(/^0,3\d* MW$/);
    const ax = loadAxis('W', MW);
    expect(ax.label).toBe('Load [MW]');
    expect(ax.scale * 2.5e6).toBeCloseTo(2.5, 12);
  });

  it('a load that is a fraction of rating stays in percent whatever the site writes power in', () => {
    const MW = siteWriter({ ...DEFAULT_DISPLAY_UNITS, power: 'MW' });
    expect(loadAxis('-', MW).label).toBe('Load [% of rating]');
    expect(load(0.5, '-', MW)).toBe('50.0 % of rating');
  });
});
