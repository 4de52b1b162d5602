/**
 * What must hold for any file, however hostile: the reader either reads it (every stored figure
 * finite and possible, every hour inside the accepted window) or stops with a catalogued reason
 * (an IngestError whose code is in the catalogue, with a message). Anything else is a finding.
 * Runs the same steps as the worker: layout from the first 96 KiB, preview, the layout check, then
 * the whole file in 64 KiB chunks.
 */
import {
  INGEST_ERROR_CATALOGUE,
  IngestError,
  MAX_ABS_VALUE,
  checkLayoutAgainstSample,
  createDecoder,
  createFileIngest,
  previewRows,
  sniffLayout,
  type TagHour,
} from '~/lib/ingest/index';

export interface CaseOutcome {
  outcome: 'read' | 'stopped' | 'asked';
  code?: string;
  /** Set when an invariant broke or an unexpected error escaped: the finding. */
  problem?: string;
}

/** The accepted times of the fuzzed site: 2000-01-01 to 2027-01-01. */
export const FUZZ_WINDOW = { minMs: Date.UTC(2000, 0, 1), maxMs: Date.UTC(2027, 0, 1) };
const SAMPLE_BYTES = 96 * 1024;

function catalogued(err: unknown): CaseOutcome {
  if (err instanceof IngestError && err.code in INGEST_ERROR_CATALOGUE && err.message.length > 10) return { outcome: 'stopped', code: err.code };
  const e = err as Error;
  return { outcome: 'stopped', problem: `unexpected ${e?.name ?? typeof err}: ${e?.message ?? String(err)}\n${e?.stack ?? ''}` };
}

function badHour(h: TagHour): string | null {
  for (const [k, v] of Object.entries({ mean: h.mean, min: h.min, max: h.max, first: h.first, last: h.last, stdDev: h.stdDev })) {
    if (v === null || v === undefined) continue;
    if (!Number.isFinite(v) || Math.abs(v) > MAX_ABS_VALUE) return `${h.tag} ${k} = ${v}`;
  }
  if (h.stdDev !== null && h.stdDev < 0) return `${h.tag} negative spread`;
  if (h.hourStartMs < FUZZ_WINDOW.minMs - 86_400_000 || h.hourStartMs > FUZZ_WINDOW.maxMs + 86_400_000) return `${h.tag} hour ${h.hourStartMs} outside the window`;
  if (!(h.coveredSeconds >= 0 && h.coveredSeconds <= 7200)) return `${h.tag} covered ${h.coveredSeconds} s`;
  return null;
}

export function checkFile(bytes: Uint8Array, timeZone = 'Europe/Berlin'): CaseOutcome {
  // 1. layout from the head, as the worker decides it
  let asked = false;
  try {
    const head = bytes.subarray(0, SAMPLE_BYTES);
    const decoder = createDecoder();
    const complete = bytes.length <= SAMPLE_BYTES;
    const text = decoder.push(head) + (complete ? decoder.end() : '');
    const profile = sniffLayout(text, { complete, encoding: decoder.decision?.encoding ?? null });
    try {
      previewRows(text, profile, 8, { timeZone, complete });
    } catch (err) {
      if (!(err instanceof IngestError)) return catalogued(err);
    }
    if (profile.questions.length) asked = true;
    if (checkLayoutAgainstSample(text, profile, { timeZone, complete })) asked = true;
  } catch (err) {
    const c = catalogued(err);
    if (c.problem) return c;
  }
  // 2. the whole file
  try {
    let problem: string | null = null;
    const ing = createFileIngest({
      timeZone,
      timeWindow: FUZZ_WINDOW,
      onHour: (h) => {
        problem ??= badHour(h);
      },
    });
    for (let i = 0; i < bytes.length; i += 65536) ing.push(bytes.subarray(i, i + 65536));
    const r = ing.end();
    if (problem) return { outcome: 'read', problem };
    const rep = r.report;
    if (rep.valueCount < 0 || rep.rejectedCount < 0 || rep.dataRowCount <= 0) return { outcome: 'read', problem: `report counts ${JSON.stringify({ v: rep.valueCount, r: rep.rejectedCount, rows: rep.dataRowCount })}` };
    return { outcome: asked ? 'asked' : 'read' };
  } catch (err) {
    return catalogued(err);
  }
}
