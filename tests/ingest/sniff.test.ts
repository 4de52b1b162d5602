import { describe, expect, it } from 'vitest';
import { fnv1a64Hex, IngestError, LayoutProfileSchema, previewRows, sniffLayout, createRowReader } from '~/lib/ingest/index';
import type { LayoutProfile } from '~/lib/ingest/index';
import { fixtureProfile, fixtureText } from './helpers';
import { at } from '../support/present';

function errorOf(f: () => unknown): IngestError {
  try {
    f();
  } catch (e) {
    if (e instanceof IngestError) return e;
    throw e;
  }
  throw new Error('expected an IngestError');
}

const wideTags = (p: LayoutProfile) => p.wide!.columns.map((c) => [c.tag, c.unit, c.description]);

describe('sniffLayout', () => {
  it('wide with a description row and a units row', () => {
    const p = fixtureProfile('wide-units.csv');
    expect(p).toMatchObject({ separator: ',', decimalMark: '.', layout: 'wide', headerRowCount: 3, tagRowIndex: 0, descriptionRowIndex: 1, unitRowIndex: 2 });
    expect(p.time).toMatchObject({ columns: [0], kind: 'text', dateOrder: 'ymd', clock: '24h', zone: 'local' });
    expect(wideTags(p)).toEqual([
      ['B1.FT-101', 't/h', 'Feed water flow'],
      ['B1.TT-102', 'degC', 'Live steam temperature'],
      ['B1.PT-103', 'bar(g)', 'Drum pressure'],
    ]);
    expect(p.questions).toEqual([]);
  });

  it('long with a quality column, by its header names', () => {
    const p = fixtureProfile('long-quality.csv');
    expect(p.layout).toBe('long');
    expect(p.long).toEqual({ tagColumn: 0, valueColumn: 2, qualityColumn: 3, unitColumn: null });
    expect(p.time).toMatchObject({ columns: [1], zone: 'explicit', dateOrder: 'ymd' });
  });

  it('long by evidence when the header uses other words', () => {
    const text = 'Messstelle-Name;Zeitpunkt;Messwert\nB1.FT-101;05.03.2024 10:00;12,5\nB1.TT-102;05.03.2024 10:00;480,1\nB1.FT-101;13.03.2024 10:01;12,7\n';
    const p = sniffLayout(text);
    expect(p.layout).toBe('long');
    expect(p.long).toMatchObject({ tagColumn: 0, valueColumn: 2 });
    expect(p.questions.map((q) => q.field)).toContain('layout');
  });

  it('semicolon, decimal comma, thousands point, day-first decided by a day above 12, CR LF', () => {
    const p = fixtureProfile('semicolon-comma-thousands.csv');
    expect(p).toMatchObject({ separator: ';', decimalMark: ',', thousandsSeparator: '.', unitRowIndex: 1 });
    expect(p.time.dateOrder).toBe('dmy');
    expect(wideTags(p).map((t) => t[1])).toEqual(['m3/h', 'degC', 'kW']);
  });

  it('tab separated', () => {
    const p = fixtureProfile('tab.tsv');
    expect(p.separator).toBe('\t');
    expect(wideTags(p).map((t) => t[0])).toEqual(['B1.FT-101', 'B1.TT-102']);
  });

  it.each(['utf16le-bom.csv', 'utf16le-nobom.csv', 'utf16be-bom.csv', 'latin1.csv'])('%s: units with ³ and ° survive decoding', (name) => {
    const p = fixtureProfile(name);
    expect(wideTags(p).map((t) => t[1])).toEqual(['m³/h', '°C']);
    expect(p.decimalMark).toBe(',');
  });

  it('ISO 8601 with offsets and Z: explicit instants', () => {
    expect(fixtureProfile('iso-offset.csv').time).toMatchObject({ zone: 'explicit', dateOrder: 'ymd' });
  });

  it('dates whose fields are all 12 or below: date order is a blocking question', () => {
    const p = fixtureProfile('ambiguous.csv');
    expect(p.time.dateOrder).toBe('ambiguous');
    expect(p.questions).toEqual([expect.objectContaining({ field: 'time.dateOrder', blocking: true, choices: ['dmy', 'mdy'] })]);
    expect(at(p.questions, 0, 'questions').message).toContain('dots are usually day-first');
    expect(p.confidence).toBeLessThanOrEqual(0.5);
    // the reader refuses until it is answered; answered, it reads
    const sink = { addTag() {}, addRow() {}, addSample() {} };
    expect(errorOf(() => createRowReader(p, { timeZone: 'UTC', sink })).code).toBe('DATE_ORDER_UNDECIDED');
    const answered: LayoutProfile = { ...p, time: { ...p.time, dateOrder: 'dmy' } };
    expect(() => createRowReader(answered, { timeZone: 'UTC', sink })).not.toThrow();
  });

  it('12-hour clock with AM/PM, month first (a second field above 12)', () => {
    expect(fixtureProfile('ampm.csv').time).toMatchObject({ dateOrder: 'mdy', clock: '12h' });
  });

  it.each([
    ['unix-s.csv', 'unix-s', 'explicit'],
    ['unix-ms.csv', 'unix-ms', 'explicit'],
    ['serial.csv', 'serial', 'local'],
  ])('%s: numeric times read as %s', (name, kind, zone) => {
    expect(fixtureProfile(name).time).toMatchObject({ kind, zone, columns: [0] });
  });

  it('separate date and time-of-day columns', () => {
    const p = fixtureProfile('date-time-columns.csv');
    expect(p.time).toMatchObject({ columns: [0, 1], dateOrder: 'dmy' });
    expect(wideTags(p).map((t) => t[0])).toEqual(['B1.FT-101']);
  });

  it('quoted header cells with separators, doubled quotes and a line break', () => {
    const p = fixtureProfile('quoted.csv');
    expect(wideTags(p)).toEqual([
      ['B1.FT-101', null, 'Feed flow, "north" line'],
      ['B1.TT-102', null, 'Steam\ntemperature'],
    ]);
    expect(p.headerRowCount).toBe(2);
  });

  it('status words in the first data rows do not hide where the data starts', () => {
    const p = fixtureProfile('status-words.csv');
    expect(p.headerRowCount).toBe(1);
    expect(p.descriptionRowIndex).toBeNull();
  });

  it('a preamble line before the names is skipped; units in brackets are split off names', () => {
    const text = 'Export of plant B1;2024-03-05 12:00\nTime;B1.FT-101 [t/h];B1.TT-102 (degC)\n05.03.2024 10:00;12,5;480,1\n13.03.2024 10:01;12,7;480,3\n13.03.2024 10:02;12,9;480,2\n';
    const p = sniffLayout(text);
    expect(p.headerRowCount).toBe(2);
    expect(p.tagRowIndex).toBe(1);
    expect(wideTags(p)).toEqual([
      ['B1.FT-101', 't/h', null],
      ['B1.TT-102', 'degC', null],
    ]);
  });

  it('fatal: empty, header only, duplicated names, no time column, one enormous first line', () => {
    expect(errorOf(() => sniffLayout('')).code).toBe('EMPTY_FILE');
    expect(errorOf(() => sniffLayout(' \n\n')).code).toBe('EMPTY_FILE');
    expect(errorOf(() => fixtureProfile('header-only.csv')).code).toBe('HEADER_ONLY');
    const dup = errorOf(() => fixtureProfile('duplicate-headers.csv'));
    expect(dup.code).toBe('DUPLICATE_HEADERS');
    expect(dup.message).toContain("'B1.FT-101' (columns 2, 4)");
    expect(errorOf(() => sniffLayout('a,b\n1,2\n3,4\n5,6\n')).code).toBe('NO_TIME_COLUMN');
    expect(errorOf(() => sniffLayout('x'.repeat(70000), { complete: false })).code).toBe('RECORD_TOO_LONG');
  });

  it('the profile is plain JSON that its schema accepts', () => {
    const p = fixtureProfile('wide-units.csv');
    const copy = JSON.parse(JSON.stringify(p));
    expect(LayoutProfileSchema.parse(copy)).toEqual(p);
  });
});

