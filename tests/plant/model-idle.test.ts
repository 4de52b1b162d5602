/**
 * The normally-idle declaration in the model file (src/lib/plant/idle.ts, docs/plant-model.md):
 * accepted with its defaults, files without it still load (not idle), mistakes named by their path.
 */
import { describe, expect, it } from 'vitest';
import { checkModel, type PlantModel } from '~/lib/plant/model';
import { documentedExample } from './example';

const prvOf = (m: PlantModel) => m.units.find((u) => u.name === 'PRV 42/9')!;

describe('normally idle in the model file', () => {
  it('the documented example declares its let-down valve idle while TG1 runs; the other units are not idle', () => {
    const c = checkModel(documentedExample());
    expect(c.ok).toBe(true);
    if (!c.ok) return;
    expect(prvOf(c.model).normallyIdle).toEqual({ when: 'always', whileRunning: ['TG1'] });
    expect(c.model.units.filter((u) => u.normallyIdle).map((u) => u.name)).toEqual(['PRV 42/9']);
  });

  it('a file written before the field loads unchanged and means "not idle"', () => {
    const old = documentedExample();
    delete prvOf(old).normallyIdle;
    const c = checkModel(old);
    expect(c.ok).toBe(true);
    if (c.ok) expect(c.model.units.every((u) => u.normallyIdle === undefined)).toBe(true);
  });

  it('windows take their defaults (every day, 00:00 to 24:00)', () => {
    const m = documentedExample();
    prvOf(m).normallyIdle = { when: [{ days: ['sat', 'sun'] }, { from: '22:00', to: '06:00' }], hours: 5 } as never;
    const c = checkModel(m);
    expect(c.ok).toBe(true);
    if (c.ok) expect(prvOf(c.model).normallyIdle).toEqual({ when: [{ days: ['sat', 'sun'], from: '00:00', to: '24:00' }, { from: '22:00', to: '06:00' }], hours: 5 });
  });

  it('names each mistake by its JSON path', () => {
    const m = documentedExample();
    prvOf(m).normallyIdle = { when: [{ from: '22:30' }], whileRunning: ['TG9', 'PRV 42/9'], colour: 'red' } as never;
    const c = checkModel(m);
    expect(c.ok).toBe(false);
    const paths = c.issues.map((i) => i.path);
    expect(paths).toContain('$.units[2].normallyIdle.when[0].from');
    expect(paths).toContain('$.units[2].normallyIdle.colour');
    const m2 = documentedExample();
    prvOf(m2).normallyIdle = { when: 'always', whileRunning: ['TG9', 'PRV 42/9'] };
    const c2 = checkModel(m2);
    expect(c2.ok).toBe(false);
    expect(c2.issues).toEqual([
      { path: '$.units[2].normallyIdle.whileRunning[0]', message: "No unit named 'TG9' at this site." },
      { path: '$.units[2].normallyIdle.whileRunning[1]', message: 'A unit cannot be idle only while it runs itself; name another unit.' },
    ]);
  });
});
