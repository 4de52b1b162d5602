/**
 * Notice mails in the site's display units and number style (src/server/services/notice-mail.ts,
 * src/lib/units/writer.ts). Factors: NIST SP 811 (2008) Appendix B.8 (1 MW = 10⁶ W); value and ± at
 * the decimals of U: JCGM 100:2008 7.2.6. Grouping separators: CLDR as shipped in Node's Intl
 * (en-GB ',' and de-DE '.').
 */
import { describe, expect, it } from 'vitest';
import type { NoticeView } from '~/lib/notice-view';
import { DEFAULT_DISPLAY_UNITS, type DisplayUnits } from '~/lib/units/display';
import { CODE_PATTERN } from '~/lib/words';
import { digestDay, digestMail, escalationMail, noticeMail } from '~/server/services/notice-mail';

function notice(units: DisplayUnits, over: Partial<NoticeView> = {}): NoticeView {
  const base = {
    id: '00000000-0000-4000-8000-000000000001',
    siteId: '00000000-0000-4000-8000-000000000002',
    siteName: 'Harbourmouth Mill',
    timeZone: 'Europe/London',
    unitId: '00000000-0000-4000-8000-000000000003',
    unitName: 'Boiler B2',
    unitKind: 'boiler',
    baselineId: null,
    baselineLabel: null,
    direction: 'up',
    kind: 'drift',
    kindWord: 'drift',
    ruleText: null,
    ruleHours: null,
    ruleCrossed: null,
    meanEfficiency: null,
    status: 'open',
    statusWord: 'open',
    onsetHour: '2025-05-12T06:00:00.000Z',
    signalHour: '2025-05-13T09:00:00.000Z',
    lastSignalHour: '2025-05-13T09:00:00.000Z',
    hours: 27,
    extra_W: 1_234_500,
    expected_W: 23_456_000,
    shift_sigma: 3.2,
    extraCost_per_day: 12_345.6,
    currency: 'GBP',
    costBasis: 'gas price',
    hourU_W: 410_000,
    shiftU_W: 95_000,
    exceedsUncertainty: true,
    k: 0.5,
    h: 5,
    openedAt: '2025-05-13T09:10:00.000Z',
    acknowledgedBy: null,
    acknowledgedAt: null,
    acknowledgeComment: null,
    closedBy: null,
    closedAt: null,
    closeComment: null,
    url: 'http://localhost/notices/00000000-0000-4000-8000-000000000001',
    headline_W: 1_567_300,
    headlineU_W: 69_950,
    headlineCost_per_day: 15_678.9,
    headlineCostU_per_day: 712.4,
    headlineExceeds: true,
    current_W: 1_567_300,
    currentU_W: 69_950,
    currentMeasU_W: 52_000,
    currentHours: 24,
    sinceOnset_W: 1_400_000,
    sinceOnsetU_W: 80_000,
    sinceOnsetHours: 51,
    trend: 'growing',
    figuresHour: '2025-05-14T10:00:00.000Z',
    life: 'live',
    fadedSince: null,
    supersededBy: null,
    priorNoticeId: null,
    priorReason: null,
    closeOutcome: null,
    repairedAt: null,
    newNormalFrom: null,
    verdict: null,
    followUpNoticeId: null,
    escalationStep: 0,
  } satisfies NoticeView;
  return { ...base, display: { units, p_atm_Pa: 101325 }, ...over };
}

const MW_BARG: DisplayUnits = { ...DEFAULT_DISPLAY_UNITS, power: 'MW', pressure: 'barg', locale: 'en-GB' };

/** Every figure with its unit in a text: "1.567 MW", "412 kW", "300 W", "5 Pa". */
const figuresWith = (text: string, unit: string) => text.match(new RegExp(`\\d[\\d,.\\u2009]*\\s${unit}(?![A-Za-z/])`, 'g')) ?? [];

