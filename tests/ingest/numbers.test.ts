import { describe, expect, it } from 'vitest';
import { parseNumber } from '~/lib/ingest/index';

describe('parseNumber', () => {
  it.each([
    ['12.5', '.', '', 12.5],
    ['  -12.5 ', '.', '', -12.5],
    ['+7', '.', '', 7],
    ['12,5', ',', '', 12.5],
    ['1.234,5', ',', '.', 1234.5],
    ['1,234.5', '.', ',', 1234.5],
    ['1 234,5', ',', ' ', 1234.5],
    ['1\u00a0234,5', ',', ' ', 1234.5],
    ["1'234.5", '.', "'", 1234.5],
    ['1.5e3', '.', '', 1500],
    ['-2,5E-2', ',', '', -0.025],
    ['.5', '.', '', 0.5],
    ['5.', '.', '', 5],
    ['0.000123', '.', '', 0.000123],
    ['12345678901234567890', '.', '', 12345678901234567890],
  ] as const)('%j with mark %j and thousands %j is %d', (text, mark, thousands, expected) => {
    expect(parseNumber(text, mark, thousands)).toBe(expected);
  });

  it.each(['', '   ', 'Shutdown', 'I/O Timeout', 'Bad', '#N/A', '-', '1.2.3', '12 %', '0x10', 'NaN', 'Infinity', '1e', '1e400', '1,,2', ',5,'])(
    '%j is not a number',
    (text) => {
      expect(Number.isNaN(parseNumber(text, '.', ','))).toBe(true);
    },
  );

  it('a thousands separator must sit between digits', () => {
    expect(Number.isNaN(parseNumber('1.234.', ',', '.'))).toBe(true);
    expect(Number.isNaN(parseNumber('.234', ',', '.'))).toBe(true);
  });

  it('gives the same double as Number() for random decimals (fast and general paths)', () => {
    let seed = 12345;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    for (let i = 0; i < 20000; i++) {
      const magnitude = Math.pow(10, Math.floor(next() * 16) - 8);
      const x = (next() - 0.5) * magnitude;
      const text = i % 3 === 0 ? x.toPrecision(1 + Math.floor(next() * 15)) : i % 3 === 1 ? x.toFixed(Math.floor(next() * 8)) : x.toExponential(Math.floor(next() * 12));
      expect(parseNumber(text), text).toBe(Number(text));
      expect(parseNumber(text.replace('.', ','), ','), text).toBe(Number(text));
    }
  });
});
