/**
 * Quality cells of long exports.
 *
 * Rule:
 * - blank: good (the export has no quality for that row);
 * - words (case-insensitive, first word counts): good, ok, valid, g -> good; uncertain, questionable,
 *   doubtful, suspect, u -> uncertain; bad, invalid, error, fault, fail(ed), b -> bad;
 * - integers 0..255 are the classic OPC quality byte: bits 7-6 = 11 good, 01 uncertain, 00 bad
 *   (10 is unused and read as bad); so 192 (0xC0) is good, 64 (0x40) uncertain, 0 bad;
 * - larger integers up to 2^32-1 are 32-bit status codes: top two bits 00 good, 01 uncertain,
 *   10 or 11 bad;
 * - anything else is unknown: read as uncertain and reported, never dropped silently.
 * Good and uncertain values are used (uncertain ones are counted per hour); bad values are not.
 */
export const QualityClass = { Good: 0, Bad: 3, Uncertain: 4, Unknown: -1 } as const;
export type QualityClass = (typeof QualityClass)[keyof typeof QualityClass];

const WORDS: Record<string, QualityClass> = {
  good: 0, ok: 0, valid: 0, g: 0,
  uncertain: 4, questionable: 4, doubtful: 4, suspect: 4, u: 4,
  bad: 3, invalid: 3, error: 3, fault: 3, fail: 3, failed: 3, b: 3,
};

export function classifyQuality(text: string): QualityClass {
  const t = text.trim();
  if (t === '') return QualityClass.Good;
  if (/^\d+$/.test(t)) {
    const q = Number(t);
    if (q <= 255) {
      const bits = q & 0xc0;
      return bits === 0xc0 ? QualityClass.Good : bits === 0x40 ? QualityClass.Uncertain : QualityClass.Bad;
    }
    if (q <= 0xffffffff) {
      const top = Math.floor(q / 0x40000000); // 0..3
      return top === 0 ? QualityClass.Good : top === 1 ? QualityClass.Uncertain : QualityClass.Bad;
    }
    return QualityClass.Unknown;
  }
  const word = t.toLowerCase().split(/[^a-z]+/)[0] ?? '';
  return WORDS[word] ?? QualityClass.Unknown;
}

/** True when the text looks like a quality cell (used by layout sniffing). */
export function looksLikeQuality(text: string): boolean {
  return classifyQuality(text) !== QualityClass.Unknown;
}