describe('notice mails in the site display units', () => {
  it('NIST SP 811 B.8 and GUM 7.2.6: a site in MW gets MW, its ± at the same decimals, and no W or Pa figure', () => {
    const m = noticeMail(notice(MW_BARG), 'planner@example.org');
    for (const body of [m.text, m.html, m.subject]) {
      expect(figuresWith(body, 'W')).toEqual([]);
      expect(figuresWith(body, 'kW')).toEqual([]);
      expect(figuresWith(body, 'Pa')).toEqual([]);
    }
    // 1 567 300 W ± 69 950 W = 1.567 MW ± 0.070 MW (U to two significant digits, the value to its decimals).
    expect(m.text).toContain('Extra destruction: +1.567 MW ± 0.070 MW against the expected 23.5 MW');
    expect(m.subject).toContain('destroys 1.57 MW more exergy');
    // Money grouped by the locale (en-GB: ','), value and ± at the decimals of U (U = 712.4 asks for 0 decimals).
    expect(m.text).toContain('Cost per day: GBP 15,679 ± 712');
    expect(m.html).toContain('±');
    // The site's clock with its zone: 06:00 UTC is 07:00 in London in May (BST).
    expect(m.text).toContain('Since: 2025-05-12 07:00 (Europe/London)');
    expect(m.text.match(new RegExp(CODE_PATTERN.source, 'g')) ?? []).toEqual([]);
  });

  it('CLDR de-DE: a German site groups thousands with "." and writes decimals with ","', () => {
    const m = noticeMail(notice({ ...DEFAULT_DISPLAY_UNITS, power: 'kW', locale: 'de-DE' }), 'p@example.org');
    // 1 567 300 W = 1 567.3 kW; U = 69.95 kW -> 70 (0 decimals).
    expect(m.text).toContain('+1.567 kW ± 70 kW');
    expect(m.text).toContain('GBP 15.679 ± 712');
    // kW with three significant figures: 23 456 kW expected.
    expect(m.text).toContain('the expected 23.456 kW');
  });

  it('the escalation mail and the digest write money and power the same way', () => {
    const n = notice(MW_BARG);
    const e = escalationMail(n, 'p@example.org', 1, 7_500, 15_678.9);
    expect(e.subject).toContain('now costs GBP 15,679 per day (was GBP 7,500)');
    const d = digestMail([n, notice({ ...MW_BARG, power: 'kW' }, { unitName: 'Turbine T1' })], 'p@example.org', '2025-05-14');
    expect(d.text).toContain('+1.567 MW ± 0.070 MW');
    expect(d.text).toContain('+1,567 kW ± 70 kW');
    expect(figuresWith(d.text.split('Turbine T1')[0]!, 'kW')).toEqual([]);
  });

  it("the digest is dated by the site's own day in its zone, not the UTC day", () => {
    // 2025-06-04 06:00 UTC is 2025-06-03 20:00 in Pacific/Honolulu (UTC-10, no summer time) and
    // 2025-06-04 18:00 in Pacific/Auckland (UTC+12 in June): IANA tz database as shipped in Node's Intl.
    const run = new Date('2025-06-04T06:00:00Z');
    const honolulu = notice(MW_BARG, { timeZone: 'Pacific/Honolulu', siteName: 'Lava Point Works' });
    const d = digestMail([honolulu], 'p@example.org', run);
    expect(d.subject).toContain('(2025-06-03 (Pacific/Honolulu))');
    expect(d.subject).not.toContain('2025-06-04');
    expect(d.text).toContain('not yet closed on 2025-06-03 (Pacific/Honolulu):');
    expect(d.html).toContain('2025-06-03 (Pacific/Honolulu)');
    // 2025-06-04 13:00 UTC is already 2025-06-05 01:00 in Auckland (UTC+12), still 2025-06-04 14:00 in London (BST).
    const late = new Date('2025-06-04T13:00:00Z');
    const auckland = notice(MW_BARG, { timeZone: 'Pacific/Auckland', unitName: 'Turbine T1' });
    expect(digestDay([auckland], late)).toBe('2025-06-05 (Pacific/Auckland)');
    expect(digestDay([honolulu, auckland, notice(MW_BARG)], late)).toBe('2025-06-04 (Pacific/Honolulu, Europe/London); 2025-06-05 (Pacific/Auckland)');
    expect(digestMail([auckland], 'p@example.org', late).subject).toContain('2025-06-05');
  });

  it('a running-while-idle notice in MW, its efficiency in percent', () => {
    const m = noticeMail(notice(MW_BARG, { kind: 'idle', kindWord: 'running while idle', ruleText: 'normally idle on weekends', ruleHours: 3, extra_W: 2_345_600, extraCost_per_day: 4_321 }), 'p@example.org');
    expect(m.subject).toContain('destroys 2.35 MW, GBP 4,321 a day');
    expect(figuresWith(m.text, 'kW')).toEqual([]);
    expect(figuresWith(m.text, 'W')).toEqual([]);
  });
});
