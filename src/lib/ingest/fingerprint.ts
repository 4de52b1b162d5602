/**
 * FNV-1a 64-bit hash (Fowler, Noll, Vo), over the UTF-8 bytes of a string, as 16 lower-case hex
 * digits. Synchronous and pure; used to recognise later files of the same shape, not for security.
 * @see http://www.isthe.com/chongo/tech/comp/fnv/ (offset basis 0xcbf29ce484222325, prime 0x100000001b3)
 */
const OFFSET_BASIS = 0xcbf29ce484222325n;
const PRIME = 0x100000001b3n;
const MASK = 0xffffffffffffffffn;

export function fnv1a64Hex(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let h = OFFSET_BASIS;
  for (const byte of bytes) {
    h ^= BigInt(byte);
    h = (h * PRIME) & MASK;
  }
  return h.toString(16).padStart(16, '0');
}

/** Header text normalised for fingerprints: trimmed, inner whitespace collapsed, lower case. */
export function normaliseHeaderCell(cell: string): string {
  return cell.trim().replace(/\s+/g, ' ').toLowerCase();
}
