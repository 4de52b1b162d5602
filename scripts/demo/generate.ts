/**
 * The demo's historian exports: one-minute wide CSV files, one per week (Monday to Sunday, the
 * site's local clock), as Harrowgate Mills' historian writes them on its weekly schedule. Each file
 * has a names row (first cell 'Timestamp'), a descriptions row and a units row, then one row per
 * minute in local time (so the autumn repeated hour appears twice and the spring hour is missing,
 * as in a real local-time export).
 *
 * What goes in: the physics of ./plant.ts (true values), instrument noise on every tag (white,
 * standard deviation abs + rel |reading|, rounded to the tag's decimals), status words ('Shutdown'
 * for a few minutes when a unit stops, bursts of 'I/O Timeout'), a few blank cells, a few historian
 * gaps (rows missing), a transmitter that freezes, and the planted faults of the fault plan.
 * Deterministic from (start, days, seed, fault plan).
 *
 *   node --import tsx scripts/demo/generate.ts [--days 365] [--start 2025-01-06] [--seed 7] [--out folder] [--no-faults]
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { createRng } from '~/lib/analytics/rng';
import { converterFor } from '~/lib/units';
import { DemoPlant, type FaultPlan, type LocalTime, type MinuteTruth } from './plant';
import { DEMO_TAGS, DEMO_TIME_ZONE, DEMO_P_ATM_Pa, type DemoTag } from './site';

const MINUTE_ms = 60_000;
const HOUR_ms = 3_600_000;
const DAY_ms = 86_400_000;

/** Defaults of the demo: a year from Monday 6 January 2025, seed 7. */
export const DEMO_DEFAULTS = Object.freeze({ start: '2025-01-06', days: 365, seed: 7 });

export interface GenerateOptions {
  /** first local day (YYYY-MM-DD), from 00:00 site time */
  start?: string;
  /** number of days */
  days?: number;
  seed?: number;
  /** the fault plan: default (scaled to the period), changes to it, or 'none' for a healthy plant */
  faults?: Partial<FaultPlan> | 'none';
  /** leave out status words, blanks, gaps and the frozen transmitter (clean data for checks) */
  clean?: boolean;
}

/** One weekly export. */
export interface ExportFile {
  name: string;
  text: string;
  /** first and last row instants (UTC ms) */
  firstMs: number;
  lastMs: number;
  rows: number;
}

// ------------------------------------------------------------------------------------ site clock

const offsetCache = new Map<number, number>();
const fmt = new Intl.DateTimeFormat('en-GB', {
  timeZone: DEMO_TIME_ZONE,
  hourCycle: 'h23',
  year: 'numeric',
  month: '2-digit',
  day: '2-digit',
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});

/** Offset of the site's clock from UTC at an instant [ms] (London changes only on whole UTC hours). */
export function siteOffsetMs(ms: number): number {
  const hour = Math.floor(ms / HOUR_ms);
  let off = offsetCache.get(hour);
  if (off === undefined) {
    const at = hour * HOUR_ms;
    const parts = Object.fromEntries(fmt.formatToParts(new Date(at)).map((p) => [p.type, p.value]));
    const wall = Date.UTC(+parts.year!, +parts.month! - 1, +parts.day!, +parts.hour!, +parts.minute!, +parts.second!);
    off = wall - at;
    offsetCache.set(hour, off);
  }
  return off;
}

/** The UTC instant of a local wall-clock date at 00:00 on the site's clock. */
export function siteMidnightMs(date: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) throw new Error(`Give the start as YYYY-MM-DD, got '${date}'.`);
  const wall = Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!);
  let ms = wall - siteOffsetMs(wall);
  ms = wall - siteOffsetMs(ms);
  return ms;
}

/** Local wall-clock text of an instant: 'YYYY-MM-DD HH:MM:SS'. */
export function siteTimeText(ms: number): string {
  const iso = new Date(ms + siteOffsetMs(ms)).toISOString();
  return iso.slice(0, 10) + ' ' + iso.slice(11, 19);
}

const yearStart = new Map<number, number>();
function localTime(ms: number): LocalTime {
  const local = ms + siteOffsetMs(ms);
  const dayNum = Math.floor(local / DAY_ms);
  let y0 = yearStart.get(dayNum);
  if (y0 === undefined) {
    y0 = Date.UTC(new Date(local).getUTCFullYear(), 0, 1);
    yearStart.set(dayNum, y0);
  }
  const year0 = y0;
  return { hour: (local - dayNum * DAY_ms) / HOUR_ms, dow: (((dayNum + 4) % 7) + 7) % 7, doy: (local - year0) / DAY_ms };
}

