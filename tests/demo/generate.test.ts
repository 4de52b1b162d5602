/**
 * The demo exports look like a plant's scheduled weekly exports: deterministic from the seed, wide
 * CSV with names, descriptions and units rows, one row per minute of the site's local clock (DST
 * included), and the data-quality troubles of real exports.
 */
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { defaultFaultPlan, FIRST_GAP_DAY, fixed, generateExports, siteMidnightMs, siteTimeText } from '../../scripts/demo/generate';
import { DEMO_TAGS, tagOf } from '../../scripts/demo/site';
import { DAY_ms, generate, HOUR_ms, Hours, rows } from './support';

const digest = (files: { name: string; text: string }[]) => createHash('sha256').update(files.map((f) => f.name + f.text).join('|')).digest('hex');

describe('the demo export files', () => {
  it('self-consistency: the same options give the same bytes; another seed gives other bytes', () => {
    const a = [...generateExports({ start: '2025-02-03', days: 2, seed: 5 })];
    const b = [...generateExports({ start: '2025-02-03', days: 2, seed: 5 })];
    const c = [...generateExports({ start: '2025-02-03', days: 2, seed: 6 })];
    expect(digest(a)).toBe(digest(b));
    expect(digest(a)).not.toBe(digest(c));
  });

  it('self-consistency: one file per local week (Monday 00:00 to Sunday 23:59), one row per minute', () => {
    // Wednesday 8 January 2025 for nine days: Wed-Sun, then Mon-Thu
    const files = [...generateExports({ start: '2025-01-08', days: 9, clean: true })];
    expect(files.map((f) => f.name)).toEqual(['HM_weekly_2025-01-08.csv', 'HM_weekly_2025-01-13.csv']);
    expect(files.map((f) => f.rows)).toEqual([5 * 1440, 4 * 1440]);
    const r0 = rows(files[0]!);
    const r1 = rows(files[1]!);
    expect(r0[0]!.time).toBe('2025-01-08 00:00:00');
    expect(r0.at(-1)!.time).toBe('2025-01-12 23:59:00');
    expect(r1[0]!.time).toBe('2025-01-13 00:00:00');
    expect(r1.at(-1)!.time).toBe('2025-01-16 23:59:00');
    const [names, descriptions, units] = files[0]!.text.split('\r\n');
    expect(names!.split(',')).toEqual(['Timestamp', ...DEMO_TAGS.map((t) => t.tag)]);
    expect(descriptions!.split(',').length).toBeGreaterThanOrEqual(DEMO_TAGS.length + 1); // one description holds a quoted comma
    expect(units!.split(',')).toEqual(['', ...DEMO_TAGS.map((t) => t.unit)]);
  });

  it('self-consistency: local time through the clock changes (23-hour spring day, 25-hour autumn day with the hour twice)', () => {
    const spring = [...generateExports({ start: '2025-03-29', days: 2, clean: true })];
    expect(spring.reduce((n, f) => n + f.rows, 0)).toBe(1440 + 1380);
    const springTimes = spring.flatMap((f) => rows(f).map((r) => r.time));
    expect(springTimes).toContain('2025-03-30 00:59:00');
    expect(springTimes).not.toContain('2025-03-30 01:30:00');
    expect(springTimes).toContain('2025-03-30 02:00:00');

    const autumn = [...generateExports({ start: '2025-10-25', days: 2, clean: true })];
    expect(autumn.reduce((n, f) => n + f.rows, 0)).toBe(1440 + 1500);
    const autumnTimes = autumn.flatMap((f) => rows(f).map((r) => r.time));
    expect(autumnTimes.filter((t) => t === '2025-10-26 01:30:00')).toHaveLength(2);
    // the ingest core reads both days as 24 + 25 hours of the site's clock
    const hours = new Hours(autumn);
    expect(hours.hourStarts()).toHaveLength(49);
  });

  it('self-consistency: siteMidnightMs and siteTimeText agree with the Europe/London offsets (GMT in winter, BST in summer)', () => {
    expect(new Date(siteMidnightMs('2025-01-06')).toISOString()).toBe('2025-01-06T00:00:00.000Z');
    expect(new Date(siteMidnightMs('2025-07-01')).toISOString()).toBe('2025-06-30T23:00:00.000Z');
    expect(siteTimeText(Date.parse('2025-07-01T11:15:00Z'))).toBe('2025-07-01 12:15:00');
    expect(fixed(-0.004, 2)).toBe('0.00');
    expect(fixed(-1.005, 1)).toBe('-1.0');
    expect(fixed(12.345, 0)).toBe('12');
  });

  it('self-consistency: real-export troubles are there: status words, blanks, a historian gap, a frozen transmitter', () => {
    const days = 14;
    const { files } = generate({ start: '2025-01-06', days, seed: 7 });
    const all = files.flatMap(rows);
    // a gap every three weeks from day FIRST_GAP_DAY: rows are missing that day
    expect(all.length).toBeLessThan(days * 1440);
    const gapDay = new Date(siteMidnightMs('2025-01-06') + FIRST_GAP_DAY * DAY_ms).toISOString().slice(0, 10);
    expect(all.filter((r) => r.time.startsWith(gapDay)).length).toBeLessThan(1440 - 19);
    const cells = all.flatMap((r) => [...r.cells.values()]);
    expect(cells.filter((c) => c === 'I/O Timeout').length).toBeGreaterThan(0);
    expect(cells.filter((c) => c === '').length).toBeGreaterThan(0);
    // AC1 stops at Sunday 00:00: its power and flow cells say 'Shutdown' for the first minutes
    const sunday = all.find((r) => r.time === '2025-01-12 00:00:00')!;
    expect(sunday.cells.get(tagOf('ac1.W').tag)).toBe('Shutdown');
    expect(sunday.cells.get(tagOf('ac1.V').tag)).toBe('Shutdown');
    // the make-up water transmitter freezes: the ingest flags the hours as flatline
    const plan = defaultFaultPlan(siteMidnightMs('2025-01-06'), days);
    const frozen = plan.frozenTransmitter!;
    const hours = new Hours(files);
    const flat = hours.hourStarts().filter((h) => hours.stat('da.mu.T', h)?.flatline);
    expect(flat.length).toBeGreaterThan(3);
    for (const h of flat) {
      expect(h).toBeGreaterThanOrEqual(frozen.fromMs);
      expect(h).toBeLessThan(frozen.toMs);
    }
    expect(hours.hourStarts().filter((h) => hours.stat('ac1.W', h)?.flatline)).toEqual([]);
    // every file is read without a blocking question (Hours throws otherwise) and with all tags
    expect(hours.byTag.size).toBe(DEMO_TAGS.length);
    expect(HOUR_ms).toBe(3_600_000);
  });

  it('self-consistency: docs/demo.md gives the planted faults at the dates of the default year', () => {
    const doc = readFileSync('docs/demo.md', 'utf8');
    const plan = defaultFaultPlan(siteMidnightMs('2025-01-06'), 365);
    const when = (ms: number) => siteTimeText(ms).slice(0, 16);
    for (const ms of [plan.baselineEndMs, plan.turbineOutage!.fromMs, plan.foulingStartMs!, plan.valvePassingStartMs!, plan.turbineStepMs!, plan.frozenTransmitter!.fromMs]) {
      expect(doc).toContain(when(ms));
    }
  });
});
