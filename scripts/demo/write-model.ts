/**
 * Writes scripts/demo/harrowgate.model.json from ./site.ts (the one source of the demo's tags and
 * model). Run after changing site.ts: `node --import tsx scripts/demo/write-model.ts`.
 * tests/demo/model.test.ts fails when the committed file and site.ts disagree.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { demoModel } from './site';

export const MODEL_FILE = fileURLToPath(new URL('./harrowgate.model.json', import.meta.url));

/** The model file's text: two-space JSON with a final newline. */
export function modelFileText(): string {
  return JSON.stringify(demoModel(), null, 2) + '\n';
}

if (import.meta.url === `file://${process.argv[1]}`) {
  writeFileSync(MODEL_FILE, modelFileText());
  console.log(`[demo] wrote ${MODEL_FILE}`);
}