// ------------------------------------------------------------------------------------ fault plan

/**
 * The default fault plan for a period, scaled from the year's plan: day 42 TG1 inspection (normal
 * operation), day 150 frozen make-up water temperature transmitter, day 238 end of the reference
 * period (baselines are fitted on the eight months before it, which see winter and summer), day 245
 * E601 fouling starts, day 266 PRV1 starts passing, day 301 TG1 efficiency step.
 */
export function defaultFaultPlan(startMs: number, days: number): FaultPlan {
  const s = days / 365;
  const startWall = startMs + siteOffsetMs(startMs);
  /** hour o'clock (site time) on the day `day` of the year's plan, scaled to the period */
  const at = (day: number, hour: number) => {
    const date = new Date(startWall + Math.max(1, Math.round(day * s)) * DAY_ms).toISOString().slice(0, 10);
    return siteMidnightMs(date) + hour * HOUR_ms;
  };
  return {
    baselineEndMs: at(238, 0),
    turbineOutage: { fromMs: at(42, 6), toMs: at(42, 6) + Math.max(0.5, 2.5 * s) * DAY_ms },
    foulingStartMs: at(245, 0),
    foulingTau_days: Math.max(1, 21 * s),
    foulingFinal: 1.3,
    valvePassingStartMs: at(266, 10.5),
    valvePassingStart_tph: 0.8,
    valvePassingEnd_tph: 1.8,
    valvePassingGrowth_days: Math.max(1, 45 * s),
    turbineStepMs: at(301, 6),
    turbineStep: 0.04,
    frozenTransmitter: { fromMs: at(150, 2), toMs: at(150, 2) + 10 * HOUR_ms },
  };
}

function noFaults(plan: FaultPlan): FaultPlan {
  return { ...plan, turbineOutage: null, foulingStartMs: null, valvePassingStartMs: null, turbineStepMs: null, frozenTransmitter: null };
}

/** The plan generateExports uses for these options. */
export function resolvePlan(opts: GenerateOptions = {}): { startMs: number; days: number; seed: number; plan: FaultPlan } {
  const start = opts.start ?? DEMO_DEFAULTS.start;
  const days = opts.days ?? DEMO_DEFAULTS.days;
  const seed = opts.seed ?? DEMO_DEFAULTS.seed;
  if (!(Number.isInteger(days) && days >= 1 && days <= 3660)) throw new Error(`days must be a whole number from 1 to 3660, got ${days}.`);
  const startMs = siteMidnightMs(start);
  const base = defaultFaultPlan(startMs, days);
  const plan = opts.faults === 'none' ? noFaults(base) : { ...base, ...(opts.faults ?? {}) };
  return { startMs, days, seed, plan };
}

/** The weekly file names generateExports writes for these options, in order (no physics run). */
export function plannedFileNames(opts: GenerateOptions = {}): string[] {
  const { startMs, days } = resolvePlan(opts);
  const startWall = startMs + siteOffsetMs(startMs);
  const names: string[] = [];
  for (let d = 0; d < days; d++) {
    const wall = startWall + d * DAY_ms;
    const dow = (((Math.floor(wall / DAY_ms) + 4) % 7) + 7) % 7;
    if (d === 0 || dow === 1) names.push(`HM_weekly_${new Date(wall).toISOString().slice(0, 10)}.csv`);
  }
  return names;
}

// ------------------------------------------------------------------------------------ writing

const POW10 = [1, 10, 100, 1000, 10000, 100000];
const ZEROS = ['0', '0.0', '0.00', '0.000', '0.0000', '0.00000'];
/** x with d decimals (0..5), rounded half away from zero, never '-0'. */
export function fixed(x: number, d: number): string {
  const n = Math.round(Math.abs(x) * POW10[d]!);
  if (n === 0) return ZEROS[d]!;
  let s = String(n);
  if (d > 0) {
    while (s.length <= d) s = '0' + s;
    s = s.slice(0, s.length - d) + '.' + s.slice(s.length - d);
  }
  return x < 0 ? '-' + s : s;
}

