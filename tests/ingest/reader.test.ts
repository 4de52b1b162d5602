import { describe, expect, it } from 'vitest';
import { CellStatus, createRowReader, IngestError, sniffLayout } from '~/lib/ingest/index';
import type { LayoutProfile, ReadReport, RejectedCell, SampleSink } from '~/lib/ingest/index';
import { fixtureProfile, fixtureText } from './helpers';
import { at } from '../support/present';

interface Got {
  tags: string[];
  /** [tag, ISO time, value or null, status] */
  samples: [string, string, number | null, number][];
  report: ReadReport;
  rejected: RejectedCell[];
}

/** Reads a fixture through the row reader, in chunks of `chunk` characters. */
function read(name: string, timeZone: string, chunk = Infinity, profile: LayoutProfile = fixtureProfile(name)): Got {
  const text = fixtureText(name);
  const tags: string[] = [];
  const samples: Got['samples'] = [];
  const sink: SampleSink = {
    addTag: (k, tag) => (tags[k] = tag),
    addRow: (t, values, status) => {
      for (let k = 0; k < values.length; k++) {
        if (status[k] === CellStatus.Blank) continue;
        samples.push([at(tags, k, 'tags'), new Date(t).toISOString(), Number.isNaN(at(values, k)) ? null : at(values, k), at(status, k)]);
      }
    },
    addSample: (k, t, v, s) => samples.push([at(tags, k, 'tags'), new Date(t).toISOString(), Number.isNaN(v) ? null : v, s]),
  };
  const rejected: RejectedCell[] = [];
  const reader = createRowReader(profile, { timeZone, sink, onRejectedCell: (c) => rejected.push(c) });
  for (let o = 0; o < text.length; o += chunk === Infinity ? text.length : chunk) reader.push(text.slice(o, o + (chunk === Infinity ? text.length : chunk)));
  return { tags, samples, report: reader.end(), rejected };
}

const times = (g: Got, tag: string) => g.samples.filter((s) => s[0] === tag).map((s) => s[1]);
const warning = (g: Got, code: string) => g.report.warnings.find((w) => w.code === code);

