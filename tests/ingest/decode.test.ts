import { describe, expect, it } from 'vitest';
import { createDecoder, decodeAll, detectEncoding, IngestError } from '~/lib/ingest/index';
import { fixtureBytes } from './helpers';

function codeOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof IngestError) return e.code;
    throw e;
  }
  return 'no error';
}

describe('createDecoder', () => {
  it('strips a UTF-8 byte-order mark', () => {
    const { text, decision } = decodeAll(fixtureBytes('bom-utf8.csv'));
    expect(decision).toMatchObject({ encoding: 'utf-8', bom: true });
    expect(text.startsWith('Time,B1.FT-101')).toBe(true);
    expect(text.charCodeAt(0)).not.toBe(0xfeff);
  });

  it.each([
    ['utf16le-bom.csv', 'utf-16le', true],
    ['utf16le-nobom.csv', 'utf-16le', false],
    ['utf16be-bom.csv', 'utf-16be', true],
  ])('reads %s as %s (mark: %s)', (name, encoding, bom) => {
    const { text, decision } = decodeAll(fixtureBytes(name));
    expect(decision.encoding).toBe(encoding);
    expect(decision.bom).toBe(bom);
    expect(text.split('\n')[0]).toBe('Time;B1.FT-101;B1.TT-102');
    expect(text.split('\n')[1]).toBe(';m³/h;°C');
  });

  it('falls back to windows-1252 when the sample is not valid UTF-8 (m³/h, °C)', () => {
    const { text, decision } = decodeAll(fixtureBytes('latin1.csv'));
    expect(decision.encoding).toBe('windows-1252');
    expect(text.split('\n')[1]).toBe(';m³/h;°C');
  });

  it('keeps multi-byte characters whole when chunks split them (one byte per chunk)', () => {
    const original = 'Zeit;B1.TT-102 [°C];Fluss [m³/h];Preis [€]\n01.02.2024 00:00;85,2;12,5;3\n';
    for (const encoding of ['utf-8', 'utf-16le'] as const) {
      const bytes =
        encoding === 'utf-8'
          ? new TextEncoder().encode(original)
          : new Uint8Array([0xff, 0xfe, ...Array.from(original).flatMap((ch) => [ch.charCodeAt(0) & 0xff, ch.charCodeAt(0) >> 8])]);
      const d = createDecoder({ sampleBytes: 8 });
      let out = '';
      for (const b of bytes) out += d.push(new Uint8Array([b]));
      out += d.end();
      expect(out).toBe(original);
    }
  });

  it('decides from the first sample only: an invalid byte later in a UTF-8 file is counted, not re-decided', () => {
    const head = new TextEncoder().encode('Time,B1.FT-101\n' + '2024-03-05 10:00:00,1.5\n'.repeat(3000));
    const bad = new Uint8Array([0x32, 0xff, 0x0a]);
    const d = createDecoder({ sampleBytes: 65536 });
    let out = d.push(head.subarray(0, 70000 > head.length ? head.length : 70000));
    out += d.push(bad) + d.end();
    expect(head.length).toBeGreaterThan(65536);
    expect(d.decision!.encoding).toBe('utf-8');
    expect(d.replacementCount).toBe(1);
    expect(out.endsWith('2\uFFFD\n')).toBe(true);
  });

  it('refuses a file with NUL bytes as binary', () => {
    expect(codeOf(() => decodeAll(fixtureBytes('binary.bin')))).toBe('BINARY_FILE');
  });

  it('refuses text full of control characters as binary', () => {
    const bytes = new Uint8Array(400);
    for (let i = 0; i < bytes.length; i++) bytes[i] = i % 4 === 0 ? 0x41 : 1 + (i % 7);
    expect(codeOf(() => decodeAll(bytes))).toBe('BINARY_FILE');
  });

  it('refuses an empty file', () => {
    expect(codeOf(() => decodeAll(fixtureBytes('empty.csv')))).toBe('EMPTY_FILE');
  });

  it('detects UTF-16 without a mark from the zero bytes, both byte orders', () => {
    const ascii = 'Time,B1.FT-101\n2024-03-05 10:00:00,1\n';
    const le = new Uint8Array(Array.from(ascii).flatMap((c) => [c.charCodeAt(0), 0]));
    const be = new Uint8Array(Array.from(ascii).flatMap((c) => [0, c.charCodeAt(0)]));
    expect(detectEncoding(le).encoding).toBe('utf-16le');
    expect(detectEncoding(be).encoding).toBe('utf-16be');
  });
});
