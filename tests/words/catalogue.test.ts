/**
 * The word catalogue (src/lib/words) has an entry for every code and identifier that Lossline keeps:
 * the codes are read from their source lists (union types and const lists in the source files, the
 * engine's `code: '...'` literals and `extras` keys), so a new code without words fails here.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ERROR_CODES } from '~/server/errors';
import { UPLOAD_STATUSES } from '~/server/db/ingest-schema';
import { INGEST_ERROR_CODES } from '~/lib/ingest/errors';
import { FLUID_KINDS, UNIT_KINDS } from '~/lib/kinds';
import { LINK_QUANTITY_NAMES, kindSpec } from '~/lib/plant/kinds';
import { HOUR_STATES } from '~/lib/hour-states';
import { quantities } from '~/lib/units/quantities';
import { ALL_TERMS } from '~/components/insight/baselines/types';
import { CODE_PATTERN, findCode, inputWords, labelOf, wordsFor } from '~/lib/words';

const src = (p: string) => readFileSync(join(__dirname, '../../src', p), 'utf8');
const filesUnder = (dir: string): string[] =>
  readdirSync(join(__dirname, '../../src', dir), { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? filesUnder(`${dir}/${e.name}`) : e.name.endsWith('.ts') ? [`${dir}/${e.name}`] : []));

/** The string literals of an exported union type `export type Name = | 'A' | 'B';`. */
function unionOf(file: string, name: string): string[] {
  const m = new RegExp(`export type ${name} =([^;]+);`).exec(src(file));
  if (!m) throw new Error(`no type ${name} in ${file}`);
  return [...m[1]!.matchAll(/'([^']+)'/g)].map((x) => x[1]!);
}

const sourceLists: [string, string[]][] = [
  ['hour reasons (analytics/steady.ts)', unionOf('lib/analytics/steady.ts', 'HourReasonCode')],
  ['missing items (plant/status.ts)', unionOf('lib/plant/status.ts', 'MissingCode')],
  ['conflicts (plant/status.ts)', unionOf('lib/plant/status.ts', 'ConflictCode')],
  ['unit errors (units/errors.ts)', unionOf('lib/units/errors.ts', 'UnitErrorCode')],
  ['ingest warnings (ingest/reader-types.ts)', unionOf('lib/ingest/reader-types.ts', 'IngestWarningCode')],
  ['balance refusals (equipment/errors.ts)', [...src('lib/equipment/errors.ts').matchAll(/\| '([A-Z_]+)'/g)].map((m) => m[1]!)],
  ['notice statuses (notice-view.ts)', unionOf('lib/notice-view.ts', 'NoticeStatus')],
  ['notice kinds (notice-view.ts)', unionOf('lib/notice-view.ts', 'NoticeKind')],
  ['notice lives (notice-view.ts)', unionOf('lib/notice-view.ts', 'NoticeLife')],
  ['notice trends (notice-view.ts)', unionOf('lib/notice-view.ts', 'NoticeTrend')],
  ['close outcomes (notice-view.ts)', unionOf('lib/notice-view.ts', 'CloseOutcome')],
  ['prior reasons (notice-view.ts)', unionOf('lib/notice-view.ts', 'PriorReason')],
  ['port directions (plant/kind-spec.ts)', unionOf('lib/plant/kind-spec.ts', 'PortRole')],
  ['baseline terms', [...ALL_TERMS, 'intercept']],
  ['API error codes (server/errors.ts)', [...ERROR_CODES]],
  ['ingest errors (ingest/errors.ts)', [...INGEST_ERROR_CODES]],
  ['upload states (db/ingest-schema.ts)', [...UPLOAD_STATUSES]],
  ['hour states', [...HOUR_STATES]],
  ['unit kinds', [...UNIT_KINDS]],
  ['port slots', UNIT_KINDS.flatMap((k) => kindSpec(k).ports.map((s) => s.slot))],
  ['parameters with a unit suffix or a compound name', UNIT_KINDS.flatMap((k) => kindSpec(k).params.map((p) => p.key)).filter((k) => /_|[a-z][A-Z]/.test(k))],
  ['fluids', [...FLUID_KINDS]],
  ['link quantities', [...LINK_QUANTITY_NAMES]],
  ['quantities of units', Object.keys(quantities)],
];

