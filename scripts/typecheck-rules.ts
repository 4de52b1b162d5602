/**
 * What the type check (scripts/typecheck.ts) accepts, apart from running tsc so that it can be tested.
 *
 * Two runs of tsc: tsconfig.json must be clean everywhere; tsconfig.index-strict.json (the same with
 * noUncheckedIndexedAccess) must be clean outside the numerical kernels. The kernels index their
 * arrays in hot loops whose bounds they check themselves; their errors under the flag are counted and
 * printed as a figure, never a failure.
 */

/** Folders whose errors under noUncheckedIndexedAccess are counted, not failures (relative to the root, `/`). */
export const INDEX_STRICT_EXEMPT = ['src/lib/thermo', 'src/lib/equipment', 'src/lib/analytics'] as const;

export interface TscError {
  /** file relative to the project root with `/` separators, or null for an error of no file */
  file: string | null;
  line: number | null;
  code: string;
  /** the error's text, continuation lines included */
  text: string;
}

/** One tsc run as it ended. */
export interface TscRun {
  /** exit code, or null when killed by a signal */
  exitCode: number | null;
  output: string;
  seconds: number;
}

const FILE_ERROR = /^(.+?)\((\d+),(\d+)\): error (TS\d+): /;
const GLOBAL_ERROR = /^error (TS\d+): /;

/** The errors of tsc's plain output (`--pretty false`): one a line, indented lines continue the previous. */
export function parseTscOutput(output: string): TscError[] {
  const errors: TscError[] = [];
  for (const raw of output.split(/\r?\n/)) {
    const file = FILE_ERROR.exec(raw);
    const global = file ? null : GLOBAL_ERROR.exec(raw);
    if (file) {
      errors.push({ file: file[1]!.replace(/\\/g, '/').replace(/^\.\//, ''), line: Number(file[2]), code: file[4]!, text: raw });
    } else if (global) {
      errors.push({ file: null, line: null, code: global[1]!, text: raw });
    } else if (/^\s/.test(raw) && raw.trim() !== '' && errors.length > 0) {
      errors[errors.length - 1]!.text += '\n' + raw;
    }
  }
  return errors;
}

/** The exempt folder a file lies in, or null. */
export function exemptFolder(file: string | null, exempt: readonly string[] = INDEX_STRICT_EXEMPT): string | null {
  if (file === null) return null;
  return exempt.find((dir) => file === dir || file.startsWith(dir + '/')) ?? null;
}

export interface TypecheckVerdict {
  passed: boolean;
  /** errors of tsconfig.json (every one fails) */
  plain: TscError[];
  /** errors of the strict run outside the exempt folders (every one fails) */
  strictOutside: TscError[];
  /** errors of the strict run per exempt folder (a figure) */
  strictKernel: Record<string, number>;
  /** a run that failed without listing an error (crash, killed, bad option) */
  broken: string[];
}

/** Judges the two runs. */
export function judge(plainRun: TscRun, strictRun: TscRun, exempt: readonly string[] = INDEX_STRICT_EXEMPT): TypecheckVerdict {
  const plain = parseTscOutput(plainRun.output);
  const strict = parseTscOutput(strictRun.output);
  const strictKernel: Record<string, number> = Object.fromEntries(exempt.map((d) => [d, 0]));
  const strictOutside: TscError[] = [];
  for (const e of strict) {
    const dir = exemptFolder(e.file, exempt);
    if (dir === null) strictOutside.push(e);
    else strictKernel[dir] = (strictKernel[dir] ?? 0) + 1;
  }
  const broken: string[] = [];
  const brokenRun = (name: string, run: TscRun, errors: TscError[]) => {
    if (run.exitCode !== 0 && errors.length === 0) {
      const tail = run.output.trim().split(/\r?\n/).slice(-5).join('\n');
      broken.push(`${name}: tsc ended with ${run.exitCode === null ? 'a signal' : `code ${run.exitCode}`} without listing an error${tail ? `:\n${tail}` : ''}`);
    }
  };
  brokenRun('tsconfig.json', plainRun, plain);
  brokenRun('tsconfig.index-strict.json', strictRun, strict);
  return { passed: plain.length === 0 && strictOutside.length === 0 && broken.length === 0, plain, strictOutside, strictKernel, broken };
}

const plural = (n: number, one: string, many = one + 's') => `${n} ${n === 1 ? one : many}`;

/** ` (in src/lib/ingest 3, tests/thermo 1)`: where errors are, by their file's first three folders; empty for none. */
function byFolder(errors: readonly TscError[]): string {
  if (errors.length === 0) return '';
  const counts = new Map<string, number>();
  for (const e of errors) {
    const key = e.file === null ? '(no file)' : e.file.split('/').slice(0, -1).slice(0, 3).join('/') || '.';
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return ` (in ${[...counts].map(([k, n]) => `${k} ${n}`).join(', ')})`;
}

/** The printed report: the failing errors (at most `limit` of each run), then the summary lines. */
export function report(v: TypecheckVerdict, seconds: { plain: number; strict: number }, limit = 100): string {
  const out: string[] = [];
  const list = (title: string, errors: TscError[]) => {
    if (errors.length === 0) return;
    out.push(title);
    for (const e of errors.slice(0, limit)) out.push('  ' + e.text.replace(/\n/g, '\n  '));
    if (errors.length > limit) out.push(`  ... and ${errors.length - limit} more`);
  };
  list('errors of tsconfig.json:', v.plain);
  list('errors under noUncheckedIndexedAccess outside the numerical kernels (tsconfig.index-strict.json):', v.strictOutside);
  for (const b of v.broken) out.push(b);
  const kernelTotal = Object.values(v.strictKernel).reduce((a, b) => a + b, 0);
  const perFolder = Object.entries(v.strictKernel).map(([d, n]) => `${d} ${n}`).join(', ');
  out.push(`type check, tsconfig.json: ${plural(v.plain.length, 'error')}${byFolder(v.plain)} (${seconds.plain.toFixed(0)} s)`);
  out.push(
    `type check, noUncheckedIndexedAccess: ${plural(v.strictOutside.length, 'error')}${byFolder(v.strictOutside)} outside the numerical kernels; ` +
      `${plural(kernelTotal, 'error')} inside them, counted, not failures (${perFolder}) (${seconds.strict.toFixed(0)} s)`,
  );
  out.push(`type check ${v.passed ? 'passed' : 'FAILED'}`);
  return out.join('\n');
}
