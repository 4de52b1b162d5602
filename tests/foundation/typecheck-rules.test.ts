/**
 * The rules of the type check (scripts/typecheck.ts) on hand-written tsc output (the plain format of
 * `tsc --pretty false`: `file(line,col): error TSnnnn: text`, continuation lines indented).
 */
import { describe, expect, it } from 'vitest';
import { INDEX_STRICT_EXEMPT, exemptFolder, judge, parseTscOutput, report, type TscRun } from '../../scripts/typecheck-rules';

const clean: TscRun = { exitCode: 0, output: '', seconds: 30 };
const failed = (output: string): TscRun => ({ exitCode: 2, output, seconds: 30 });

const KERNEL_ERRORS = [
  "src/lib/thermo/water/region3.ts(120,17): error TS2532: Object is possibly 'undefined'.",
  "src/lib/thermo/gas.ts(44,9): error TS2345: Argument of type 'number | undefined' is not assignable to parameter of type 'number'.",
  "src/lib/analytics/uncertainty.ts(80,5): error TS2532: Object is possibly 'undefined'.",
].join('\n');

describe('type check rules', () => {
  it('the exempt folders are the three numerical kernels and nothing else', () => {
    expect([...INDEX_STRICT_EXEMPT].sort()).toEqual(['src/lib/analytics', 'src/lib/equipment', 'src/lib/thermo']);
  });

  it('parses file errors, errors of no file and continuation lines', () => {
    const out = [
      "tests/a.test.ts(3,7): error TS2322: Type 'string' is not assignable to type 'number'.",
      "src\\lib\\ingest\\csv.ts(10,2): error TS2345: Argument of type '{ a: number; }' is not assignable to parameter of type 'B'.",
      "  Property 'b' is missing in type '{ a: number; }' but required in type 'B'.",
      "error TS5083: Cannot read file '/x/tsconfig.base.json'.",
      '',
      'Found 3 errors.',
    ].join('\n');
    const errors = parseTscOutput(out);
    expect(errors.map((e) => [e.file, e.line, e.code])).toEqual([
      ['tests/a.test.ts', 3, 'TS2322'],
      ['src/lib/ingest/csv.ts', 10, 'TS2345'],
      [null, null, 'TS5083'],
    ]);
    expect(errors[1]?.text).toContain("Property 'b' is missing");
  });

  it('a file is exempt only inside a kernel folder, not in a folder whose name merely starts alike', () => {
    expect(exemptFolder('src/lib/thermo/water/region1.ts')).toBe('src/lib/thermo');
    expect(exemptFolder('src/lib/equipment/index.ts')).toBe('src/lib/equipment');
    expect(exemptFolder('src/lib/thermodynamics/x.ts')).toBeNull();
    expect(exemptFolder('src/lib/ingest/csv.ts')).toBeNull();
    expect(exemptFolder('tests/thermo/gas.test.ts')).toBeNull();
    expect(exemptFolder(null)).toBeNull();
  });

  it('passes with both runs clean, and with errors under the flag only inside the kernels (counted per folder)', () => {
    expect(judge(clean, clean).passed).toBe(true);
    const v = judge(clean, failed(KERNEL_ERRORS));
    expect(v.passed).toBe(true);
    expect(v.strictKernel).toEqual({ 'src/lib/thermo': 2, 'src/lib/equipment': 0, 'src/lib/analytics': 1 });
    const text = report(v, { plain: 31, strict: 35 });
    expect(text).toContain('noUncheckedIndexedAccess: 0 errors outside the numerical kernels; 3 errors inside them');
    expect(text).toContain('src/lib/thermo 2, src/lib/equipment 0, src/lib/analytics 1');
    expect(text.split('\n').at(-1)).toBe('type check passed');
  });

  it('fails on an error under the flag outside the kernels (ingest, say) and lists it', () => {
    const ingest = "src/lib/ingest/aggregate.ts(200,11): error TS18048: 'prev' is possibly 'undefined'.";
    const v = judge(clean, failed(KERNEL_ERRORS + '\n' + ingest));
    expect(v.passed).toBe(false);
    expect(v.strictOutside.map((e) => e.file)).toEqual(['src/lib/ingest/aggregate.ts']);
    const text = report(v, { plain: 31, strict: 35 });
    expect(text).toContain(ingest);
    expect(text).toContain('noUncheckedIndexedAccess: 1 error (in src/lib/ingest 1) outside the numerical kernels');
    expect(text.split('\n').at(-1)).toBe('type check FAILED');
  });

  it('fails on any error of tsconfig.json, kernels included', () => {
    const v = judge(failed("src/lib/thermo/gas.ts(1,1): error TS2304: Cannot find name 'x'."), clean);
    expect(v.passed).toBe(false);
    expect(v.plain).toHaveLength(1);
    expect(report(v, { plain: 1, strict: 1 })).toContain('type check, tsconfig.json: 1 error (in src/lib/thermo 1) (1 s)');
  });

  it('fails on a run that ended badly without listing an error (a crash or a signal)', () => {
    const crashed = judge(clean, { exitCode: 134, output: 'FATAL ERROR: Reached heap limit', seconds: 9 });
    expect(crashed.passed).toBe(false);
    expect(crashed.broken).toEqual(['tsconfig.index-strict.json: tsc ended with code 134 without listing an error:\nFATAL ERROR: Reached heap limit']);
    const killed = judge({ exitCode: null, output: '', seconds: 9 }, clean);
    expect(killed.passed).toBe(false);
    expect(killed.broken[0]).toMatch(/^tsconfig\.json: tsc ended with a signal/);
  });

  it('lists at most the limit of errors and says how many more', () => {
    const many = Array.from({ length: 5 }, (_, i) => `tests/x.test.ts(${i + 1},1): error TS2532: Object is possibly 'undefined'.`).join('\n');
    const text = report(judge(clean, failed(many)), { plain: 1, strict: 1 }, 2);
    expect(text).toContain('tests/x.test.ts(2,1)');
    expect(text).not.toContain('tests/x.test.ts(3,1)');
    expect(text).toContain('... and 3 more');
  });
});
