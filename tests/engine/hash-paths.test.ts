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