describe('fingerprint', () => {
  it('FNV-1a 64 matches the published test values', () => {
    // From the FNV reference test suite: "" -> offset basis, "a", "foobar".
    expect(fnv1a64Hex('')).toBe('cbf29ce484222325');
    expect(fnv1a64Hex('a')).toBe('af63dc4c8601ec8c');
    expect(fnv1a64Hex('foobar')).toBe('85944171f73967e8');
  });

  it('files of the same shape share it; a different header or separator changes it', () => {
    const a = sniffLayout('Time,B1.FT-101\n2024-03-05 10:00,1.5\n2024-03-05 10:01,1.6\n');
    const b = sniffLayout('Time , b1.ft-101\n2024-04-01 00:00,7.5\n2024-04-01 00:01,7.6\n2024-04-01 00:02,7.7\n');
    const c = sniffLayout('Time,B1.FT-102\n2024-03-05 10:00,1.5\n2024-03-05 10:01,1.6\n');
    const d = sniffLayout('Time;B1.FT-101\n2024-03-05 10:00;1.5\n2024-03-05 10:01;1.6\n');
    expect(b.fingerprint).toBe(a.fingerprint);
    expect(c.fingerprint).not.toBe(a.fingerprint);
    expect(d.fingerprint).not.toBe(a.fingerprint);
  });

  it('a changing preamble (export date) does not change it', () => {
    const a = sniffLayout('Exported 2024-03-05\nTime,B1.FT-101\n2024-03-05 10:00,1.5\n2024-03-05 10:01,1.6\n2024-03-05 10:02,1.6\n');
    const b = sniffLayout('Exported 2024-04-09\nTime,B1.FT-101\n2024-04-09 10:00,1.5\n2024-04-09 10:01,1.6\n2024-04-09 10:02,1.6\n');
    expect(a.headerRowCount).toBe(2);
    expect(b.fingerprint).toBe(a.fingerprint);
  });
});

