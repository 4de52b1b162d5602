import { describe, expect, it } from 'vitest';
import { createFileIngest, IngestError } from '~/lib/ingest/index';
import type { FileIngestOptions, TagHour } from '~/lib/ingest/index';
import { fixtureBytes, fixtureProfile } from './helpers';
import { at } from '../support/present';

function run(bytes: Uint8Array, options: Omit<FileIngestOptions, 'onHour'>, chunk = 65536) {
  const hours: TagHour[] = [];
  const ingest = createFileIngest({ ...options, onHour: (h) => hours.push(h) });
  for (let o = 0; o < bytes.length; o += chunk) ingest.push(bytes.subarray(o, o + chunk));
  return { hours, result: ingest.end() };
}

function codeOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof IngestError) return e.code;
    throw e;
  }
  return 'no error';
}

describe('createFileIngest', () => {
  it('fatal problems surface as coded errors: empty, binary, header only, duplicated names', () => {
    for (const [name, code] of [
      ['empty.csv', 'EMPTY_FILE'],
      ['binary.bin', 'BINARY_FILE'],
      ['header-only.csv', 'HEADER_ONLY'],
      ['duplicate-headers.csv', 'DUPLICATE_HEADERS'],
    ] as const) {
      expect(codeOf(() => run(fixtureBytes(name), { timeZone: 'UTC' })), name).toBe(code);
    }
  });

  it('a single line longer than 1 MB stops with RECORD_TOO_LONG, read in 64 KiB chunks', () => {
    const head = 'Time,B1.FT-101\n2024-03-05 10:00:00,1\n2024-03-05 10:01:00,2\n2024-03-05 10:02:00,3\n';
    const text = head + '2024-03-05 10:03:00,' + '9'.repeat(1_200_000) + '\n';
    let error: IngestError | null = null;
    try {
      run(new TextEncoder().encode(text), { timeZone: 'UTC' });
    } catch (e) {
      error = e as IngestError;
    }
    expect(error?.code).toBe('RECORD_TOO_LONG');
    expect(error?.line).toBe(5);
  });

  it('a file whose first 64 KiB leave the date order open needs an answer, then reads', () => {
    let text = 'Time;B1.FT-101\n';
    const start = Date.UTC(2024, 2, 1);
    for (let i = 0; i < 4320; i++) {
      const d = new Date(start + i * 300_000); // every 5 min for 15 days: days above 12 only after the first 64 KiB
      const dd = String(d.getUTCDate()).padStart(2, '0');
      text += `${dd}.03.2024 ${String(d.getUTCHours()).padStart(2, '0')}:${String(d.getUTCMinutes()).padStart(2, '0')};${i % 7},5\n`;
    }
    const bytes = new TextEncoder().encode(text);
    expect(text.indexOf('13.03.2024')).toBeGreaterThan(65536);
    expect(codeOf(() => run(bytes, { timeZone: 'UTC' }))).toBe('DATE_ORDER_UNDECIDED');
    const { hours, result } = run(bytes, {
      timeZone: 'UTC',
      answer: (p) => ({ ...p, time: { ...p.time, dateOrder: 'dmy' } }),
    });
    expect(result.report.dataRowCount).toBe(4320);
    expect(hours).toHaveLength(360); // 15 days of hours from 1 March 00:00
    expect(at(hours, 359, 'hours').hourStartMs).toBe(Date.UTC(2024, 2, 15, 23));
  });

  it('reuses a stored profile instead of sniffing', () => {
    const profile = fixtureProfile('wide-units.csv');
    const { result } = run(fixtureBytes('wide-units.csv'), { timeZone: 'UTC', profile });
    expect(result.profile).toBe(profile);
    expect(result.encoding.encoding).toBe('utf-8');
  });

  it('a generated month-long wide file gives one hour per tag and local hour, each fully covered', () => {
    const tags = 5;
    let text = 'Time,' + Array.from({ length: tags }, (_, j) => `B1.XT-${j}`).join(',') + '\n';
    const start = Date.UTC(2024, 9, 1); // October, with the autumn change in Berlin on the 27th
    const rows = 31 * 24 * 60;
    for (let i = 0; i < rows; i++) {
      const d = new Date(start + i * 60_000);
      text += d.toISOString().slice(0, 19) + 'Z';
      for (let j = 0; j < tags; j++) text += ',' + ((i % 60) + j);
      text += '\n';
    }
    const { hours, result } = run(new TextEncoder().encode(text), { timeZone: 'Europe/Berlin' }, 4093);
    expect(result.report.valueCount).toBe(rows * tags);
    // 31 days of UTC minutes starting at 02:00 local: 744 UTC hours, each a distinct local hour
    expect(hours).toHaveLength(744 * tags);
    const full = hours.filter((h) => h.coveredFraction === 1);
    expect(full.length).toBe(743 * tags); // the last hour ends at its last sample (23:59Z)
    // value = minute of the UTC hour + j, linear within the hour, so every full hour has mean 29.5 + j
    for (const h of full) expect(h.mean).toBe(29.5 + Number(h.tag.slice(6)));
  });
});
