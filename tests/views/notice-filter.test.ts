/** The notice list's filter (src/lib/views/notice-filter.ts): its query and the choices of site and unit. */
import { describe, expect, it } from 'vitest';
import { noticeQuery, siteChoices, unitChoices } from '~/lib/views/notice-filter';

describe('the query of a filter', () => {
  it('leaves out every notice and the cost order, the defaults of the API', () => {
    expect(noticeQuery({ status: 'all', siteId: '', unitId: '', sort: 'cost' })).toBe('');
  });
  it('names a status, a site, a unit and the newest-first order', () => {
    expect(noticeQuery({ status: 'not-closed', siteId: 's1', unitId: 'u 2', sort: 'newest' })).toBe('status=not-closed&siteId=s1&unitId=u+2&sort=newest');
  });
});

describe('the choices of site and unit', () => {
  const all = [
    { siteId: 's2', siteName: 'North works', unitId: 'u3', unitName: 'Pump B' },
    { siteId: 's1', siteName: 'Harbour plant', unitId: 'u1', unitName: 'Turbine' },
    { siteId: 's1', siteName: 'Harbour plant', unitId: 'u2', unitName: 'Boiler' },
    { siteId: 's1', siteName: 'Harbour plant', unitId: 'u1', unitName: 'Turbine' },
  ];
  it('gives each site once, by name', () => {
    expect(siteChoices(all)).toEqual([
      ['s1', 'Harbour plant'],
      ['s2', 'North works'],
    ]);
  });
  it('gives each unit once, by name, of every site or of one', () => {
    expect(unitChoices(all, '')).toEqual([
      ['u2', 'Boiler'],
      ['u3', 'Pump B'],
      ['u1', 'Turbine'],
    ]);
    expect(unitChoices(all, 's2')).toEqual([['u3', 'Pump B']]);
  });
});
