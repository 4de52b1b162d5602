/**
 * The texts of notice mails (opening, escalation, daily digest) and the lines of figures they share:
 * composition only, no I/O. Queueing them is the work of ./notices.ts.
 */
import { signedWithU, writerOf, type SiteWriter } from '~/lib/units/writer';
import { siteDay, siteStampWithZone, type Instant } from '~/lib/site-time';
import { SAFETY_CAUTION } from '~/lib/caution';
import type { NoticeView } from '~/lib/notice-view';
import { escapeHtml } from '../mail';
import { ruleFigureLines, ruleNoticeMail } from './unit-rule-words';
import { htmlBody, htmlCaution, textTail } from './notice-mail-parts';

/** Figures of a notice in its site's display units and number style (src/lib/units/writer.ts). */
export function noticeWords(n: Pick<NoticeView, 'display' | 'currency'>) {
  const w: SiteWriter = writerOf(n.display);
  return {
    w,
    /** A power [W] with the site's unit: "412 kW", "1.23 MW". */
    power: (W: number) => `${w.value(W, 'power')} ${w.unit('power')}`,
    /** A difference or an uncertainty of power [W] (no offset). */
    powerDelta: (W: number) => `${w.delta(W, 'power')} ${w.unit('power')}`,
    /** A signed power and its U at the decimals U asks for: "+412 kW ± 18 kW". */
    signedU: (W: number, U: number | null) => signedWithU(w, W, U, 'power', '-'),
    /** Money in the currency, whole units grouped in the site's locale. */
    money: (v: number, currency = n.currency) => `${currency} ${w.number(v, 0)}`,
    /** Money and its U at the decimals U asks for. */
    moneyU: (v: number, U: number | null, currency = n.currency) => `${currency} ${w.withU(v, U, 'none', 0)}`,
  };
}
const when = siteStampWithZone;

/** The product's words for how a shift moves (rule in src/lib/analytics/notice-figures.ts). */
export const TREND_WORDS = { growing: 'growing', steady: 'steady', receding: 'receding' } as const;

/**
 * The lines of figures a notice states, shared by its mail and its digest entry. The headline is the
 * current size (mean of the last 24 steady hours, recomputed at every drift check); the figure at
 * signal time stays below it.
 */
export function noticeFigureLines(n: NoticeView): string[] {
  if (n.kind !== 'drift') return ruleFigureLines(n);
  const { signedU, power: kW, powerDelta, moneyU } = noticeWords(n);
  const signed = (W: number) => signedU(W, null);
  const hoursOfHeadline = n.currentHours ?? n.hours;
  const lines = [
    `Extra destruction: ${signedU(n.headline_W, n.headlineU_W)} against the expected ${kW(n.expected_W)} (mean of the last ${hoursOfHeadline} steady hours; k = 2)`,
    n.headlineCost_per_day === null
      ? 'Cost per day: not known (no cost rate for this unit or site)'
      : `Cost per day: ${moneyU(n.headlineCost_per_day, n.headlineCostU_per_day)}`,
  ];
  if (n.sinceOnset_W !== null && n.sinceOnsetHours !== null && n.sinceOnsetHours > hoursOfHeadline) {
    lines.push(`Since onset: ${signedU(n.sinceOnset_W, n.sinceOnsetU_W)} (mean of ${n.sinceOnsetHours} steady hours); the shift is ${n.trend ? TREND_WORDS[n.trend] : 'steady'}`);
  }
  lines.push(`At signal: ${signed(n.extra_W)} (mean of ${n.hours} steady hours from onset to signal)`);
  lines.push(`Since: ${when(n.onsetHour, n.timeZone)} (onset estimate; sustained shift confirmed ${when(n.signalHour, n.timeZone)})`);
  const measU = n.current_W !== null ? n.currentMeasU_W : n.shiftU_W;
  lines.push(
    n.headlineExceeds === null || measU === null
      ? 'Against measurement uncertainty: not known (the hours carry no uncertainty)'
      : n.headlineExceeds
        ? `Against measurement uncertainty: exceeds it (shift ${powerDelta(Math.abs(n.headline_W))} against ± ${powerDelta(measU)} for the mean of ${hoursOfHeadline} hours${n.hourU_W !== null ? `; one hour ± ${powerDelta(n.hourU_W)}` : ''})`
        : `Against measurement uncertainty: within it (shift ${powerDelta(Math.abs(n.headline_W))} against ± ${powerDelta(measU)} for the mean of ${hoursOfHeadline} hours)`,
  );
  if (n.fadedSince) lines.push(`Faded since ${when(n.fadedSince, n.timeZone)}: the shift has gone; a later shift opens a new notice`);
  return lines;
}