/** Codes the engine and equipment write as literals: `code: 'X'` and `new BalanceInputError('X'`. */
function literalCodes(): string[] {
  const out = new Set<string>();
  for (const f of [...filesUnder('lib/engine'), ...filesUnder('lib/equipment'), ...filesUnder('lib/analytics'), ...filesUnder('lib/plant')]) {
    const text = src(f);
    for (const m of text.matchAll(/code: '([A-Z][A-Z0-9_]+)'/g)) out.add(m[1]!);
    for (const m of text.matchAll(/Error\('([A-Z][A-Z0-9_]+)'/g)) out.add(m[1]!);
  }
  return [...out];
}

/** Identifiers of the balance's companions: `extras.x = ` and the keys of `extras: { ... }`. */
function extrasKeys(): string[] {
  const out = new Set<string>();
  for (const f of filesUnder('lib/equipment')) {
    const text = src(f);
    for (const m of text.matchAll(/extras\.([A-Za-z_]+) =/g)) out.add(m[1]!);
    for (const m of text.matchAll(/extras(?::\s*Record<[^>]*>)?\s*[:=]\s*\{([^}]*)\}/g)) for (const k of m[1]!.matchAll(/([A-Za-z_][A-Za-z0-9_]*):/g)) out.add(k[1]!);
  }
  return [...out];
}

describe('the word catalogue', () => {
  it.each(sourceLists)('self-consistency: every code of %s has words', (_what, codes) => {
    expect(codes.length).toBeGreaterThan(0);
    expect(codes.filter((c) => !wordsFor(c))).toEqual([]);
  });

  it('self-consistency: every code the engine and the plant model write as a literal has words', () => {
    const codes = literalCodes();
    expect(codes).toContain('SPREAD_HIGH');
    expect(codes.filter((c) => !wordsFor(c))).toEqual([]);
  });

  it('self-consistency: every companion figure of the balances has words and a quantity', () => {
    const keys = extrasKeys();
    expect(keys).toContain('shaftPower_W');
    expect(keys.filter((k) => !wordsFor(k))).toEqual([]);
    expect(wordsFor('shaftPower_W')!.quantity).toBe('power');
    expect(wordsFor('isentropicEfficiency')!.quantity).toBe('ratio');
  });

  it('self-consistency: no label is itself a code, and every sentence ends with a full stop', () => {
    for (const [, codes] of sourceLists)
      for (const c of codes) {
        const e = wordsFor(c)!;
        expect(findCode(e.label), `${c}: ${e.label}`).toBeNull();
        expect(e.sentence, c).toMatch(/[.]$/);
      }
  });

  it('self-consistency: entries of the input vector read as words with their port', () => {
    expect(inputWords('steam in.T_K')).toEqual({ label: 'steam in: temperature', quantity: 'temperature' });
    expect(inputWords('generatorEfficiency').label).toBe('generator efficiency');
    expect(inputWords('exhaust.mDot_kg_per_s').quantity).toBe('massFlow');
    expect(labelOf('NOT_A_CODE_AT_ALL')).toBe('other');
  });
});

describe('CODE_PATTERN', () => {
  it.each([
    'Why: SPREAD_HIGH spread 5.0 %',
    'shaftPower_W 1234',
    'isentropicEfficiency 0.81',
    'mDot_kg_per_s',
    'Inlet (in, 1..1)',
    'Extraction 0..n',
    'Value [SI]',
    'coefficient -9.19541e-12',
    'state: read-with-problems',
    'kind heat-exchanger',
    'TAG_POOR_COVERAGE',
    'load*T_amb',
  ])('self-consistency: finds a code in "%s"', (text) => {
    expect(CODE_PATTERN.test(text)).toBe(true);
  });

  it.each([
    'Tag HM_HP_TI202 at 412.5 kW ± 18 kW',
    'Flue gas (stack) of the boiler at 2025-05-12 10:00 (Europe/London)',
    'The hour is unsettled: spread too wide.',
    'Report for HM_weekly_2025-05-12.csv',
    'exergy efficiency P / F 71.3 %',
    'inputs 3e4a91f0',
    'Motor / generator, flue-gas side',
  ])('self-consistency: leaves words alone in "%s"', (text) => {
    expect(findCode(text)).toBeNull();
  });
});
