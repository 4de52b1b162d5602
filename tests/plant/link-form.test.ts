import { describe, expect, it } from 'vitest';
import { unitStatus, type LinkModel, type UnitModel } from '~/lib/plant';
import { LinkFormSchema, linkRequestBody, linkedText, proposedUnit, targetQuantity, targetsOf, type LinkableUnit, type LinkFormValues } from '~/lib/plant/link-form';

const model = (links: LinkModel[]): UnitModel => ({
  name: 'PRV 7',
  kind: 'let-down-valve',
  parameters: {},
  ports: [
    { name: 'in', slot: 'inlet', fluid: { kind: 'water' } },
    { name: 'out', slot: 'outlet', fluid: { kind: 'water' } },
  ],
  links,
});
const valve = (links: LinkModel[] = []): LinkableUnit => {
  const m = model(links);
  return { id: 'u1', name: m.name, kind: m.kind, ports: m.ports.map((p, i) => ({ ...p, id: `p${i}` })), status: unitStatus(m, { tagHints: new Map(), siteLinks: [], boilers: new Set() }) };
};
const form = (over: Partial<LinkFormValues> = {}): LinkFormValues => ({
  unitId: 'u1',
  target: 'p0|pressure',
  tag: 'PT-701',
  unit: 'barg',
  basis: '',
  uncertaintyMode: 'relative',
  uncertainty: '0.5',
  validMin: '',
  validMax: '',
  validFrom: '',
  ...over,
});

describe('the link form', () => {
  it("lists a valve's targets with the missing ones first, and drops a target once it is linked", () => {
    const all = targetsOf(valve());
    expect(all.filter((t) => t.missing).map((t) => t.label)).toEqual(['in · pressure', 'in · temperature', 'in · mass flow', 'in · volume flow (actual)', 'in · volume flow at reference conditions', 'out · pressure']);
    expect(all.slice(-1)[0]).toMatchObject({ missing: false, portId: 'p1' });
    const linked = targetsOf(valve([{ port: 'in', quantity: 'pressure', tag: 'PT-701', unit: 'barg' }]));
    expect(linked.find((t) => t.value === 'p0|pressure')?.missing).toBe(false);
  });

  it("proposes the tag's own unit when it converts, else the quantity's first unit", () => {
    expect(proposedUnit('bar(g)', 'pressure')).not.toBe(proposedUnit(null, 'pressure'));
    expect(proposedUnit('kg/h', 'pressure')).toBe(proposedUnit(undefined, 'pressure'));
    expect(targetQuantity('p0|massFlow')).toBe('massFlow');
    expect(targetQuantity('')).toBeNull();
  });

  it('refuses a unit of another quantity, an O2 reading without its basis and a range that is no number, each at its field', () => {
    const r = LinkFormSchema.safeParse(form({ unit: 'degC', validMax: 'high' }));
    expect(r.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['unit', 'Not a unit of pressure.'],
      ['validMax', 'A number, or empty.'],
    ]);
    const o2 = LinkFormSchema.safeParse(form({ target: '|o2Fraction', unit: '%' }));
    expect(o2.error?.issues.map((i) => i.path.join('.'))).toEqual(['basis']);
  });

  it('sends a known tag by id and a new one by name, the range as numbers or null, and says what it linked', () => {
    const v = form({ validMin: '0', validMax: ' ' });
    expect(linkRequestBody(v, 't9', undefined)).toEqual({
      unitId: 'u1',
      portId: 'p0',
      quantity: 'pressure',
      tagId: 't9',
      unit: 'barg',
      uncertainty: { mode: 'relative', value: 0.5 },
      validMin: 0,
      validMax: null,
    });
    const fresh = linkRequestBody(form({ target: '|power', basis: 'dry' }), undefined, '2024-05-01T04:00:00.000Z');
    expect(fresh).toMatchObject({ portId: null, tag: 'PT-701', basis: 'dry', validFrom: '2024-05-01T04:00:00.000Z' });
    expect('tagId' in fresh).toBe(false);
    expect(linkedText(v, valve())).toBe('Linked PT-701 as pressure at in of PRV 7.');
    expect(linkedText(form({ target: '|power' }), valve())).toBe('Linked PT-701 as power of PRV 7.');
  });
});
