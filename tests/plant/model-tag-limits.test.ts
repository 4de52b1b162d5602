/**
 * Tags' own limits in the model file (`tags[]`, src/lib/plant/tag-limits.ts, docs/plant-model.md):
 * the documented example carries them, files without the section load unchanged, mistakes are named
 * by their JSON path in words, and a stored tag turns back into the same entry.
 */
import { describe, expect, it } from 'vitest';
import { checkModel, type PlantModel } from '~/lib/plant/model';
import { DEFAULT_FROZEN_LIMIT_s, storedLimitsOf, tagLimitsEntry } from '~/lib/plant/tag-limits';
import { tags } from '~/server/db/ingest-schema';
import { documentedExample } from './example';

const issuesOf = (m: unknown) => {
  const c = checkModel(m);
  return c.ok ? [] : c.issues;
};

describe('tags[] in the model file', () => {
  it('the documented example gives three tags their own limits and is a valid file', () => {
    const c = checkModel(documentedExample());
    expect(c.ok).toBe(true);
    if (!c.ok) return;
    expect(c.model.tags).toEqual([
      { name: 'B2_STACK_O2', spreadLimit: 0.01 },
      { name: 'PRV_F', frozenLimit_s: 172800 },
      { name: 'TG1_MW', minCoverage: 0.9 },
    ]);
  });

  it('a file written before the section loads unchanged: no tags key, every tag at its defaults', () => {
    const old = documentedExample() as PlantModel;
    delete old.tags;
    const c = checkModel(old);
    expect(c.ok).toBe(true);
    if (c.ok) expect('tags' in c.model).toBe(false);
  });

  it('the ambient-temperature tag may carry a frozen-value limit', () => {
    const m = documentedExample();
    m.tags = [{ name: 'SITE_AMB_T', frozenLimit_s: 43200 }];
    expect(issuesOf(m)).toEqual([]);
  });

  it('rejects a tag the file does not link, naming it and where it is', () => {
    const m = documentedExample();
    m.tags = [{ name: 'TG1_MW' }, { name: 'TG1_MWW', spreadLimit: 0.02 }];
    expect(issuesOf(m)).toEqual([
      {
        path: '$.tags[1].name',
        message: "No link of this file names the tag 'TG1_MWW' (nor site.deadState.T0Tag): a tag's limits are given for a tag the file links. Check the spelling.",
      },
    ]);
  });

  it('rejects a tag listed twice', () => {
    const m = documentedExample();
    m.tags = [{ name: 'PRV_F', frozenLimit_s: 7200 }, { name: 'PRV_F', spreadLimit: 0.1 }];
    expect(issuesOf(m)).toEqual([{ path: '$.tags[1].name', message: "Tag 'PRV_F' is listed twice in tags; give its limits once." }]);
  });

  it('names each limit out of its range, of the wrong type, or a field it does not know', () => {
    const m = documentedExample() as unknown as { tags: Record<string, unknown>[] };
    m.tags = [
      { name: 'PRV_F', frozenLimit_s: 10 },
      { name: 'TG1_MW', frozenLimit_s: 3600.5 },
      { name: 'B2_MS_F', spreadLimit: 1.5 },
      { name: 'B2_MS_P', minCoverage: -0.1 },
      { name: 'B2_MS_T', spreadLimit: '5 %' },
      { name: 'B2_FW_F', frozenLimit: 7200 },
    ];
    expect(issuesOf(m)).toEqual([
      { path: '$.tags[0].frozenLimit_s', message: 'The frozen-value limit frozenLimit_s must be at least 60 seconds.' },
      { path: '$.tags[1].frozenLimit_s', message: 'The frozen-value limit frozenLimit_s is a whole number of seconds.' },
      { path: '$.tags[2].spreadLimit', message: 'The tag’s spread limit spreadLimit is at most 1 (0.05 for 5 %).' },
      { path: '$.tags[3].minCoverage', message: 'The tag’s least coverage of the hour minCoverage cannot be negative.' },
      { path: '$.tags[4].spreadLimit', message: 'The tag’s spread limit spreadLimit is a number from 0 to 1 (0.05 for 5 %).' },
      { path: '$.tags[5].frozenLimit', message: "Unknown field 'frozenLimit'." },
    ]);
  });

  it('a stored tag turns into its file entry and back; a tag at every default has no entry', () => {
    for (const entry of [{ name: 'PRV_F', frozenLimit_s: 172800 }, { name: 'X', spreadLimit: 0, minCoverage: 1 }, { name: 'Y', frozenLimit_s: 60, spreadLimit: 0.2 }]) {
      expect(tagLimitsEntry({ name: entry.name, ...storedLimitsOf(entry) })).toEqual(entry);
    }
    expect(storedLimitsOf(undefined)).toEqual({ flatlineLimitSeconds: DEFAULT_FROZEN_LIMIT_s, spreadLimit: null, minCoverage: null });
    expect(tagLimitsEntry({ name: 'Z', flatlineLimitSeconds: 14400, spreadLimit: null, minCoverage: null })).toBeNull();
  });

  it("the file's default frozen-value limit is the one a tag gets in the database", () => {
    expect(tags.flatlineLimitSeconds.default).toBe(DEFAULT_FROZEN_LIMIT_s);
  });
});
