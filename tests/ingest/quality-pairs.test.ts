import { describe, expect, it } from 'vitest';
import { createFileIngest, createQualityJudge, DEFAULT_GOOD_QUALITY_CODES, fileVerdict, QualityClass, sniffLayout } from '~/lib/ingest/index';
import type { RejectedCell, TagHour } from '~/lib/ingest/index';
import { at } from '../support/present';

function read(text: string, goodQualityCodes?: string[]) {
  const hours: TagHour[] = [];
  const rejected: RejectedCell[] = [];
  const ingest = createFileIngest({ timeZone: 'UTC', goodQualityCodes, onHour: (h) => hours.push(h), onRejectedCell: (c) => rejected.push(c) });
  ingest.push(new TextEncoder().encode(text));
  return { hours, rejected, ...ingest.end() };
}

const PAIRS =
  'Time,B1.FT-101,B1.FT-101 Quality,B1.TT-101,B1.TT-101.Q\n' +
  '2024-03-05 10:00:00,10,Good,150,192\n' +
  '2024-03-05 10:15:00,20,Comm Fail,151,192\n' +
  '2024-03-05 10:30:00,30,Good,152,0\n' +
  '2024-03-05 10:45:00,40,Uncertain,153,192\n';

describe('wide files with a quality column per tag', () => {
  it('the sniffer pairs each value column with its quality column; those columns are no tags', () => {
    const p = sniffLayout(PAIRS, { complete: true });
    expect(p.quality).toEqual({ kind: 'pairs', pairs: [{ value: 1, quality: 2 }, { value: 3, quality: 4 }], rowColumn: null });
    expect(p.wide!.columns.map((c) => c.tag)).toEqual(['B1.FT-101', 'B1.TT-101']);
  });

  it('a bad code rejects the sample with the code as its reason; uncertain codes are used and counted', () => {
    const { hours, rejected, report } = read(PAIRS);
    expect(rejected.map((r) => [r.tag, r.reason, r.code, r.text])).toEqual([
      ['B1.FT-101', 'bad-quality', 'Comm Fail', '20'],
      ['B1.TT-101', 'bad-quality', '0', '152'],
    ]);
    const ft = report.tags.find((t) => t.tag === 'B1.FT-101')!;
    expect([ft.valueCount, ft.badQualityCount, ft.uncertainCount]).toEqual([3, 1, 1]);
    expect(at(ft.rejectedTexts, 0, 'rejected texts').text).toBe('[bad quality Comm Fail] 20');
    const h = hours.find((x) => x.tag === 'B1.FT-101')!;
    expect([h.sampleCount, h.min, h.max, h.badQualityCount, h.uncertainCount]).toEqual([3, 10, 40, 1, 1]);
  });

  it("the site's good codes decide: with '0' good the temperature keeps every sample", () => {
    const { report } = read(PAIRS, [...DEFAULT_GOOD_QUALITY_CODES, '0']);
    expect(report.tags.find((t) => t.tag === 'B1.TT-101')!.badQualityCount).toBe(0);
  });

  it('one status column for the whole row applies to every tag of that row', () => {
    const text = 'Time,A,B,Status\n2024-03-05 10:00:00,1,2,OK\n2024-03-05 10:10:00,3,4,Fault\n2024-03-05 10:20:00,5,6,OK\n';
    const p = sniffLayout(text, { complete: true });
    expect(p.quality).toEqual({ kind: 'row', pairs: [], rowColumn: 3 });
    const { report } = read(text);
    expect(report.tags.map((t) => [t.tag, t.valueCount, t.badQualityCount])).toEqual([
      ['A', 2, 1],
      ['B', 2, 1],
    ]);
  });

  it('a lone tag named like a status is a tag of its own', () => {
    const p = sniffLayout('Time,P-101.Status,B\n2024-03-05 10:00:00,1,2\n2024-03-05 10:10:00,0,4\n2024-03-05 10:20:00,1,6\n', { complete: true });
    expect(p.quality).toBeUndefined();
    expect(p.wide!.columns.map((c) => c.tag)).toEqual(['P-101.Status', 'B']);
  });

  it('default judgement of codes', () => {
    const judge = createQualityJudge();
    expect(['Good', 'ok', ' 192 ', '', 'VALID'].map(judge)).toEqual(Array(5).fill(QualityClass.Good));
    expect(['Uncertain', '64', 'Suspect'].map(judge)).toEqual(Array(3).fill(QualityClass.Uncertain));
    expect(['Bad', '0', 'Comm Fail', '193'].map(judge)).toEqual(Array(4).fill(QualityClass.Bad));
  });
});

describe('a tag that lost more than half of its values', () => {
  it('makes the file end read-with-problems, with per-tag counts', () => {
    const text = 'Time,A,B\n2024-03-05 10:00:00,1,x\n2024-03-05 10:10:00,2,y\n2024-03-05 10:20:00,3,5\n2024-03-05 10:30:00,4,6\n2024-03-05 10:40:00,5,z\n';
    const { report } = read(text);
    const v = fileVerdict(report);
    expect(v.state).toBe('read-with-problems');
    expect(v.problemTags).toEqual([{ tag: 'B', read: 2, rejected: 3, lostShare: 0.6 }]);
  });

  it('exactly half lost is still plainly read', () => {
    const text = 'Time,A,B\n2024-03-05 10:00:00,1,x\n2024-03-05 10:10:00,2,y\n2024-03-05 10:20:00,3,5\n2024-03-05 10:30:00,4,6\n';
    expect(fileVerdict(read(text).report).state).toBe('done');
  });
});