interface Column {
  tag: DemoTag;
  fromSI: (x: number) => number;
}

function columns(): Column[] {
  return DEMO_TAGS.map((tag) => {
    if (tag.quantity === 'ratio' || tag.quantity === 'speed') return { tag, fromSI: (x: number) => x };
    const c = converterFor(tag.unit, tag.quantity, { p_atm_Pa: DEMO_P_ATM_Pa });
    return { tag, fromSI: c.fromSI };
  });
}

/** Header rows: names, descriptions, units (the layout the ingest recognises without questions). */
export function headerText(): string {
  const q = (s: string) => (/[",]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  return (
    ['Timestamp', ...DEMO_TAGS.map((t) => q(t.tag))].join(',') +
    '\r\n' +
    ['', ...DEMO_TAGS.map((t) => q(t.description))].join(',') +
    '\r\n' +
    ['', ...DEMO_TAGS.map((t) => q(t.unit))].join(',') +
    '\r\n'
  );
}

interface DayEvents {
  io: { col: number; fromMin: number; toMin: number } | null;
  gap: { fromMin: number; toMin: number } | null;
  blanks: { col: number; min: number }[];
}

/** Days between historian gaps, and the day of the first. */
export const GAP_EVERY_DAYS = 21;
export const FIRST_GAP_DAY = 9;

/**
 * Data-quality events of one day (a fixed number of draws per day): an 'I/O Timeout' burst on one
 * tag on about three days in ten, a historian gap (20 to 90 minutes without rows) every three weeks,
 * and now and then a blank cell.
 */
function dayEvents(rng: ReturnType<typeof createRng>, day: number, nCols: number, clean: boolean): DayEvents {
  const u = Array.from({ length: 12 }, () => rng.uniform());
  if (clean) return { io: null, gap: null, blanks: [] };
  const io = u[0]! < 0.3 ? { col: Math.floor(u[1]! * nCols), fromMin: Math.floor(u[2]! * 1440), toMin: 0 } : null;
  if (io) io.toMin = io.fromMin + 2 + Math.floor(u[3]! * 9);
  const gap = day % GAP_EVERY_DAYS === FIRST_GAP_DAY ? { fromMin: Math.floor(u[5]! * 1350), toMin: 0 } : null;
  if (gap) gap.toMin = gap.fromMin + 20 + Math.floor(u[6]! * 70);
  const blanks = [0, 1].filter((i) => u[7 + 2 * i]! < 0.5).map((i) => ({ col: Math.floor(u[8 + 2 * i]! * nCols), min: Math.floor(u[11]! * 1440 * (i + 1)) % 1440 }));
  return { io, gap, blanks };
}

/**
 * The weekly exports of a period, in order. Each file is built in memory (a week is about 4 MB).
 * The optional `onMinute` sees every minute's true values (tests compare them with the files).
 */
export function* generateExports(opts: GenerateOptions = {}, onMinute?: (ms: number, truth: MinuteTruth) => void): Generator<ExportFile> {
  const { startMs, days, seed, plan } = resolvePlan(opts);
  const clean = opts.clean ?? false;
  const plant = new DemoPlant(seed, plan);
  const noise = createRng((seed * 2654435761) >>> 0);
  const events = createRng((seed * 40503 + 12345) >>> 0);
  const cols = columns();
  const n = cols.length;
  const muIdx = DEMO_TAGS.findIndex((t) => t.key === 'da.mu.T');
  const header = headerText();
  // exact end: the site's midnight after the last day (DST changes make days 23 or 25 h)
  const endLocal = new Date(startMs + siteOffsetMs(startMs) + days * DAY_ms).toISOString().slice(0, 10);
  const stopMs = siteMidnightMs(endLocal);
  const col = (k: string) => 1 + DEMO_TAGS.findIndex((t) => t.key === k);
  const C = { acW: col('ac1.W'), acV: col('ac1.V'), loop: col('e601.loop.m'), tgW: col('tg1.W') };

  let rows: string[] = [];
  let fileFirst = NaN;
  let fileLast = NaN;
  let fileName = '';
  const lastText: string[] = new Array(n).fill('');
  const cells: string[] = new Array(n + 1);
  let prev: MinuteTruth | null = null;
  const shutdownLeft = { ac: 0, loop: 0, tg: 0 };
  let evDay = -1;
  let ev: DayEvents = { io: null, gap: null, blanks: [] };

  const flush = (): ExportFile | null => {
    if (!rows.length) return null;
    const file = { name: fileName, text: header + rows.join(''), firstMs: fileFirst, lastMs: fileLast, rows: rows.length };
    rows = [];
    return file;
  };

  for (let ms = startMs; ms < stopMs; ms += MINUTE_ms) {
    const lt = localTime(ms);
    const truth = plant.step(ms, lt);
    onMinute?.(ms, truth);
    // new week file on Monday 00:00 local
    if (lt.dow === 1 && lt.hour === 0 && rows.length) {
      const f = flush();
      if (f) yield f;
    }
    if (!rows.length) {
      fileFirst = ms;
      fileName = `HM_weekly_${siteTimeText(ms).slice(0, 10)}.csv`;
    }
    const dayIdx = Math.floor((ms - startMs) / DAY_ms);
    if (dayIdx !== evDay) {
      evDay = dayIdx;
      ev = dayEvents(events, dayIdx, n, clean);
    }
    const minOfDay = Math.floor((ms - startMs - dayIdx * DAY_ms) / MINUTE_ms);

    if (prev && !clean) {
      if (prev.compressorRunning && !truth.compressorRunning) shutdownLeft.ac = 3;
      if (prev.loopRunning && !truth.loopRunning) shutdownLeft.loop = 2;
      if (prev.tgRunning && !truth.tgRunning) shutdownLeft.tg = 3;
    }
    prev = truth;
    const frozen = !clean && plan.frozenTransmitter !== null && ms >= plan.frozenTransmitter.fromMs && ms < plan.frozenTransmitter.toMs;

    // instrument noise: one draw per tag per minute, always
    cells[0] = siteTimeText(ms);
    for (let i = 0; i < n; i++) {
      const c = cols[i]!;
      const z = noise.normal();
      const reading = c.fromSI(truth.values[i]!);
      const sd = c.tag.noise.abs + (c.tag.noise.rel ?? 0) * Math.abs(reading);
      let text = fixed(reading + sd * z, c.tag.decimals);
      if (i === muIdx && frozen && lastText[i]) text = lastText[i]!;
      lastText[i] = text;
      cells[i + 1] = text;
    }
    if (!clean) {
      if (shutdownLeft.ac > 0) {
        cells[C.acW] = 'Shutdown';
        cells[C.acV] = 'Shutdown';
        shutdownLeft.ac--;
      }
      if (shutdownLeft.loop > 0) {
        cells[C.loop] = 'Shutdown';
        shutdownLeft.loop--;
      }
      if (shutdownLeft.tg > 0) {
        cells[C.tgW] = 'Shutdown';
        shutdownLeft.tg--;
      }
      if (ev.io && minOfDay >= ev.io.fromMin && minOfDay < ev.io.toMin) cells[ev.io.col + 1] = 'I/O Timeout';
      for (const b of ev.blanks) if (b.min === minOfDay) cells[b.col + 1] = '';
      if (ev.gap && minOfDay >= ev.gap.fromMin && minOfDay < ev.gap.toMin) continue; // historian gap: no row
    }
    rows.push(cells.join(',') + '\r\n');
    fileLast = ms;
  }
  const f = flush();
  if (f) yield f;
}

/** Writes the exports of a period into a folder; returns the file names in order. */
export function writeExports(folder: string, opts: GenerateOptions = {}): string[] {
  mkdirSync(folder, { recursive: true });
  const names: string[] = [];
  for (const f of generateExports(opts)) {
    writeFileSync(join(folder, f.name), f.text);
    names.push(f.name);
  }
  return names;
}

function argValue(args: string[], name: string): string | undefined {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  const out = argValue(args, '--out') ?? 'demo-exports';
  const opts: GenerateOptions = {
    days: argValue(args, '--days') ? Number(argValue(args, '--days')) : undefined,
    start: argValue(args, '--start'),
    seed: argValue(args, '--seed') ? Number(argValue(args, '--seed')) : undefined,
    faults: args.includes('--no-faults') ? 'none' : undefined,
  };
  const t0 = performance.now();
  const names = writeExports(out, opts);
  console.log(`[demo] ${names.length} weekly exports in ${out} (${((performance.now() - t0) / 1000).toFixed(1)} s)`);
}
