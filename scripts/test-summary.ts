/** Reads the type check's verdict and the vitest and Playwright JSON reports of a test run and prints the closing line. */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const dir = process.argv[2] ?? '.test-data';
let passed = 0;
let failed = 0;
const notes: string[] = [];

// The type check (scripts/typecheck.ts) counts as one test.
const typecheckFile = join(dir, 'typecheck.json');
if (existsSync(typecheckFile)) {
  const t = JSON.parse(readFileSync(typecheckFile, 'utf8'));
  if (t.passed === true) passed += 1;
  else {
    failed += 1;
    notes.push(`type check failed: ${t.plainErrors ?? '?'} error(s) of tsconfig.json, ${t.strictErrorsOutsideKernels ?? '?'} under noUncheckedIndexedAccess outside the numerical kernels (${join(dir, 'typecheck.log')})`);
  }
} else {
  failed += 1;
  notes.push('no type check report');
}

const vitestFile = join(dir, 'vitest.json');
if (existsSync(vitestFile)) {
  const v = JSON.parse(readFileSync(vitestFile, 'utf8'));
  passed += v.numPassedTests ?? 0;
  failed += (v.numFailedTests ?? 0) + (v.numFailedTestSuites ?? 0 ? 0 : 0);
  if ((v.numFailedTestSuites ?? 0) > 0 && (v.numFailedTests ?? 0) === 0) {
    failed += v.numFailedTestSuites;
    notes.push(`${v.numFailedTestSuites} vitest file(s) failed to load`);
  }
  if ((v.numPendingTests ?? 0) + (v.numTodoTests ?? 0) > 0) notes.push(`${v.numPendingTests + v.numTodoTests} vitest test(s) skipped`);
} else {
  failed += 1;
  notes.push('no vitest report');
}

if (existsSync(join(dir, 'build.json'))) {
  failed += 1;
  notes.push('production build failed');
}

const pwFile = join(dir, 'playwright.json');
if (existsSync(pwFile)) {
  const p = JSON.parse(readFileSync(pwFile, 'utf8'));
  passed += p.stats?.expected ?? 0;
  failed += (p.stats?.unexpected ?? 0) + (p.stats?.flaky ?? 0);
  if ((p.stats?.skipped ?? 0) > 0) notes.push(`${p.stats.skipped} Playwright test(s) skipped`);
  for (const e of p.errors ?? []) notes.push(`Playwright: ${String(e.message ?? e).split('\n')[0]}`);
  if ((p.errors ?? []).length) failed += 1;
} else {
  failed += 1;
  notes.push('no Playwright report');
}

for (const n of notes) console.log(`  note: ${n}`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
