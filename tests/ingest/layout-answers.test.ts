import { describe, expect, it } from 'vitest';
import { answeredProfile, blockingLeft, numberQuestions } from '~/lib/ingest/layout-answers';
import { createRowReader, sniffLayout } from '~/lib/ingest/index';
import { fixtureProfile } from './helpers';

const sink = { addTag() {}, addRow() {}, addSample() {} };

describe("the layout review's answers", () => {
  it("a quoted '1,234' column blocks the save until its numbers are answered; the answer becomes the column's format", () => {
    const t = 'Time,A\n2024-03-05 10:00:00,"1,234"\n2024-03-05 10:10:00,"2,500"\n2024-03-05 10:20:00,"3,125"\n';
    const profile = sniffLayout(t, { complete: true });
    expect(numberQuestions(profile).map((q) => q.field)).toEqual(['columnNumbers.1']);
    expect(blockingLeft(profile, {})).toEqual({ numbersLeft: true, blockingLeft: true });
    expect(blockingLeft(profile, { 1: 'thousands' })).toEqual({ numbersLeft: false, blockingLeft: false });
    const saved = answeredProfile(profile, { 1: 'thousands' });
    expect(saved.columnNumbers).toEqual([{ column: 1, decimalMark: '.', thousandsSeparator: ',' }]);
    expect(saved.questions.some((q) => q.field === 'columnNumbers.1')).toBe(false);
    expect(profile.questions.some((q) => q.field === 'columnNumbers.1')).toBe(true);
  });

  it('an undecided date order blocks until chosen; the chosen profile drops its question and the reader takes it', () => {
    const p = fixtureProfile('ambiguous.csv');
    expect(blockingLeft(p, {})).toEqual({ numbersLeft: false, blockingLeft: true });
    const chosen = { ...p, time: { ...p.time, dateOrder: 'dmy' as const } };
    expect(blockingLeft(chosen, {})).toEqual({ numbersLeft: false, blockingLeft: false });
    const saved = answeredProfile(chosen, {});
    expect(saved.questions).toEqual([]);
    expect(() => createRowReader(saved, { timeZone: 'UTC', sink })).not.toThrow();
    // Still undecided: the question stays with the profile.
    expect(answeredProfile(p, {}).questions.map((q) => q.field)).toEqual(['time.dateOrder']);
  });
});
