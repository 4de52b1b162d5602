/**
 * The committed client types (src/lib/api/v1-types.ts) are what `npm run api:types` writes from the
 * document of today's routes: a route or schema changed without regenerating fails here.
 */
import { readFileSync } from 'node:fs';
import { expect, it } from 'vitest';
import { v1Document } from '~/server/openapi-routes';
import { TYPES_FILE, renderTypes } from '../../scripts/api-types';

it('src/lib/api/v1-types.ts is current (run npm run api:types)', async () => {
  const expected = await renderTypes((await v1Document()).document);
  expect(readFileSync(TYPES_FILE, 'utf8') === expected, `${TYPES_FILE} differs from the document: run npm run api:types and commit it`).toBe(true);
});
