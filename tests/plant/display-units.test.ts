import { expect, it } from 'vitest';
import { createSite, siteOverview, updateSite, type SiteInput } from '~/server/services/plant';
import { siteDisplay } from '~/server/services/display-units';
import { DEFAULT_DISPLAY_UNITS } from '~/lib/units/display';
import { describeIntegration } from '../support/integration';
import { uniqueName } from './support';
import { SiteInput as SiteInputSchema } from '~/lib/plant/inputs';

const SiteInputParse = (v: unknown) => SiteInputSchema.safeParse(v);

const base = (name: string): SiteInput => ({ name, timeZone: 'Europe/London', T0_K: 298.15, p0_Pa: 101325, currency: 'GBP', prices: [] });

describeIntegration("a site's display units", () => {
  it('self-consistency: follow the defaults until an admin chooses, keep the choice through other changes, and go back on null', async () => {
    const site = await createSite(base(uniqueName('Display plant')));
    expect(await siteDisplay(site.id)).toMatchObject({ units: DEFAULT_DISPLAY_UNITS, chosen: false, currency: 'GBP' });
    await updateSite(site.id, { ...base(site.name), displayUnits: { power: 'MW', pressure: 'kPa', locale: 'de-DE' } });
    const chosen = await siteDisplay(site.id);
    expect(chosen.chosen).toBe(true);
    expect(chosen.units).toMatchObject({ power: 'MW', pressure: 'kPa', massFlow: 't/h', temperature: 'degC', locale: 'de-DE' });
    // A save that leaves display units out keeps them (clients of the older shape).
    await updateSite(site.id, { ...base(site.name), currency: 'EUR' });
    expect((await siteDisplay(site.id)).units.power).toBe('MW');
    expect((await siteOverview(site.id)).display.units.locale).toBe('de-DE');
    await updateSite(site.id, { ...base(site.name), displayUnits: null });
    expect(await siteDisplay(site.id)).toMatchObject({ units: DEFAULT_DISPLAY_UNITS, chosen: false });
  });

  it('refuses a unit that is not one of the choices, with its path', () => {
    const r = SiteInputParse({ ...base('X'), displayUnits: { power: 'hp' } });
    expect(r.success).toBe(false);
  });
});