describe('createRowReader', () => {
  it('reads the same samples whatever the chunk size (quoted line breaks across chunks)', () => {
    for (const name of ['quoted.csv', 'semicolon-comma-thousands.csv', 'long-quality.csv', 'status-words.csv']) {
      const whole = read(name, 'Europe/Berlin');
      for (const chunk of [1, 2, 3, 7]) expect(read(name, 'Europe/Berlin', chunk).samples, `${name} in chunks of ${chunk}`).toEqual(whole.samples);
    }
  });

  it('decimal comma and thousands point; local Berlin winter time is UTC+1', () => {
    const g = read('semicolon-comma-thousands.csv', 'Europe/Berlin');
    expect(g.samples.slice(0, 3)).toEqual([
      ['B1.FT-101', '2024-03-13T07:00:00.000Z', 1234.5, 0],
      ['B1.TT-102', '2024-03-13T07:00:00.000Z', 85.2, 0],
      ['B1.WT-104', '2024-03-13T07:00:00.000Z', 12000, 0],
    ]);
    expect(g.report).toMatchObject({ dataRowCount: 3, valueCount: 9, rejectedCount: 0, blankCount: 0, warnings: [] });
  });

  it('status words are rejected cells, counted per tag with their texts and lines; blanks are counted apart', () => {
    const g = read('status-words.csv', 'UTC');
    const ft = g.report.tags.find((t) => t.tag === 'B1.FT-101')!;
    const tt = g.report.tags.find((t) => t.tag === 'B1.TT-102')!;
    expect(ft).toMatchObject({ valueCount: 2, textCount: 4, blankCount: 1 });
    expect(ft.rejectedTexts).toEqual([
      { text: 'Shutdown', count: 2 },
      { text: 'I/O Timeout', count: 1 },
      { text: '#N/A', count: 1 },
    ]);
    expect(ft.rejectedLines).toEqual([3, 4, 5, 7]);
    expect(tt).toMatchObject({ valueCount: 5, textCount: 1, blankCount: 1, rejectedTexts: [{ text: 'Bad', count: 1 }] });
    expect(g.report).toMatchObject({ valueCount: 7, rejectedCount: 5, blankCount: 2 });
    expect(g.rejected[0]).toEqual({ tag: 'B1.FT-101', timeMs: Date.parse('2024-03-05T10:05:00Z'), line: 3, reason: 'text', text: 'Shutdown' });
    expect(g.samples.filter((s) => s[3] === CellStatus.Text).length).toBe(5);
  });

  it('ragged rows: missing cells blank, extra cells ignored, lines reported', () => {
    const g = read('ragged.csv', 'UTC');
    expect(warning(g, 'RAGGED_ROWS')).toMatchObject({ count: 2, lines: [3, 4] });
    expect(g.samples.filter((s) => s[1] === '2024-03-05T10:02:00.000Z').map((s) => s[2])).toEqual([52, 482]);
    expect(at(g.report.tags, 1, 'tags').blankCount).toBe(1);
  });

  it('duplicate and backwards times are kept and reported with their lines', () => {
    const g = read('duplicate-times.csv', 'UTC');
    expect(warning(g, 'DUPLICATE_TIMES')).toMatchObject({ count: 1, lines: [4] });
    expect(warning(g, 'BACKWARDS_TIMES')).toMatchObject({ count: 1, lines: [5] });
    expect(g.samples.map((s) => s[2])).toEqual([50, 60, 70, 99, 80]);
  });

  it('Berlin spring gap: 02:00 never happened; read with the winter offset and reported', () => {
    const g = read('dst-spring-berlin.csv', 'Europe/Berlin');
    expect(times(g, 'B1.FT-101')).toEqual([
      '2024-03-31T00:30:00.000Z', // 01:30 CET
      '2024-03-31T00:45:00.000Z',
      '2024-03-31T01:00:00.000Z', // 02:00 read as CET = 03:00 CEST
      '2024-03-31T01:15:00.000Z', // 03:15 CEST
      '2024-03-31T01:30:00.000Z',
    ]);
    expect(warning(g, 'DST_GAP')).toMatchObject({ count: 1, lines: [4] });
  });

  it('Berlin autumn repeat: resolved by order, both passes counted', () => {
    const g = read('dst-autumn-berlin.csv', 'Europe/Berlin');
    const expected: string[] = [];
    for (let m = -15; m <= 120; m += 15) expected.push(new Date(Date.parse('2024-10-27T00:00:00Z') + m * 60_000).toISOString());
    expect(times(g, 'B1.FT-101')).toEqual(expected); // strictly every 15 min from 23:45Z to 02:00Z
    const w = warning(g, 'DST_REPEATED_HOUR')!;
    expect(w.count).toBe(8);
    expect(w.message).toContain('4 read as the first pass');
    expect(w.message).toContain('4 as the second pass');
    expect(warning(g, 'BACKWARDS_TIMES')).toBeUndefined();
  });

  it('explicit offsets and Z are absolute, whatever the site zone', () => {
    const g = read('iso-offset.csv', 'America/New_York');
    expect(times(g, 'B1.FT-101')).toEqual(['2024-03-05T10:00:00.000Z', '2024-03-05T10:15:00.000Z', '2024-03-05T10:00:00.000Z', '2024-03-05T10:45:00.500Z']);
  });

  it.each([
    ['ampm.csv', 'UTC', ['2024-03-14T23:30:00.000Z', '2024-03-15T00:00:00.000Z', '2024-03-15T00:30:00.000Z', '2024-03-15T01:00:00.000Z', '2024-03-15T12:00:00.000Z']],
    ['unix-s.csv', 'Asia/Kolkata', ['2024-03-05T10:00:00.000Z', '2024-03-05T10:15:00.000Z', '2024-03-05T10:30:00.000Z']],
    ['unix-ms.csv', 'Asia/Kolkata', ['2024-03-05T10:00:00.000Z', '2024-03-05T10:15:00.500Z', '2024-03-05T10:30:00.000Z']],
    // serial days are a local wall clock: 45356.41666666667 is 10:00 on 2024-03-05, Berlin winter time
    ['serial.csv', 'Europe/Berlin', ['2024-03-05T09:00:00.000Z', '2024-03-05T09:15:00.000Z', '2024-03-05T09:30:00.000Z']],
    ['date-time-columns.csv', 'UTC', ['2024-03-13T23:58:00.000Z', '2024-03-13T23:59:00.000Z', '2024-03-14T00:00:00.000Z']],
    ['kolkata.csv', 'Asia/Kolkata', ['2024-01-10T04:20:00.000Z', '2024-01-10T04:30:00.000Z']],
  ])('%s read in %s', (name, zone, expected) => {
    expect(times(read(name, zone), 'B1.FT-101').slice(0, expected.length)).toEqual(expected);
  });

  it('long layout: quality words and OPC codes decide the status; unknown quality is used as uncertain and reported', () => {
    const g = read('long-quality.csv', 'UTC');
    expect(g.samples).toEqual([
      ['B1.FT-101', '2024-03-05T10:00:00.000Z', 50, CellStatus.Ok],
      ['B1.FT-101', '2024-03-05T10:10:00.000Z', 51, CellStatus.Ok], // 192 = 0xC0 good
      ['B1.FT-101', '2024-03-05T10:20:00.000Z', null, CellStatus.BadQuality],
      ['B1.FT-101', '2024-03-05T10:30:00.000Z', 53, CellStatus.Uncertain], // 64 = 0x40 uncertain
      ['B1.FT-101', '2024-03-05T10:40:00.000Z', null, CellStatus.Text],
      ['B1.TT-102', '2024-03-05T10:00:00.000Z', 480, CellStatus.Ok],
      ['B1.TT-102', '2024-03-05T10:10:00.000Z', null, CellStatus.BadQuality], // 0 = bad
      ['B1.TT-102', '2024-03-05T10:20:00.000Z', 482, CellStatus.Uncertain], // 'sort of'
    ]);
    expect(warning(g, 'UNKNOWN_QUALITY')).toMatchObject({ count: 1, lines: [9] });
    const ft = at(g.report.tags, 0, 'tags');
    expect(ft).toMatchObject({ valueCount: 3, textCount: 1, badQualityCount: 1, uncertainCount: 1 });
    expect(ft.rejectedTexts).toEqual([
      { text: '[bad quality] 9999', count: 1 },
      { text: 'Shutdown', count: 1 },
    ]);
  });

  it('unreadable times skip the row and are reported; a file with none readable is header-only', () => {
    const p = fixtureProfile('wide-units.csv');
    const tags: string[] = [];
    const rows: number[] = [];
    const r = createRowReader(p, { timeZone: 'UTC', sink: { addTag: (k, t) => (tags[k] = t), addRow: (t) => rows.push(t), addSample() {} } });
    r.push('Time,B1.FT-101,B1.TT-102,B1.PT-103\n,d,d,d\n,t/h,degC,bar(g)\n2024-03-05 10:00:00,1,2,3\nyesterday,1,2,3\n2024-02-30 10:00:00,1,2,3\n');
    const report = r.end();
    expect(rows).toEqual([Date.parse('2024-03-05T10:00:00Z')]);
    expect(report.warnings.find((w) => w.code === 'UNREADABLE_TIMES')).toMatchObject({ count: 2, lines: [5, 6] });

    const r2 = createRowReader(p, { timeZone: 'UTC', sink: { addTag() {}, addRow() {}, addSample() {} } });
    r2.push('Time,B1.FT-101,B1.TT-102,B1.PT-103\n,d,d,d\n,t/h,degC,bar(g)\n');
    let code = '';
    try {
      r2.end();
    } catch (e) {
      code = (e as IngestError).code;
    }
    expect(code).toBe('HEADER_ONLY');
  });

  it('machine ISO times in every width read as Date.parse reads them (UTC site)', () => {
    let text = 'Tag,Time,Value\n';
    const expected: number[] = [];
    let seed = 3;
    const rand = () => (seed = (seed * 48271) % 2147483647) / 2147483647;
    for (let i = 0; i < 400; i++) {
      const ms = Date.UTC(1999, 0, 1) + Math.floor(rand() * 40 * 365) * 86_400_000 + Math.floor(rand() * 86_400) * 1000 + (i % 2 ? Math.floor(rand() * 1000) : 0);
      const iso = new Date(ms).toISOString(); // YYYY-MM-DDThh:mm:ss.fffZ
      const forms = [iso, iso.slice(0, 19) + 'Z', iso.slice(0, 19), iso.slice(0, 23), iso.slice(0, 16), iso.slice(0, 16) + 'Z', iso.slice(0, 19).replace('T', ' ')];
      const form = at(forms, i % forms.length);
      text += `B1.FT-101,${form},${i}\n`;
      expected.push(Date.parse(/Z$/.test(form) ? form : form.replace(' ', 'T') + 'Z'));
    }
    const got: number[] = [];
    const r = createRowReader(sniffLayout(text), { timeZone: 'UTC', sink: { addTag() {}, addRow() {}, addSample: (_k, t) => got.push(t) } });
    r.push(text);
    r.end();
    expect(got).toEqual(expected);
  });

  it('long rows: the same tag in consecutive rows, quoted or spaced names, all map to one tag each', () => {
    const text = 'Tag;Time;Value\nB1.FT-101;2024-03-05 10:00;1\n"B1.FT-101";2024-03-05 10:01;2\n B1.FT-101 ;2024-03-05 10:02;3\nB1.FT-1010;2024-03-05 10:02;4\nB1.FT-101;2024-03-05 10:03;5\n';
    const g: string[] = [];
    const r = createRowReader(sniffLayout(text), { timeZone: 'UTC', sink: { addTag: (_k, t) => g.push(t), addRow() {}, addSample() {} } });
    r.push(text);
    const report = r.end();
    expect(g).toEqual(['B1.FT-101', 'B1.FT-1010']);
    expect(report.tags.map((t) => t.valueCount)).toEqual([4, 1]);
  });

  it('a cell with text after its closing quote is read with the text kept and warned about', () => {
    const text = 'Time,B1.FT-101,B1.TT-102\n2024-03-05 10:00:00,"12"5,"1,5"\n2024-03-05 10:01:00,"13"x,2\n2024-03-05 10:02:00,14,3\n';
    const p = sniffLayout(text);
    for (const chunk of [text.length, 5, 1]) {
      const got: [number, number][] = [];
      const rejected: RejectedCell[] = [];
      const r = createRowReader(p, {
        timeZone: 'UTC',
        sink: { addTag() {}, addRow: (_t, values, status) => got.push([at(values, 0), at(status, 0)]), addSample() {} },
        onRejectedCell: (c) => rejected.push(c),
      });
      for (let o = 0; o < text.length; o += chunk) r.push(text.slice(o, o + chunk));
      const report = r.end();
      expect(got, `chunks of ${chunk}`).toEqual([
        [125, CellStatus.Ok],
        [NaN, CellStatus.Text],
        [14, CellStatus.Ok],
      ]);
      expect(rejected.map((c) => [c.line, c.text])).toEqual([[3, '13x']]);
      expect(report.warnings.find((w) => w.code === 'MALFORMED_QUOTES')).toMatchObject({ count: 2 });
      expect(report.dataRowCount).toBe(3);
    }
  });

  it('refuses an invalid profile and an unknown time zone', () => {
    const sink = { addTag() {}, addRow() {}, addSample() {} };
    const p = fixtureProfile('wide-units.csv');
    expect(() => createRowReader({ ...p, separator: 'x' } as unknown as LayoutProfile, { timeZone: 'UTC', sink })).toThrow(/separator/);
    expect(() => createRowReader(p, { timeZone: 'Europe/Atlantis', sink })).toThrow(/not known/);
  });
});
