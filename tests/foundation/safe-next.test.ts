import { expect, it } from 'vitest';
import { safeNextPath } from '~/lib/safe-next';

it('keeps same-origin paths after sign-in', () => {
  expect(safeNextPath('/units?site=1#top')).toBe('/units?site=1#top');
  expect(safeNextPath('/trends/00000000-0000-4000-8000-000000000000?range=week')).toBe('/trends/00000000-0000-4000-8000-000000000000?range=week');
});

it('turns every address a browser could read as another host into /', () => {
  for (const evil of [
    '//evil.example',
    '///evil.example',
    '/\\evil.example',
    '\\\\evil.example',
    '/%5Cevil.example',
    '/%5cevil.example',
    '/%09/evil.example',
    '/\t/evil.example',
    '/%2F%2Fevil.example',
    '/%252F%252Fevil.example',
    'https://evil.example/',
    'http:evil.example',
    'javascript:alert(1)',
    'evil.example',
    '/%0d%0aSet-Cookie:x=1',
    '/\u0000x',
    '',
    null,
    undefined,
  ]) {
    expect({ evil, out: safeNextPath(evil) }).toEqual({ evil, out: '/' });
  }
});