export function noticeMail(n: NoticeView, to: string) {
  if (n.kind !== 'drift') return ruleNoticeMail(n, to, SAFETY_CAUTION);
  const more = n.direction === 'up' ? 'more' : 'less';
  const subject = `Drift notice: ${n.unitName} at ${n.siteName} destroys ${noticeWords(n).powerDelta(Math.abs(n.headline_W))} ${more} exergy than expected`;
  const lines = noticeFigureLines(n);
  const text = [`${n.unitName} (${n.siteName}) has shifted from its expected exergy destruction${n.baselineLabel ? ` (${n.baselineLabel})` : ''}.`, '', ...lines, ...textTail(n.url)].join('\n');
  const html = htmlBody(
    `${escapeHtml(n.unitName)} (${escapeHtml(n.siteName)}) has shifted from its expected exergy destruction${n.baselineLabel ? ` (${escapeHtml(n.baselineLabel)})` : ''}.`,
    lines,
    n.url,
  );
  return { to, subject, text, html };
}

/** The escalation mail: an open notice whose cost per day has grown past the site's multiple since the last mail. */
export function escalationMail(n: NoticeView, to: string, step: number, fromCost_per_day: number, toCost_per_day: number) {
  const { money } = noticeWords(n);
  const subject = `Drift notice grown: ${n.unitName} at ${n.siteName} now costs ${money(toCost_per_day)} per day (was ${money(fromCost_per_day)})`;
  const lines = noticeFigureLines(n);
  const head = `The shift of ${n.unitName} (${n.siteName}) has grown since the last mail about it: its cost per day went from ${money(fromCost_per_day)} to ${money(toCost_per_day)} (escalation ${step}).`;
  const text = [head, '', ...lines, ...textTail(n.url)].join('\n');
  const html = htmlBody(escapeHtml(head), lines, n.url);
  return { to, subject, text, html };
}

/**
 * The date a digest is of, in the clock of each site it lists: '2025-06-03 (Pacific/Honolulu)', or
 * several such, one per day with the zones it holds, when its sites' days differ. `at` is the instant of the run;
 * a 'yyyy-MM-dd' text is taken as the day itself (as callers gave it before).
 */
export function digestDay(open: Pick<NoticeView, 'timeZone'>[], at: Instant): string {
  if (typeof at === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(at)) return at;
  const zonesOfDay = new Map<string, string[]>();
  for (const z of new Set(open.map((n) => n.timeZone))) {
    const d = siteDay(at, z);
    zonesOfDay.set(d, [...(zonesOfDay.get(d) ?? []), z]);
  }
  if (!zonesOfDay.size) return `${siteDay(at, 'UTC')} (UTC)`;
  return [...zonesOfDay].map(([d, zones]) => `${d} (${zones.join(', ')})`).join('; ');
}

/** The daily digest: the notices not closed, dated by the day of their sites at the run's instant `at`. */
export function digestMail(open: NoticeView[], to: string, at: Instant) {
  const day = digestDay(open, at);
  const subject = `Lossline: ${open.length} drift notice${open.length === 1 ? '' : 's'} not closed (${day})`;
  const blocks = open.map((n) => [`${n.unitName} at ${n.siteName} - ${n.statusWord}`, ...noticeFigureLines(n).map((l) => `  ${l}`), `  ${n.url}`].join('\n'));
  const text = [`Drift notices not yet closed on ${day}:`, '', ...blocks.flatMap((b) => [b, '']), SAFETY_CAUTION].join('\n');
  const html = [
    `<p>Drift notices not yet closed on ${escapeHtml(day)}:</p>`,
    ...open.map(
      (n) =>
        `<h3><a href="${escapeHtml(n.url)}">${escapeHtml(n.unitName)} at ${escapeHtml(n.siteName)}</a> (${escapeHtml(n.statusWord)})</h3><ul>${noticeFigureLines(n)
          .map((l) => `<li>${escapeHtml(l)}</li>`)
          .join('')}</ul>`,
    ),
    htmlCaution(),
  ].join('\n');
  return { to, subject, text, html };
}
