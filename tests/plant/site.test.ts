import { expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { writeTagHours } from '~/server/services/tag-hours';
import { createSite, getSite, siteModel, updateSite, type SiteInput } from '~/server/services/plant';
import { AppError } from '~/server/errors';
import { describeIntegration } from '../support/integration';
import { expectClose } from '../support/expect-close';
import { addTags, recomputeJobs, tagSeq, uniqueName } from './support';

const base = (name: string): SiteInput => ({ name, timeZone: 'America/Denver', T0_K: 298.15, p0_Pa: 101325, currency: 'USD', prices: [] });

describeIntegration('site settings', () => {
  it('stores the atmosphere from the elevation when no pressure is given, and keeps a given pressure', async () => {
    const site = await createSite({ ...base(uniqueName('Mile-high plant')), elevation_m: 1000 });
    // U.S. Standard Atmosphere 1976, Table I, 1000 m geopotential: 8.9875E+04 Pa (from memory).
    expectClose(site.p_atm_Pa, 8.9875e4, { rtol: 1e-4 });
    const again = await updateSite(site.id, { ...base(site.name), elevation_m: 1000, p_atm_Pa: 88500 });
    expect(again.p_atm_Pa).toBe(88500);
    const plain = await createSite(base(uniqueName('Sea-level plant')));
    expect(plain.p_atm_Pa).toBe(101325);
  });

  it('takes T0 from an ambient tag with a fallback, and refuses a tag unit that is not a temperature with its path', async () => {
    const site = await createSite(base(uniqueName('Ambient plant')));
    await updateSite(site.id, { ...base(site.name), T0_K: 288.15, T0Tag: { tag: 'AMB_T', unit: 'degF' } });
    const { model } = await siteModel(db(), site.id);
    expect(model.site.deadState).toEqual({ T0_K: 288.15, p0_Pa: 101325, T0Tag: { tag: 'AMB_T', unit: 'degF' } });
    const err = await updateSite(site.id, { ...base(site.name), T0Tag: { tag: 'AMB_T', unit: 'psi' } }).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.issues).toEqual([{ path: '$.T0Tag.unit', message: "'psi' is not a temperature unit." }]);
    expect((await getSite(site.id)).t0TagUnit).toBe('degF');
  });

  it('a changed dead state recomputes every hour with data at the site, for all units; prices alone do not', async () => {
    const site = await createSite(base(uniqueName('Dead state plant')));
    const ids = await addTags(site.id, [{ name: 'X1' }]);
    const x1 = await tagSeq(site.id, 'X1');
    const none = { mean: null, min: null, max: null, std: null, samples: 60, coveredFraction: 1 };
    await writeTagHours([
      { tagId: x1, hourStart: new Date('2024-02-01T10:00:00Z'), ...none },
      { tagId: x1, hourStart: new Date('2024-02-03T07:00:00Z'), ...none },
    ]);
    await updateSite(site.id, { ...base(site.name), prices: [{ name: 'grid', kind: 'electricity', price_per_MWh: 70, currency: 'USD' }] });
    expect(await recomputeJobs(site.id)).toEqual([]);
    await updateSite(site.id, { ...base(site.name), T0_K: 293.15 });
    expect(await recomputeJobs(site.id)).toEqual([{ siteId: site.id, fromMs: Date.parse('2024-02-01T10:00:00Z'), toMs: Date.parse('2024-02-03T08:00:00Z') }]);
  });

  it('refuses a second site of the same name', async () => {
    const name = uniqueName('Twin');
    await createSite(base(name));
    const err = await createSite(base(name)).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe('CONFLICT');
  });
});
