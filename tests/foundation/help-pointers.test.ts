import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Pages, islands, mails and reports never send a user to a file of the repository (docs/*.md): the
 * help they need is on the page or in the product's own help pages (src/pages/help). Comments may
 * name the docs; code and text may not.
 */
function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx|astro)$/.test(f) ? [p] : [];
  });
}

/** The file's text with comments blanked out (block comments, line comments, JSX comments). */
function withoutComments(text: string): string {
  return text
    .replace(/\/\*[\s\S]*?\*\//g, (m) => m.replace(/[^\n]/g, ' '))
    .replace(/(^|[^:'"`])\/\/[^\n]*/g, (m, pre: string) => pre);
}

describe('no pointers to repository files in what users see', () => {
  it('self-consistency: no docs/... path outside comments under src/', () => {
    const hits: string[] = [];
    for (const f of files('src')) {
      const lines = withoutComments(readFileSync(f, 'utf8')).split('\n');
      lines.forEach((l, i) => {
        if (/docs\/[\w-]+\.md|domain\.md|plant-model\.md/.test(l)) hits.push(`${f}:${i + 1}: ${l.trim()}`);
      });
    }
    expect(hits).toEqual([]);
  });

  it('self-consistency: the scan sees a pointer in text and ignores one in a comment', () => {
    expect(withoutComments('/** see docs/domain.md */\nconst a = 1; // docs/api.md')).not.toMatch(/docs\//);
    expect(withoutComments("const t = 'format in docs/plant-model.md';")).toMatch(/docs\/plant-model\.md/);
  });
});
