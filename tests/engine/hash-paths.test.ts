/**
 * The engine hashes with Node's crypto where it runs under Node and with @noble/hashes elsewhere
 * (src/lib/engine/hash.ts): both must give the same SHA-256 digests, or stored inputs hashes would
 * depend on the runtime. Random texts (ASCII and not) of lengths around the 64-byte block edges.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import { sha256Hex } from '~/lib/engine';
import { ByteHasher } from '~/lib/engine/hash';

describe('SHA-256 under Node and in the pure fallback', () => {
  it('gives the same digest as @noble/hashes for any text', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 300 }), fc.string({ unit: 'binary', maxLength: 200 })), (t) => {
        expect(sha256Hex(t)).toBe(bytesToHex(sha256(new TextEncoder().encode(t))));
      }),
      { numRuns: 400 },
    );
  });
  it('gives the same digest at the block edges (55, 56, 63, 64, 65 bytes)', () => {
    for (const n of [0, 55, 56, 63, 64, 65, 119, 120, 128, 1000]) {
      const t = 'x'.repeat(n);
      expect(sha256Hex(t)).toBe(bytesToHex(sha256(new TextEncoder().encode(t))));
    }
  });
});

/**
 * The byte message of the inputs hash, written here the slow way (one byte at a time from a
 * Float64Array's bytes, shifts for whole numbers), against ByteHasher (one DataView write per number):
 * the stored inputs hashes depend on these bytes. Messages grow past the 4,096-byte buffer.
 */
function byHand(parts: (['t', string] | ['n', number | null] | ['i', number] | ['b', number])[]): string {
  const out: number[] = [];
  const f = new Float64Array(1);
  const fb = new Uint8Array(f.buffer);
  const le = ((f[0] = 1), fb[7] === 0x3f);
  for (const [k, v] of parts) {
    if (k === 't') {
      for (const b of new TextEncoder().encode(v)) out.push(b);
      out.push(0);
    } else if (k === 'b') out.push(v & 255);
    else if (k === 'i' && Number.isInteger(v) && v >= 0 && v < 2 ** 32) out.push(3, v >>> 24, (v >>> 16) & 255, (v >>> 8) & 255, v & 255);
    else if (v === null || !Number.isFinite(v)) out.push(2);
    else {
      f[0] = v === 0 ? 0 : v;
      out.push(1);
      for (let i = 0; i < 8; i++) out.push(fb[le ? i : 7 - i]!);
    }
  }
  return bytesToHex(sha256(Uint8Array.from(out)));
}

describe('the byte message of the inputs hash', () => {
  it('gives the digest of its bytes written one by one, for any parts and lengths', () => {
    const part = fc.oneof(
      fc.tuple(fc.constant('t' as const), fc.string({ maxLength: 40 })),
      fc.tuple(fc.constant('n' as const), fc.oneof(fc.double(), fc.constant(null), fc.constant(-0))),
      fc.tuple(fc.constant('i' as const), fc.oneof(fc.nat(), fc.integer({ min: 2 ** 32 - 2, max: 2 ** 33 }), fc.double())),
      fc.tuple(fc.constant('b' as const), fc.integer({ min: 0, max: 255 })),
    );
    fc.assert(
      fc.property(fc.array(part, { maxLength: 900, size: 'max' }), (parts) => {
        const h = new ByteHasher().reset();
        for (const [k, v] of parts) {
          if (k === 't') h.text(v as string);
          else if (k === 'n') h.num(v as number | null);
          else if (k === 'i') h.int(v as number);
          else h.byte(v as number);
        }
        expect(h.digest()).toBe(byHand(parts as Parameters<typeof byHand>[0]));
      }),
      { numRuns: 150 },
    );
  });
});
