import { describe, expect, it } from 'vitest';
import { SiteSettingsFormSchema, readSI, showSI, siteSettingsPatch, siteSettingsValues } from '~/lib/plant/site-settings-form';
import { SiteInput } from '~/lib/plant/inputs';
import type { SiteModel } from '~/lib/plant/model';
import { DEFAULT_DISPLAY_UNITS } from '~/lib/units/display';
import { expectClose } from '../support/expect-close';

const site: SiteModel = {
  name: 'Harbourside works',
  timeZone: 'Europe/Lisbon',
  elevation_m: 40,
  deadState: { T0_K: 293.15, p0_Pa: 101325, T0Tag: { tag: 'AMB_T', unit: 'degF' } },
  currency: 'EUR',
  prices: [{ name: 'gas', kind: 'fuel', price_per_MWh: 35.5, currency: 'EUR' }],
};

describe('the site settings form', () => {
  it('shows SI figures in kPa and °C (0 °C = 273.15 K, ITS-90; 1 kPa = 1000 Pa, SI brochure)', () => {
    const v = siteSettingsValues(site, { ...DEFAULT_DISPLAY_UNITS, power: 'MW' });
    expect(v).toMatchObject({ name: 'Harbourside works', elevation: '40', pAtm: '', T0: '20', p0: '101.325', t0Tag: 'AMB_T', t0TagUnit: 'degF', duPower: 'MW' });
    expect(v.prices).toEqual([{ name: 'gas', kind: 'fuel', price: '35.5', currency: 'EUR' }]);
    expect(SiteSettingsFormSchema.safeParse(v).success).toBe(true);
  });

  it('self-consistency: the fields of a stored site come back as the same SI figures, and the body passes the server schema', () => {
    const v = siteSettingsValues(site, DEFAULT_DISPLAY_UNITS);
    const body = siteSettingsPatch(v, false);
    expectClose(body.T0_K!, 293.15, { rtol: 1e-12 });
    expectClose(body.p0_Pa!, 101325, { rtol: 1e-12 });
    expect(body).toMatchObject({ elevation_m: 40, p_atm_Pa: null, T0Tag: { tag: 'AMB_T', unit: 'degF' }, displayUnits: DEFAULT_DISPLAY_UNITS });
    expect(body.prices).toEqual(site.prices);
    expect(SiteInput.safeParse(body).success).toBe(true);
  });

  it('takes the atmosphere from the elevation when asked, and sends no ambient tag when its field is empty', () => {
    const v = { ...siteSettingsValues(site, DEFAULT_DISPLAY_UNITS), pAtm: '95', t0Tag: '' };
    expect(siteSettingsPatch(v, true).p_atm_Pa).toBeNull();
    expectClose(siteSettingsPatch(v, false).p_atm_Pa!, 95000, { rtol: 1e-12 });
    expect(siteSettingsPatch(v, false).T0Tag).toBeNull();
  });

  it('refuses a figure out of range, a price without a name and an ambient tag unit that is no temperature, each with its words', () => {
    const v = siteSettingsValues(site, DEFAULT_DISPLAY_UNITS);
    const r = SiteSettingsFormSchema.safeParse({ ...v, T0: '90', prices: [{ name: ' ', kind: 'fuel', price: '1', currency: 'EUR' }], t0TagUnit: 'bar' });
    expect(r.success).toBe(false);
    const messages = Object.fromEntries(r.error!.issues.map((i) => [i.path.join('.'), i.message]));
    expect(messages).toMatchObject({ T0: 'T0 [degC]: a number from -50 to 60.', 'prices.0.name': 'Name the price.' });
    // The tag-unit check runs on an otherwise valid form (zod refines an object only once its fields pass).
    const t = SiteSettingsFormSchema.safeParse({ ...v, t0TagUnit: 'bar' });
    expect(t.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['t0TagUnit', 'A temperature unit (degC, K, degF).']]);
  });

  it('reads a decimal comma, and answers NaN for words and null for nothing', () => {
    expectClose(readSI('1,5', 'kPa', 'pressure')!, 1500, { rtol: 1e-12 });
    expect(readSI('abc', 'kPa', 'pressure')).toBeNaN();
    expect(readSI('  ', 'kPa', 'pressure')).toBeNull();
    expect(showSI(undefined, 'kPa', 'pressure')).toBe('');
  });
});
