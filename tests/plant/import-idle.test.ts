/**
 * The normally-idle declaration through import, export and the unit edit (a real database): the
 * round trip keeps it, a file without it clears it, a renamed unit stays named in the declarations
 * that wait for it.
 */
import { expect, it } from 'vitest';
import type { PlantModel } from '~/lib/plant';
import { updateUnit } from '~/server/services/plant';
import { createSiteFromModel, exportModel, importModel } from '~/server/services/plant-model';
import { describeIntegration } from '../support/integration';
import { documentedExample } from './example';
import { uniqueName } from './support';

const prvOf = (m: PlantModel) => m.units.find((u) => u.name === 'PRV 42/9')!;

describeIntegration('normally idle: import, export, edit', () => {
  it('round trip keeps the declaration; an old file without it means not idle', async () => {
    const m = documentedExample();
    m.site.name = uniqueName('Idle round trip');
    prvOf(m).normallyIdle = { when: [{ days: ['sun', 'sat'], from: '00:00', to: '24:00' }], whileRunning: ['TG1'], hours: 6 };
    const { siteId } = await createSiteFromModel(m);
    const out = await exportModel(siteId);
    // days are written in week order
    expect(prvOf(out).normallyIdle).toEqual({ when: [{ days: ['sat', 'sun'], from: '00:00', to: '24:00' }], whileRunning: ['TG1'], hours: 6 });
    await importModel(siteId, JSON.parse(JSON.stringify(out)));
    expect(await exportModel(siteId)).toEqual(out);

    const old = JSON.parse(JSON.stringify(out)) as PlantModel;
    for (const u of old.units) delete u.normallyIdle;
    await importModel(siteId, old);
    const after = await exportModel(siteId);
    expect(after.units.some((u) => 'normallyIdle' in u)).toBe(false);
    expect(after).toEqual(old);
  });

  it('the unit edit sets and clears it, checks the names, and follows a renamed unit', async () => {
    const m = documentedExample();
    m.site.name = uniqueName('Idle edit');
    delete prvOf(m).normallyIdle;
    const { siteId } = await createSiteFromModel(m);
    const ids = new Map((await import('~/server/services/plant').then((x) => x.siteOverview(siteId))).units.map((u) => [u.name, u.id]));
    const prvId = ids.get('PRV 42/9')!;
    const bad = await updateUnit(siteId, prvId, { normallyIdle: { when: 'always', whileRunning: ['TG7'] } }).catch((e) => e);
    expect(bad.code).toBe('VALIDATION_FAILED');
    expect(bad.issues[0].path).toBe('$.normallyIdle.whileRunning[0]');
    await updateUnit(siteId, prvId, { normallyIdle: { when: 'always', whileRunning: ['TG1'] } });
    await updateUnit(siteId, ids.get('TG1')!, { name: 'TG1 (rebuilt)' });
    expect(prvOf(await exportModel(siteId)).normallyIdle).toEqual({ when: 'always', whileRunning: ['TG1 (rebuilt)'] });
    await updateUnit(siteId, prvId, { normallyIdle: null });
    expect('normallyIdle' in prvOf(await exportModel(siteId))).toBe(false);
  });
});
