/**
 * The words of idle and limit notices (src/server/services/unit-rules.ts) in the notice view, the
 * opening mail and the digest. Kept apart from notices.ts, which calls into it for these kinds.
 */
import { writerOf } from '~/lib/units/writer';
import { siteStampWithZone } from '~/lib/site-time';
import type { NoticeKind, NoticeView } from '~/lib/notice-view';
import { escapeHtml } from '../mail';
import { htmlBody, textTail } from './notice-mail-parts';

/** The kinds in the product's words. */
export const NOTICE_KIND_WORDS: Record<NoticeKind, string> = { drift: 'drift', idle: 'running while idle', limit: 'limit crossed' };

/** The rule fields of a stored notice row, for the view. */
export function ruleViewFields(n: {
  kind: NoticeKind;
  ruleText: string | null;
  ruleHours: number | null;
  ruleCrossed: string[] | null;
  meanEfficiency: number | null;
}): Pick<NoticeView, 'kind' | 'kindWord' | 'ruleText' | 'ruleHours' | 'ruleCrossed' | 'meanEfficiency'> {
  return {
    kind: n.kind,
    kindWord: NOTICE_KIND_WORDS[n.kind] ?? n.kind,
    ruleText: n.ruleText,
    ruleHours: n.ruleHours,
    ruleCrossed: n.ruleCrossed,
    meanEfficiency: n.meanEfficiency,
  };
}

/** Power [W] and money in the site's display units and number style (src/lib/units/writer.ts). */
function writers(n: NoticeView) {
  const w = writerOf(n.display);
  return { kW: (W: number) => `${w.value(W, 'power')} ${w.unit('power')}`, money: (v: number, currency: string) => `${currency} ${w.number(v, 0)}`, w };
}
const when = siteStampWithZone;

/** One line saying why the notice opened. */
export function ruleReason(n: NoticeView): string {
  const hours = n.ruleHours ?? 3;
  return n.kind === 'idle'
    ? `Running while it should be idle (declared ${n.ruleText?.replace(/^normally idle /, '') ?? 'normally idle'}) for more than ${hours} hours in a row`
    : `Crossed its limit (${n.ruleText ?? 'a limit set for the unit'}) for more than ${hours} hours in a row`;
}

/** The lines of figures an idle or limit notice states, in its mail, digest entry and page. */
export function ruleFigureLines(n: NoticeView): string[] {
  const { kW, money, w } = writers(n);
  const lines = [
    ruleReason(n),
    `Exergy destruction: ${kW(n.extra_W)} (mean of the latest ${n.hours} hours of the rule broken)`,
    n.extraCost_per_day === null ? 'Cost of destruction per day: not known (the hours carry no cost)' : `Cost of destruction per day: ${money(n.extraCost_per_day, n.currency)}`,
  ];
  if (n.kind === 'limit' && n.meanEfficiency !== null) lines.push(`Exergy efficiency: ${w.value(n.meanEfficiency, 'ratio', 1)} % (mean of the same hours)`);
  lines.push(`Since: ${when(n.onsetHour, n.timeZone)}; more than ${n.ruleHours ?? 3} hours by ${when(n.signalHour, n.timeZone)}; latest hour ${when(n.lastSignalHour, n.timeZone)}`);
  lines.push('This notice stays open until a person closes it.');
  return lines;
}

/** The opening mail of an idle or limit notice; `caution` is the product's caution (docs/domain.md section 8). */
export function ruleNoticeMail(n: NoticeView, to: string, caution: string) {
  const { kW, money } = writers(n);
  const cost = n.extraCost_per_day === null ? '' : `, ${money(n.extraCost_per_day, n.currency)} a day`;
  const subject =
    n.kind === 'idle'
      ? `Running while it should be idle: ${n.unitName} at ${n.siteName} destroys ${kW(n.extra_W)}${cost}`
      : `Limit crossed: ${n.unitName} at ${n.siteName} (${n.ruleText ?? 'limit'})${cost}`;
  const intro =
    n.kind === 'idle'
      ? `${n.unitName} (${n.siteName}) is declared normally idle, and it has been running.`
      : `${n.unitName} (${n.siteName}) has crossed a limit set for it.`;
  const lines = ruleFigureLines(n);
  const text = [intro, '', ...lines, ...textTail(n.url, caution)].join('\n');
  const html = htmlBody(escapeHtml(intro), lines, n.url, caution);
  return { to, subject, text, html };
}
