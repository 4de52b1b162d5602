/**
 * Hashing of the engine's inputs: canonical JSON of plain data, and SHA-256 of its UTF-8 bytes, by
 * Node's own crypto (OpenSSL) where the module runs under Node, else by @noble/hashes (audited, no
 * dependencies, runs in browsers). Both are the same SHA-256 (FIPS 180-4): the digests are identical;
 * Node's is 4-7 times faster on the engine's messages of a few hundred bytes.
 * The same inputs always give the same text and so the same hash; the engine stores it with each unit
 * hour and rewrites a row only when it changes.
 *
 * @see FIPS 180-4 (2015), Secure Hash Standard, section 6.2 (SHA-256).
 */
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';

/**
 * Canonical JSON: object keys sorted, no whitespace, numbers as JavaScript prints them (shortest
 * round-trip form), -0 as 0, non-finite numbers as null, undefined members left out.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || value === undefined) return 'null';
  if (typeof value === 'number') return Number.isFinite(value) ? (Object.is(value, -0) ? '0' : String(value)) : 'null';
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (Array.isArray(value)) return '[' + value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',') + ']';
  if (ArrayBuffer.isView(value)) return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
  if (value instanceof Date) return JSON.stringify(value.toISOString());
  if (typeof value === 'object') {
    const o = value as Record<string, unknown>;
    const keys = Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort();
    return '{' + keys.map((k) => JSON.stringify(k) + ':' + canonicalJson(o[k])).join(',') + '}';
  }
  throw new TypeError(`canonicalJson: cannot encode a ${typeof value}`);
}

/**
 * Node's SHA-256 of bytes as hex when the runtime is Node (process.getBuiltinModule, synchronous): the
 * one-shot crypto.hash where there is one (no Hash object per message), else createHash; else null.
 */
type NodeCrypto = {
  hash?: (alg: 'sha256', data: Uint8Array, enc: 'hex') => string;
  createHash(alg: 'sha256'): { update(b: Uint8Array): { digest(enc: 'hex'): string } };
};
const nodeSha256: ((b: Uint8Array) => string) | null = (() => {
  try {
    const p = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
    const c = p?.getBuiltinModule?.('node:crypto') as NodeCrypto | undefined;
    if (!c || typeof c.createHash !== 'function') return null;
    const oneShot = c.hash;
    if (typeof oneShot === 'function') return (b) => oneShot('sha256', b, 'hex');
    return (b) => c.createHash('sha256').update(b).digest('hex');
  } catch {
    return null;
  }
})();

const ENCODER = new TextEncoder();
let buf = new Uint8Array(4096);
/** A view of the shared buffer for writing a number's bytes in one call (renewed with the buffer). */
let bufView = new DataView(buf.buffer);
function grow(n: number, keep: number): void {
  const b = new Uint8Array(n);
  if (keep > 0) b.set(buf.subarray(0, keep));
  buf = b;
  bufView = new DataView(buf.buffer);
}

/** UTF-8 bytes of a text into the shared buffer (ASCII without an encoder); returns the length. */
function utf8Into(text: string): number {
  const n = text.length;
  if (buf.length < n * 3) grow(n * 3, 0);
  let ascii = true;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c > 127) {
      ascii = false;
      break;
    }
    buf[i] = c;
  }
  if (ascii) return n;
  const bytes = ENCODER.encode(text);
  if (buf.length < bytes.length) grow(bytes.length, 0);
  buf.set(bytes);
  return bytes.length;
}

/**
 * SHA-256 of a text (its UTF-8 bytes), as 64 lowercase hex digits.
 * @see FIPS 180-4 section 6.2
 */
export function sha256Hex(text: string): string {
  return digestBuffer(utf8Into(text));
}

/** SHA-256 (Node's crypto, else @noble/hashes) of the first len bytes of the shared buffer, as hex. */
function digestBuffer(len: number): string {
  if (nodeSha256) return nodeSha256(buf.subarray(0, len));
  return bytesToHex(sha256(buf.subarray(0, len)));
}

/**
 * Builds a byte message for SHA-256 from texts and numbers without turning numbers into text: a number
 * is a marker byte (1) and its IEEE 754 binary64 bytes, little-endian (-0 as 0; null, undefined, NaN
 * and infinities as the single marker 2), a whole number 0 .. 2^32 - 1 may go as marker 3 and 4 bytes
 * big-endian, a text its UTF-8 bytes and a 0 terminator. Deterministic: the same parts always give the
 * same digest.
 */
export class ByteHasher {
  private len = 0;
  private room(n: number) {
    if (buf.length < this.len + n) grow(Math.max(2 * buf.length, this.len + n), this.len);
  }
  /** Starts a new message (the buffer is shared: finish one message before starting another). */
  reset(): this {
    this.len = 0;
    return this;
  }
  text(t: string): this {
    for (let i = 0; i < t.length; i++) {
      const c = t.charCodeAt(i);
      if (c > 127) return this.bytes(ENCODER.encode(t));
    }
    this.room(t.length + 1);
    for (let i = 0; i < t.length; i++) buf[this.len++] = t.charCodeAt(i);
    buf[this.len++] = 0;
    return this;
  }
  private bytes(b: Uint8Array): this {
    this.room(b.length + 1);
    buf.set(b, this.len);
    this.len += b.length;
    buf[this.len++] = 0;
    return this;
  }
  num(v: number | null | undefined | boolean): this {
    this.room(9);
    if (typeof v === 'boolean') v = v ? 1 : 0;
    if (v === null || v === undefined || !Number.isFinite(v)) {
      buf[this.len++] = 2;
      return this;
    }
    buf[this.len++] = 1;
    bufView.setFloat64(this.len, v === 0 ? 0 : v, true);
    this.len += 8;
    return this;
  }
  /** A small whole number (0 .. 2^32 - 1) as 4 bytes; anything else as num(). */
  int(v: number): this {
    if (!(Number.isInteger(v) && v >= 0 && v < 2 ** 32)) return this.num(v);
    this.room(5);
    buf[this.len++] = 3;
    bufView.setUint32(this.len, v, false);
    this.len += 4;
    return this;
  }
  /** One byte (a flag or a marker). */
  byte(v: number): this {
    this.room(1);
    buf[this.len++] = v & 255;
    return this;
  }
  /** The message's SHA-256 (hex). */
  digest(): string {
    return digestBuffer(this.len);
  }
}

/** SHA-256 of the canonical JSON of a value (hex). */
export function hashOf(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}
