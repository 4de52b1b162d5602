import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

export const API_DIR = 'src/pages/api';
export const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? walk(p) : /\.(ts|js)$/.test(f) ? [p] : [];
  });
}

/** Every endpoint file, as its Astro route pattern and the methods it exports. */
export function endpoints() {
  return walk(API_DIR).map((file) => {
    const route =
      '/' +
      relative('src/pages', file)
        .replace(/\.(ts|js)$/, '')
        .replace(/\/index$/, '');
    const src = readFileSync(file, 'utf8');
    const exported = [...src.matchAll(/export const (GET|POST|PUT|PATCH|DELETE|ALL)\b/g)].map((m) => m[1]!);
    const methods = exported.includes('ALL') ? [...METHODS] : exported;
    return { file, route, methods };
  });
}

/** A concrete path for a pattern: each [param] becomes a sample value. */
export function samplePath(route: string): string {
  return route.replace(/\[\.\.\.[^\]]+\]/g, 'x/y').replace(/\[[^\]]+\]/g, '00000000-0000-4000-8000-000000000000');
}
