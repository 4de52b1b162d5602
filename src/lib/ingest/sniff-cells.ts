/**
 * The sniffer's evidence from single cells and records: what a cell looks like (number, date-time,
 * unit, blank), which separator splits the lines most consistently, and per-column counts.
 */
import { IngestError } from './errors';
import { SEPARATORS } from './profile';
import { looksLikeQuality } from './quality';
import { newScan, scanDateTime, scanTimeOnly } from './time';
import { tokenizeAll } from './csv';

export type Separator = (typeof SEPARATORS)[number];

export const TIME_NAMES = /^(time|timestamp|time ?stamp|date|datetime|date ?time|date\/time|ts|zeit|zeitstempel|datum|uhrzeit|local ?time|utc|time ?\(utc\)|sample ?time)$/i;
export const TAG_NAMES = /^(tag|tags|tag ?name|tag_name|tag ?id|name|point|point ?name|signal|item|item ?id|variable|channel|sensor|messstelle)$/i;
export const VALUE_NAMES = /^(value|val|wert|messwert|reading|pv|avg|average|mean|measurement)$/i;
export const QUALITY_NAMES = /^(quality|q|qual|status|quality ?code|qualit[äa]t)$/i;
export const UNIT_NAMES = /^(unit|units|eu|engineering ?units?|einheit)$/i;

const UNIT_RE =
  /^(deg ?[CFK]|° ?[CF]|[KC]|bar ?\(?[ga]\)?|barg|bara|bar|mbar|[kMG]?Pa ?\(?[ga]\)?|[kMG]?Pa|psi[ga]?|t\/h|kg\/[sh]|kg\/min|t\/d|N?m3\/[hs]|N?m³\/[hs]|Sm3\/h|l\/(s|min|h)|[kMG]?W|[kMG]?Wh|[kMG]?VA|[kMG]?var|MJ|GJ|kJ\/kg|%|% ?O2|ppm|ppmv|rpm|1\/min|min-1|kA|A|V|kV|Hz|mg\/N?m3|mm|m|s|h|min|pH|[mµu]S\/cm|cos ?phi|-)$/i;

/** True when a cell looks like an engineering unit ('degC', 'bar(g)', 't/h', 'kW', '%', '[m³/h]'). */
export function isUnitLike(cell: string): boolean {
  let t = cell.trim();
  if (t.length === 0 || t.length > 16) return false;
  if ((t.startsWith('[') && t.endsWith(']')) || (t.startsWith('(') && t.endsWith(')'))) t = t.slice(1, -1).trim();
  return UNIT_RE.test(t);
}

/** Splits 'B1.TT-102 [degC]' into name and unit when the bracketed part is a unit. */
export function splitNameUnit(name: string): { tag: string; unit: string | null } {
  const [, tag, unit] = /^(.*\S)\s*[[(]([^[\]()]{1,16})[\])]\s*$/.exec(name) ?? [];
  if (tag !== undefined && unit !== undefined && isUnitLike(unit) && (unit.length > 1 || /[^A-Za-z]/.test(unit))) return { tag: tag.trim(), unit: unit.trim() };
  return { tag: name.trim(), unit: null };
}

const NUMERIC_LIKE = /^[+-]?[\d.,'\u00a0\u202f ]*\d[\d.,'\u00a0\u202f ]*(?:[eE][+-]?\d+)?$/;

export function isNumericLike(cell: string): boolean {
  const t = cell.trim();
  return t.length > 0 && NUMERIC_LIKE.test(t) && !/\s{2,}/.test(t);
}

const scanA = newScan();

export function isDateTimeText(cell: string): boolean {
  return scanDateTime(cell, 0, cell.length, scanA);
}

export function isBlank(cell: string): boolean {
  return cell.trim().length === 0;
}

export interface Rec {
  fields: string[];
  line: number;
}

