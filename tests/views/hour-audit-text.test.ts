/**
 * The words of an hour's audit trail (src/lib/views/hour-audit-text.ts). Expected texts are the
 * hour panel's wording; numbers follow the one formatter (en-GB locale of the default display units:
 * ',' groups, '.' marks decimals) and times the site's clock (IANA zone rules: Europe/Berlin is UTC+1
 * in winter, UTC+2 in summer).
 */
import { describe, expect, it } from 'vitest';
import { siteWriter } from '~/lib/units/writer';
import {
  deadStateText,
  deltaText,
  linkUncertaintyText,
  linkValidityText,
  measuresText,
  sourceText,
  tagQualityText,
  valueText,
} from '~/lib/views/hour-audit-text';
import type { HourAudit } from '~/lib/views/unit-hour';

type TagHour = HourAudit['tagHours'][number];
const w = siteWriter();
const hour = (over: Partial<NonNullable<TagHour['hour']>> = {}): NonNullable<TagHour['hour']> => ({
  mean: 1,
  min: 1,
  max: 1,
  samples: 60,
  coveredFraction: 1,
  nonNumeric: 0,
  outOfRange: 0,
  flatline: false,
  ...over,
});

describe('where an input came from', () => {
  it('names a tag with its reading and unit, and its note', () => {
    expect(sourceText({ kind: 'tag', tag: 'PT-101', reading: 12.3456, engUnit: 'bar' }, w)).toBe('PT-101 (12.346 bar)');
    expect(sourceText({ kind: 'tag', tag: 'PT-101', reading: 1, engUnit: 'bar', note: 'held' }, w)).toBe('PT-101 (1.000 bar); held');
  });
  it('names a copy, a parameter in words, and the site otherwise', () => {
    expect(sourceText({ kind: 'copy', note: 'same as', of: 'inlet' }, w)).toBe('same as (inlet)');
    expect(sourceText({ kind: 'parameter', key: 'no-such-key' }, w)).toBe('parameter: value');
    expect(sourceText({ kind: 'site', what: 'dead state' }, w)).toBe('dead state');
    expect(sourceText({ kind: 'site' }, w)).toBe('site');
  });
});

describe('values and uncertainties with their unit', () => {
  it('writes a temperature [K] in °C (decimals by size: three figures) and a difference without the offset (bar, not bar(g))', () => {
    expect(valueText(373.15, 'temperature', w)).toBe('100 °C');
    expect(deltaText(0.5, 'temperature', w)).toBe('0.500 °C');
    expect(deltaText(1e4, 'pressure', w)).toBe('0.100 bar');
  });
  it('writes nothing as a dash and a zero uncertainty as 0', () => {
    expect(valueText(null, 'temperature', w)).toBe('–');
    expect(deltaText(0, 'pressure', w)).toBe('0');
  });
  it('writes a bare number to four decimals', () => {
    expect(valueText(0.5, 'none', w)).toBe('0.5000');
  });
});

describe('a tag hour and its link', () => {
  const tag: TagHour = { tag: 'TT-1', quantity: 'no-such-quantity', port: 'inlet', engUnit: 'degC', hour: hour() };
  it('says what the tag measures, where, or its role', () => {
    expect(measuresText(tag)).toBe('measurement at inlet');
    expect(measuresText({ ...tag, port: null })).toBe('measurement of the unit');
    expect(measuresText({ tag: 'X', role: 'load', hour: null })).toBe('load');
  });
  it('says sound, no data, or every problem of the hour', () => {
    expect(tagQualityText(hour())).toBe('sound');
    expect(tagQualityText(null)).toBe('no data this hour');
    expect(tagQualityText(hour({ flatline: true, outOfRange: 3, nonNumeric: 2 }))).toBe('frozen, 3 out of range, 2 status words');
    expect(tagQualityText(hour({ nonNumeric: 1 }))).toBe('1 status words');
  });
  it('writes a link uncertainty as relative or in the tag unit', () => {
    expect(linkUncertaintyText({ ...tag, uncertainty: { mode: 'relative', value: 0.5 } })).toBe('0.5 % of reading');
    expect(linkUncertaintyText({ ...tag, uncertainty: { mode: 'absolute', value: 0.2 } })).toBe('0.2 degC');
    expect(linkUncertaintyText(tag)).toBe('');
  });
  it('writes when a link is valid in the site clock', () => {
    expect(linkValidityText(tag, 'Europe/Berlin')).toBe('');
    expect(linkValidityText({ ...tag, validFromMs: 0 }, 'Europe/Berlin')).toBe('from the start');
    const from = Date.UTC(2024, 0, 1, 12);
    const to = Date.UTC(2024, 6, 1, 12);
    expect(linkValidityText({ ...tag, validFromMs: from, validToMs: to }, 'Europe/Berlin')).toBe('from 2024-01-01 13:00 to 2024-07-01 14:00');
    expect(linkValidityText({ ...tag, validFromMs: from, validToMs: null }, 'Europe/Berlin')).toBe('from 2024-01-01 13:00');
  });
});

describe('the dead state and the load', () => {
  const deadState = { T0_K: 288.15, p0_Pa: 101325, source: 'site settings' };
  it('writes T0 in °C and p0 in kPa', () => {
    expect(deadStateText({ deadState, load: null }, w)).toBe('Dead state T0 = 15.00 °C, p0 = 101.33 kPa (site settings).');
  });
  it('adds a power load in kW and a flow load in t/h', () => {
    const load = { value: 1.5e6, unit: 'W', label: 'shaft power', tags: [], minLoad: 0 };
    expect(deadStateText({ deadState, load }, w)).toBe('Dead state T0 = 15.00 °C, p0 = 101.33 kPa (site settings). Load: shaft power 1,500.00 kW.');
    expect(deadStateText({ deadState, load: { ...load, value: 10, unit: 'kg/s', label: 'steam' } }, w)).toContain(' Load: steam 36.00 t/h.');
  });
});
