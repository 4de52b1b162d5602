import { describe, expect, it } from 'vitest';
import { answerColumnNumbers, createFileIngest, sniffLayout } from '~/lib/ingest/index';
import type { TagHour } from '~/lib/ingest/index';
import { at } from '../support/present';

function read(text: string) {
  const hours: TagHour[] = [];
  const ingest = createFileIngest({ timeZone: 'UTC', onHour: (h) => hours.push(h) });
  ingest.push(new TextEncoder().encode(text));
  return { hours, ...ingest.end() };
}

describe('quoted numbers of a comma-separated file keep their own format', () => {
  const text =
    'Time,B1.FT-101,B1.JT-101,B1.TT-101\n' +
    '2024-03-05 10:00:00,"10,954.58","4,812,373.94",12.5\n' +
    '2024-03-05 10:30:00,"1,000.5","4,812,400.00",13.5\n' +
    '2024-03-05 11:00:00,"998.25","4,812,500.06",14\n';

  it('comma thousands with a decimal point are read as the numbers they show, per column', () => {
    const profile = sniffLayout(text, { complete: true });
    expect(profile.columnNumbers).toEqual([
      { column: 1, decimalMark: '.', thousandsSeparator: ',' },
      { column: 2, decimalMark: '.', thousandsSeparator: ',' },
    ]);
    expect(profile.decimalMark).toBe('.');
    expect(profile.questions).toEqual([]);
    const { hours, report } = read(text);
    expect(report.rejectedCount).toBe(0);
    const ft = hours.find((h) => h.tag === 'B1.FT-101' && h.hourStartMs === Date.UTC(2024, 2, 5, 10))!;
    expect(ft.first).toBe(10954.58);
    expect(ft.min).toBe(1000.5);
    expect(ft.last).toBe(1000.5);
    const jt = hours.find((h) => h.tag === 'B1.JT-101' && h.hourStartMs === Date.UTC(2024, 2, 5, 11))!;
    expect(jt.first).toBe(4812500.06);
  });

  it('a column of quoted decimal commas reads with a decimal comma, the other columns unchanged', () => {
    const t = 'Time,A,B\n2024-03-05 10:00:00,"12,5",7.25\n2024-03-05 10:10:00,"0,125",7.5\n2024-03-05 10:20:00,"1.234,56",8\n';
    const profile = sniffLayout(t, { complete: true });
    expect(profile.columnNumbers).toEqual([{ column: 1, decimalMark: ',', thousandsSeparator: '.' }]);
    const { hours, report } = read(t);
    expect(report.rejectedCount).toBe(0);
    const a = hours.find((h) => h.tag === 'A')!;
    expect([a.first, a.min, a.max]).toEqual([12.5, 0.125, 1234.56]);
    expect(hours.find((h) => h.tag === 'B')!.max).toBe(8);
  });

  it("'1,234' alone reads two ways: a blocking question; the answer decides", () => {
    const t = 'Time,A\n2024-03-05 10:00:00,"1,234"\n2024-03-05 10:10:00,"2,500"\n2024-03-05 10:20:00,"3,125"\n';
    const profile = sniffLayout(t, { complete: true });
    const q = profile.questions.find((x) => x.field === 'columnNumbers.1');
    expect(q?.blocking).toBe(true);
    expect(q?.choices).toEqual(['thousands', 'decimal']);
    const answered = { ...profile, columnNumbers: answerColumnNumbers(profile.columnNumbers, 1, 'decimal'), questions: [] };
    const hours: TagHour[] = [];
    const ingest = createFileIngest({ timeZone: 'UTC', profile: answered, onHour: (h) => hours.push(h) });
    ingest.push(new TextEncoder().encode(t));
    ingest.end();
    expect([at(hours, 0, 'hours').first, at(hours, 0, 'hours').max]).toEqual([1.234, 3.125]);
    const asThousands = { ...profile, columnNumbers: answerColumnNumbers(profile.columnNumbers, 1, 'thousands'), questions: [] };
    const h2: TagHour[] = [];
    const i2 = createFileIngest({ timeZone: 'UTC', profile: asThousands, onHour: (h) => h2.push(h) });
    i2.push(new TextEncoder().encode(t));
    i2.end();
    expect([at(h2, 0, 'hours').first, at(h2, 0, 'hours').max]).toEqual([1234, 3125]);
  });

  it('unquoted cells keep the file rules: a semicolon file is not affected', () => {
    const t = 'Zeit;A\n05.03.2024 10:00;1.234,5\n05.03.2024 10:10;2.000,25\n13.03.2024 10:20;3,5\n';
    const profile = sniffLayout(t, { complete: true });
    expect(profile.columnNumbers).toBeUndefined();
    expect(profile.decimalMark).toBe(',');
  });
});
