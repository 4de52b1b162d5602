/**
 * Quality codes of wide files that carry a quality (status) column beside each value column, or one
 * for the whole row. Which codes are good is set per site; the defaults:
 *
 *   Good, OK, Valid, G, 192     (compared case-insensitively, after trimming; a blank cell is good)
 *
 * 192 is the classic OPC quality byte for good (0xC0). A code that is not good but that the
 * standard rules (quality.ts) call uncertain (Uncertain, Questionable, Suspect, OPC bytes 64..127)
 * is used and counted as uncertain. Every other code is bad: its sample is rejected with the code
 * as its reason ("bad quality: Comm Fail"). A site whose historian writes 0 for good (some status
 * words do) adds '0' to its good codes.
 */
import { classifyQuality, QualityClass } from './quality';

export const DEFAULT_GOOD_QUALITY_CODES: readonly string[] = ['Good', 'OK', 'Valid', 'G', '192'];

/** Most distinct codes remembered per file (the judgement of the rest is recomputed). */
const CACHE_LIMIT = 1000;

export type QualityJudge = (code: string) => QualityClass;

/** A classifier of quality codes for one site's good codes. */
export function createQualityJudge(goodCodes: readonly string[] = DEFAULT_GOOD_QUALITY_CODES): QualityJudge {
  const good = new Set(goodCodes.map((c) => c.trim().toLowerCase()));
  const cache = new Map<string, QualityClass>();
  return (code: string) => {
    let c = cache.get(code);
    if (c !== undefined) return c;
    const t = code.trim();
    if (t === '' || good.has(t.toLowerCase())) c = QualityClass.Good;
    else c = classifyQuality(t) === QualityClass.Uncertain ? QualityClass.Uncertain : QualityClass.Bad;
    if (cache.size < CACHE_LIMIT) cache.set(code, c);
    return c;
  };
}

/** The good codes as shown in a file's report. */
export function qualityCodesOf(goodCodes: readonly string[] | null | undefined): string[] {
  return [...(goodCodes && goodCodes.length > 0 ? goodCodes : DEFAULT_GOOD_QUALITY_CODES)];
}