describe('previewRows', () => {
  it('gives times as ISO UTC and rejected cells as their text', () => {
    const text = fixtureText('status-words.csv');
    const rows = previewRows(text, sniffLayout(text), 3, { timeZone: 'Europe/Berlin' });
    expect(rows.map((r) => r.timeIso)).toEqual(['2024-03-05T09:00:00.000Z', '2024-03-05T09:05:00.000Z', '2024-03-05T09:10:00.000Z']);
    expect(at(rows, 1, 'rows').cells.map((c) => [c.tag, c.value, c.rejected])).toEqual([
      ['B1.FT-101', null, 'Shutdown'],
      ['B1.TT-102', 481, null],
    ]);
    expect(at(rows, 2, 'rows').cells.map((c) => c.rejected)).toEqual(['I/O Timeout', 'Bad']);
    expect(at(rows, 0, 'rows').timeText).toBe('2024-03-05 10:00:00');
  });

  it('leaves out the last line of a sample that may have been cut', () => {
    const text = fixtureText('wide-units.csv');
    const cut = text.slice(0, text.indexOf('2024-03-05 11:00:00') + 14); // ends inside the last row
    const profile = sniffLayout(text);
    expect(previewRows(cut, profile, 10, { timeZone: 'UTC', complete: false }).map((r) => r.line)).toEqual([4, 5, 6, 7]);
    expect(previewRows(cut, profile, 10, { timeZone: 'UTC', complete: true }).map((r) => r.line)).toEqual([4, 5, 6, 7, 8]);
  });

  it('with an undecided date order shows both readings', () => {
    const text = fixtureText('ambiguous.csv');
    const rows = previewRows(text, sniffLayout(text), 1, { timeZone: 'UTC' });
    expect(at(rows, 0, 'rows').timeIso).toBeNull();
    expect(at(rows, 0, 'rows').timeChoices).toEqual({ dmy: '2024-03-05T10:00:00.000Z', mdy: '2024-05-03T10:00:00.000Z' });
  });
});
