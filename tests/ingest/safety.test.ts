/**
 * Hostile and careless files: each stops with its own catalogued reason or is read with the bad
 * cells rejected; nothing impossible reaches a tag hour.
 */
import { describe, expect, it } from 'vitest';
import {
  INGEST_ERROR_CATALOGUE,
  IngestError,
  checkLayoutAgainstSample,
  createFileIngest,
  sniffLayout,
  valueLimitsFor,
  type FileIngestOptions,
  type RejectedCell,
  type TagHour,
} from '~/lib/ingest/index';

function read(text: string, options: Partial<FileIngestOptions> = {}) {
  const hours: TagHour[] = [];
  const rejects: RejectedCell[] = [];
  const ing = createFileIngest({ timeZone: 'UTC', onHour: (h) => hours.push(h), onRejectedCell: (c) => rejects.push(c), ...options });
  const bytes = new TextEncoder().encode(text);
  for (let i = 0; i < bytes.length; i += 65536) ing.push(bytes.subarray(i, i + 65536));
  const out = ing.end();
  return { ...out, hours, rejects };
}

function codeOf(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    if (e instanceof IngestError) return e.code;
    throw e;
  }
  return 'no error';
}

const minutes = (n: number, row: (i: number, stamp: string) => string) =>
  Array.from({ length: n }, (_, i) => row(i, new Date(Date.UTC(2026, 2, 10, 0, i)).toISOString().slice(0, 16).replace('T', ' '))).join('\n') + '\n';

describe('impossible values are rejected cells', () => {
  it('1e308, Infinity and a temperature below absolute zero never reach a tag hour', () => {
    const text =
      'time,TT-1,PT-1\n,degC,bar(a)\n' +
      minutes(60, (i, t) => `${t},${i === 10 ? '1e308' : i === 11 ? '-300' : '150'},${i === 20 ? '-0.5' : i === 21 ? '1e400' : '12'}`);
    const r = read(text);
    const tt = r.hours.find((h) => h.tag === 'TT-1')!;
    const pt = r.hours.find((h) => h.tag === 'PT-1')!;
    expect(tt.max).toBe(150);
    expect(tt.min).toBe(150);
    expect(pt.min).toBe(12);
    expect(pt.max).toBe(12);
    expect(r.rejects.filter((c) => c.reason === 'impossible').map((c) => c.text).sort()).toEqual(['-0.5', '-300', '1e308']);
    // beyond the double range: not a number at all
    expect(r.rejects.find((c) => c.text === '1e400')?.reason).toBe('text');
    expect(r.report.warnings.map((w) => w.code)).toContain('IMPOSSIBLE_VALUES');
    expect(r.report.tags.find((t) => t.tag === 'TT-1')!.impossibleCount).toBe(2);
  });

  it('limits follow the unit: absolute zero is -273.15 degC and -459.67 degF; a gauge unit may read down to minus the atmosphere', () => {
    // NIST SP 811 (2008) B.8: T/K = t/degC + 273.15 = (t/degF + 459.67)/1.8
    expect(valueLimitsFor('degC').min).toBeCloseTo(-273.15, 9);
    expect(valueLimitsFor('°F').min).toBeCloseTo(-459.67, 9);
    expect(valueLimitsFor('bar(a)').min).toBe(0);
    // 108.5 kPa: above the highest sea-level pressure on record (limits.ts, from memory)
    expect(valueLimitsFor('barg').min).toBeCloseTo(-1.085, 9);
    // 'K' also writes temperature differences: no lower bound beyond the difference range
    expect(valueLimitsFor('K').min).toBeLessThan(0);
    expect(valueLimitsFor(null).max).toBe(1e18);
    expect(valueLimitsFor('kg/s', 'massFlow').max).toBe(1e6);
  });
});

describe('times outside the accepted window', () => {
  const window = { minMs: Date.UTC(2000, 0, 1), maxMs: Date.UTC(2027, 0, 1) };
  it('a year-9999 row has its cells rejected with the reason; the other rows are read', () => {
    const text = 'time,A,B\n' + minutes(30, (i, t) => `${i === 5 ? '9999-12-31 23:00' : t},1,2`);
    const r = read(text, { timeWindow: window });
    expect(r.rejects.filter((c) => c.reason === 'outside-window').length).toBe(2);
    expect(r.report.lastTimeMs).toBe(Date.UTC(2026, 2, 10, 0, 29));
    expect(r.hours.every((h) => h.hourStartMs < window.maxMs)).toBe(true);
    expect(r.report.warnings.map((w) => w.code)).toContain('TIMES_OUTSIDE_WINDOW');
  });
  it('a file whose every time is outside stops with TIMES_OUTSIDE_WINDOW', () => {
    const text = 'time,A\n1970-01-01 00:00,1\n1970-01-01 00:01,2\n1970-01-01 00:02,2\n';
    expect(codeOf(() => read(text, { timeWindow: window }))).toBe('TIMES_OUTSIDE_WINDOW');
  });
});

