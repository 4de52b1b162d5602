/**
 * The type check: `npm run typecheck` (also a counted step of `./docker-free-start.sh test`).
 *
 *   node --import tsx scripts/typecheck.ts [--json FILE]
 *
 * Runs tsc twice, side by side: tsconfig.json must be clean everywhere, and tsconfig.index-strict.json
 * (noUncheckedIndexedAccess on) must be clean outside the numerical kernels (scripts/typecheck-rules.ts
 * names them; their errors are printed as a figure). Prints the failing errors and a summary, writes
 * the verdict to FILE when asked (the test run's summary counts it), exits 1 on failure.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { judge, report, type TscRun } from './typecheck-rules';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc', { paths: [root] });

const children = new Set<ChildProcess>();
// stopped (the test run ending early), stop both tsc runs too
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.on(signal, () => {
    for (const c of children) c.kill('SIGTERM');
    process.exit(1);
  });
}

function runTsc(project: string): Promise<TscRun> {
  const t0 = performance.now();
  return new Promise((done) => {
    const child = spawn(process.execPath, [tsc, '--noEmit', '--pretty', 'false', '-p', project], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    children.add(child);
    child.on('exit', () => children.delete(child));
    let output = '';
    child.stdout.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr.on('data', (d: Buffer) => (output += d.toString()));
    child.on('error', (e) => done({ exitCode: 1, output: `${output}\ncould not start tsc: ${e.message}`, seconds: (performance.now() - t0) / 1000 }));
    child.on('close', (code) => done({ exitCode: code, output, seconds: (performance.now() - t0) / 1000 }));
  });
}

const jsonAt = process.argv.indexOf('--json');
const jsonFile = jsonAt >= 0 ? process.argv[jsonAt + 1] : undefined;
if (jsonAt >= 0 && !jsonFile) {
  console.error('--json needs a file name');
  process.exit(2);
}

const [plainRun, strictRun] = await Promise.all([runTsc('tsconfig.json'), runTsc('tsconfig.index-strict.json')]);
const verdict = judge(plainRun, strictRun);
console.log(report(verdict, { plain: plainRun.seconds, strict: strictRun.seconds }));
if (jsonFile) {
  writeFileSync(
    jsonFile,
    JSON.stringify(
      {
        passed: verdict.passed,
        plainErrors: verdict.plain.length,
        strictErrorsOutsideKernels: verdict.strictOutside.length,
        strictErrorsInKernels: verdict.strictKernel,
        broken: verdict.broken,
        seconds: { plain: plainRun.seconds, strict: strictRun.seconds },
      },
      null,
      2,
    ),
  );
}
process.exit(verdict.passed ? 0 : 1);