export function modeCount(records: Rec[]): number {
  const counts = new Map<number, number>();
  for (const r of records) counts.set(r.fields.length, (counts.get(r.fields.length) ?? 0) + 1);
  let best = 0;
  let bestN = -1;
  for (const [c, n] of counts) if (n > bestN || (n === bestN && c > best)) [best, bestN] = [c, n];
  return best;
}

function cleanCell(cell: string): boolean {
  const t = cell.trim();
  if (t.length === 0 || isNumericLike(t) || isDateTimeText(t) || scanTimeOnly(t, 0, t.length, scanA)) return true;
  return !/\d/.test(t) || !/[,;|\t]/.test(t);
}

export function chooseSeparator(text: string, complete: boolean, maxRecords: number): { sep: Separator; score: number; records: Rec[] } {
  let best: { sep: Separator; score: number; m: number; records: Rec[] } | null = null;
  for (const sep of SEPARATORS) {
    const records = tokenizeAll(text, sep, { maxRecords, final: complete }).filter((r) => r.fields.some((f) => !isBlank(f)));
    if (records.length === 0) continue;
    const m = modeCount(records);
    let score = 0;
    if (m >= 2) {
      const consistent = records.filter((r) => r.fields.length === m);
      const consistency = consistent.length / records.length;
      let cells = 0;
      let clean = 0;
      for (const r of consistent.slice(-50)) {
        for (const f of r.fields) {
          cells++;
          if (cleanCell(f)) clean++;
        }
      }
      score = consistency * (0.5 + (0.5 * clean) / Math.max(1, cells));
    }
    if (!best || score > best.score + 1e-9 || (Math.abs(score - best.score) <= 1e-9 && m > best.m)) best = { sep, score, m, records };
  }
  if (!best) {
    throw new IngestError('EMPTY_FILE', 'The file holds no text lines. Export the data again and upload the new file.');
  }
  if (best.score === 0) {
    // one column only: no separator found
    throw new IngestError(
      'NO_VALUE_COLUMNS',
      'No separator (comma, semicolon, tab or bar) splits the lines into columns, so the file has no value columns. ' +
        'Check that the export writes one column per tag or tag, time and value columns.',
    );
  }
  return best;
}

export function isDataLike(r: Rec): boolean {
  let nonBlank = 0;
  let hits = 0;
  for (const f of r.fields) {
    if (isBlank(f)) continue;
    nonBlank++;
    if (isNumericLike(f) || isDateTimeText(f)) hits++;
  }
  return hits >= 1 && hits >= 0.5 * nonBlank;
}

export interface ColumnStats {
  nonBlank: number;
  numeric: number;
  dateTime: number;
  dateOnly: number;
  timeOnly: number;
  identifier: number;
  quality: number;
  distinct: Set<string>;
}

function noCellStats(): ColumnStats {
  return { nonBlank: 0, numeric: 0, dateTime: 0, dateOnly: 0, timeOnly: 0, identifier: 0, quality: 0, distinct: new Set() };
}

/** The counts of column j; a column past the sample's width counts as all blank. */
export function statsAt(stats: ColumnStats[], j: number): ColumnStats {
  return stats[j] ?? noCellStats();
}

export function columnStats(data: Rec[], m: number): ColumnStats[] {
  const stats: ColumnStats[] = [];
  for (let j = 0; j < m; j++) stats.push(noCellStats());
  for (const r of data) {
    for (const [j, s] of stats.entries()) {
      const f = (r.fields[j] ?? '').trim();
      if (f.length === 0) continue;
      s.nonBlank++;
      if (isNumericLike(f)) s.numeric++;
      if (scanDateTime(f, 0, f.length, scanA)) {
        s.dateTime++;
        if (!scanA.hasTime) s.dateOnly++;
      } else if (scanTimeOnly(f, 0, f.length, scanA)) s.timeOnly++;
      if (!isNumericLike(f) && /^[^\s]+$/.test(f) && /[\d._\-:/]/.test(f)) s.identifier++;
      if (looksLikeQuality(f)) s.quality++;
      if (s.distinct.size < 200) s.distinct.add(f);
    }
  }
  return stats;
}