describe('a layout that does not fit the file is never used silently', () => {
  it("a ';' file with decimal points, read with a decimal comma, stops with MOSTLY_REJECTED instead of ending with every value rejected", () => {
    const text = 'time;A;B\n' + minutes(100, (_i, t) => `${t};1.234;5.678`);
    const profile = sniffLayout(text, { complete: true });
    expect(profile.decimalMark).toBe(',');
    expect(codeOf(() => read(text))).toBe('MOSTLY_REJECTED');
  });

  it('a saved layout with a decimal comma disagrees with a file of decimal points: a blocking question', () => {
    const commaFile = 'time;A;B\n' + minutes(50, (i, t) => `${t};${i},5;7,25`);
    const saved = sniffLayout(commaFile, { complete: true });
    expect(saved.decimalMark).toBe(',');
    const dotFile = 'time;A;B\n' + minutes(50, (i, t) => `${t};${i}.5;7.25`);
    const d = checkLayoutAgainstSample(dotFile, saved, { timeZone: 'UTC', complete: true });
    expect(d?.question.field).toBe('decimalMark');
    expect(d?.suggested).toBe('.');
    expect(checkLayoutAgainstSample(commaFile, saved, { timeZone: 'UTC', complete: true })).toBeNull();
  });

  it('a saved day-first layout disagrees with a month-first file whose own sequence says so (10/03 is 3 October)', () => {
    const hourly = (order: 'dmy' | 'mdy', from: Date, n: number) =>
      Array.from({ length: n }, (_, i) => {
        const d = new Date(from.getTime() + i * 3_600_000);
        const dd = String(d.getUTCDate()).padStart(2, '0');
        const mm = String(d.getUTCMonth() + 1).padStart(2, '0');
        return `${order === 'dmy' ? `${dd}/${mm}` : `${mm}/${dd}`}/2026 ${String(d.getUTCHours()).padStart(2, '0')}:00,${40 + (i % 5)}`;
      }).join('\n') + '\n';
    // A day-first file that decides itself (a day above 12) saves a dmy layout ...
    const savedFile = 'time,PT-1\n' + hourly('dmy', new Date(Date.UTC(2026, 2, 20)), 30);
    const saved = sniffLayout(savedFile, { complete: true });
    expect(saved.time.dateOrder).toBe('dmy');
    // ... a later month-first file of the same shape, 3 to 5 October, has no day above 12.
    const later = 'time,PT-1\n' + hourly('mdy', new Date(Date.UTC(2026, 9, 3)), 72);
    expect(sniffLayout(later, { complete: true }).fingerprint).toBe(saved.fingerprint);
    const d = checkLayoutAgainstSample(later, saved, { timeZone: 'UTC', complete: true });
    expect(d?.question.field).toBe('time.dateOrder');
    expect(d?.suggested).toBe('mdy');
    expect(checkLayoutAgainstSample(savedFile, saved, { timeZone: 'UTC', complete: true })).toBeNull();
  });
});

describe('each file problem has its own catalogued reason', () => {
  const hdr = 'time,a,b\n';
  it('100,000 blank lines before the data: BLANK_LINES', () => {
    expect(codeOf(() => read(hdr + '\n'.repeat(100_000) + '2026-03-10 00:00,1,2\n'))).toBe('BLANK_LINES');
  });
  it('100,000 blank lines after the data are skipped', () => {
    expect(read(hdr + '2026-03-10 00:00,1,2\n2026-03-10 00:01,1,2\n' + '\n'.repeat(100_000)).report.dataRowCount).toBe(2);
  });
  it('a 1 MiB record: RECORD_TOO_LONG', () => {
    expect(codeOf(() => read(hdr + '2026-03-10 00:00,1,' + 'x'.repeat(1_100_000) + '\n2026-03-10 00:01,1,2\n'))).toBe('RECORD_TOO_LONG');
  });
  it('every value NaN: NO_NUMBERS; one column NaN: a warning naming it', () => {
    expect(codeOf(() => read(hdr + minutes(50, (_i, t) => `${t},NaN,NaN`)))).toBe('NO_NUMBERS');
    const r = read(hdr + minutes(50, (_i, t) => `${t},NaN,3`), { maxRejectedShare: 0.6 });
    const w = r.report.warnings.find((x) => x.code === 'COLUMNS_WITHOUT_NUMBERS');
    expect(w?.message).toMatch(/\ba\b.*NaN/);
  });
  it('a column name with a NUL byte: BAD_TAG_NAME', () => {
    expect(codeOf(() => read('time,a\u0000b,c\n' + minutes(5, (_i, t) => `${t},1,2`)))).toMatch(/BAD_TAG_NAME|BINARY_FILE/);
  });
  it('every code has a human line in the catalogue', () => {
    for (const [code, line] of Object.entries(INGEST_ERROR_CATALOGUE)) expect(line.length, code).toBeGreaterThan(20);
  });
});
