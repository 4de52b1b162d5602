/**
 * Hashing of the engine's inputs, pure (no Node, no Web Crypto): canonical JSON of plain data, and
 * SHA-256 of its UTF-8 bytes. The same inputs always give the same text and so the same hash; the
 * engine stores it with each unit hour and rewrites a row only when it changes.
 *
 * @see FIPS 180-4 (2015), Secure Hash Standard, section 6.2 (SHA-256).
 */

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

const K = new Int32Array([
  0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3,
  0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da,
  0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13,
  0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070,
  0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208,
  0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2,
]);

const ENCODER = new TextEncoder();
const W = new Int32Array(64);
const H = new Int32Array(8);
const H0 = Int32Array.from([0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19]);
let buf = new Uint8Array(4096);

/** UTF-8 bytes of a text into the shared buffer (ASCII without an encoder); returns the length. */
function utf8Into(text: string): number {
  const n = text.length;
  if (buf.length < n * 3 + 72) buf = new Uint8Array(n * 3 + 72);
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
  if (buf.length < bytes.length + 72) buf = new Uint8Array(bytes.length + 72);
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

/** SHA-256 of the first len bytes of the shared buffer (which it pads in place). */
function digestBuffer(len: number): string {
  if (buf.length < len + 72) {
    const b = new Uint8Array(len + 72);
    b.set(buf.subarray(0, len));
    buf = b;
  }
  const total = Math.ceil((len + 9) / 64) * 64;
  buf.fill(0, len, total);
  buf[len] = 0x80;
  const bitLen = len * 8;
  const hi = Math.floor(bitLen / 2 ** 32);
  const lo = bitLen >>> 0;
  buf[total - 8] = hi >>> 24;
  buf[total - 7] = (hi >>> 16) & 255;
  buf[total - 6] = (hi >>> 8) & 255;
  buf[total - 5] = hi & 255;
  buf[total - 4] = lo >>> 24;
  buf[total - 3] = (lo >>> 16) & 255;
  buf[total - 2] = (lo >>> 8) & 255;
  buf[total - 1] = lo & 255;
  // 32-bit arithmetic kept in int32 (| 0), which V8 runs without boxing numbers.
  for (let i = 0; i < 8; i++) H[i] = H0[i]!;
  for (let off = 0; off < total; off += 64) {
    for (let t = 0; t < 16; t++) {
      const o = off + 4 * t;
      W[t] = (buf[o]! << 24) | (buf[o + 1]! << 16) | (buf[o + 2]! << 8) | buf[o + 3]!;
    }
    for (let t = 16; t < 64; t++) {
      const w15 = W[t - 15]!;
      const w2 = W[t - 2]!;
      const s0 = ((w15 >>> 7) | (w15 << 25)) ^ ((w15 >>> 18) | (w15 << 14)) ^ (w15 >>> 3);
      const s1 = ((w2 >>> 17) | (w2 << 15)) ^ ((w2 >>> 19) | (w2 << 13)) ^ (w2 >>> 10);
      W[t] = (W[t - 16]! + s0 + W[t - 7]! + s1) | 0;
    }
    let a = H[0]! | 0, b = H[1]! | 0, c = H[2]! | 0, d = H[3]! | 0, e = H[4]! | 0, f = H[5]! | 0, g = H[6]! | 0, h = H[7]! | 0;
    for (let t = 0; t < 64; t++) {
      const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
      const ch = (e & f) ^ (~e & g);
      const t1 = (h + S1 + ch + K[t]! + W[t]!) | 0;
      const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
      const maj = (a & b) ^ (a & c) ^ (b & c);
      const t2 = (S0 + maj) | 0;
      h = g;
      g = f;
      f = e;
      e = (d + t1) | 0;
      d = c;
      c = b;
      b = a;
      a = (t1 + t2) | 0;
    }
    H[0] = (H[0]! + a) | 0;
    H[1] = (H[1]! + b) | 0;
    H[2] = (H[2]! + c) | 0;
    H[3] = (H[3]! + d) | 0;
    H[4] = (H[4]! + e) | 0;
    H[5] = (H[5]! + f) | 0;
    H[6] = (H[6]! + g) | 0;
    H[7] = (H[7]! + h) | 0;
  }
  let out = '';
  for (let i = 0; i < 8; i++) out += (H[i]! >>> 0).toString(16).padStart(8, '0');
  return out;
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
  private view = new DataView(new ArrayBuffer(8));
  private room(n: number) {
    if (buf.length < this.len + n + 72) {
      const b = new Uint8Array(Math.max(2 * buf.length, this.len + n + 72));
      b.set(buf.subarray(0, this.len));
      buf = b;
    }
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
    this.view.setFloat64(0, v === 0 ? 0 : v, true);
    for (let i = 0; i < 8; i++) buf[this.len++] = this.view.getUint8(i);
    return this;
  }
  /** A small whole number (0 .. 2^32 - 1) as 4 bytes; anything else as num(). */
  int(v: number): this {
    if (!(Number.isInteger(v) && v >= 0 && v < 2 ** 32)) return this.num(v);
    this.room(5);
    buf[this.len++] = 3;
    buf[this.len++] = v >>> 24;
    buf[this.len++] = (v >>> 16) & 255;
    buf[this.len++] = (v >>> 8) & 255;
    buf[this.len++] = v & 255;
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
