/**
 * The words of one hour's audit trail (./unit-hour.ts, HourAudit) as the hour panel writes them:
 * where an input came from, a value or an uncertainty with its unit, a tag hour's quality, a link's
 * uncertainty and validity. Numbers through the site's writer (src/lib/units/writer.ts), times
 * through src/lib/site-time.ts. Pure.
 */
import { siteStamp } from '../site-time';
import { upTo } from '../format';
import type { SiteWriter } from '../units/writer';
import { inputWords, labelOf } from '../words';
import type { HourAudit } from './unit-hour';

type Quantity = ReturnType<typeof inputWords>['quantity'];
type TagHour = HourAudit['tagHours'][number];

/** The role of a term in F = P + L + D, in words. */
export const ROLE_WORD: Record<string, string> = { fuel: 'fuel F', product: 'product P', loss: 'loss L' };

/** Where an input of the balance came from: a tag and its reading, a parameter, a copy or the site. */
export function sourceText(s: HourAudit['inputs'][number]['source'], w: SiteWriter): string {
  if (s.kind === 'tag') return `${s.tag} (${w.number(s.reading ?? null, 3)} ${s.engUnit})${s.note ? `; ${s.note}` : ''}`;
  if (s.kind === 'parameter') return `parameter: ${inputWords(s.key ?? '').label}`;
  if (s.kind === 'copy') return `${s.note} (${s.of})`;
  return s.what ?? 'site';
}

/** A value of the input vector in the site's unit, with its unit. */
export function valueText(v: number | null, q: Quantity, w: SiteWriter): string {
  if (v === null) return '–';
  const u = w.unit(q);
  return `${w.value(v, q, q === 'none' ? 4 : undefined)}${u ? ` ${u}` : ''}`;
}

/** A standard uncertainty in the site's unit of a difference, with its unit. */
export function deltaText(u_SI: number, q: Quantity, w: SiteWriter): string {
  if (!u_SI) return '0';
  const u = w.deltaUnit(q);
  return `${w.delta(u_SI, q)}${u ? ` ${u}` : ''}`;
}

/** What a linked tag measures: "Pressure at inlet", "Shaft power of the unit", or its role. */
export function measuresText(t: TagHour): string | undefined {
  return t.quantity ? `${labelOf(t.quantity, 'measurement')}${t.port ? ` at ${t.port}` : ' of the unit'}` : t.role;
}

/** A tag hour's quality: "no data this hour", "sound", or its problems ("frozen, 3 out of range"). */
export function tagQualityText(h: TagHour['hour']): string {
  if (!h) return 'no data this hour';
  return [h.flatline ? 'frozen' : '', h.outOfRange ? `${h.outOfRange} out of range` : '', h.nonNumeric ? `${h.nonNumeric} status words` : ''].filter(Boolean).join(', ') || 'sound';
}

/** A link's uncertainty as its form states it: "0.5 % of reading" or "0.2 bar". */
export function linkUncertaintyText(t: TagHour): string {
  if (!t.uncertainty) return '';
  const v = upTo(t.uncertainty.value, 6);
  return t.uncertainty.mode === 'relative' ? `${v} % of reading` : `${v} ${t.engUnit}`;
}

/** When a link is valid, in the site's clock: "from the start", "from 2024-03-01 00:00 to 2024-06-01 00:00". */
export function linkValidityText(t: TagHour, timeZone: string): string {
  if (t.validFromMs === undefined) return '';
  const from = t.validFromMs === 0 ? 'from the start' : `from ${siteStamp(t.validFromMs, timeZone)}`;
  return `${from}${t.validToMs ? ` to ${siteStamp(t.validToMs, timeZone)}` : ''}`;
}

/** The dead state and the load of the hour, the way the footnote writes them. */
export function deadStateText(d: Pick<HourAudit, 'deadState' | 'load'>, w: SiteWriter): string {
  const q = d.load?.unit === 'W' ? 'power' : 'massFlow';
  const dead = `Dead state T0 = ${w.value(d.deadState.T0_K, 'temperature', 2)} ${w.unit('temperature')}, p0 = ${w.number(d.deadState.p0_Pa / 1e3, 2)} kPa (${d.deadState.source}).`;
  return `${dead}${d.load ? ` Load: ${d.load.label} ${w.value(d.load.value, q, 2)} ${w.unit(q)}.` : ''}`;
}
