import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkModel, unitStatus } from '~/lib/plant';
import { generateExports, headerText } from '../../scripts/demo/generate';
import { demoModel, DEMO_SITE_NAME, DEMO_TAGS } from '../../scripts/demo/site';
import { MODEL_FILE, modelFileText } from '../../scripts/demo/write-model';

describe('the demo site model file', () => {
  it('self-consistency: the committed harrowgate.model.json is what scripts/demo/site.ts builds', () => {
    expect(readFileSync(MODEL_FILE, 'utf8')).toBe(modelFileText());
  });

  it('self-consistency: is a valid model file for the demo site, in Europe/London and GBP', () => {
    const r = checkModel(demoModel());
    expect(r.issues).toEqual([]);
    expect(r.ok).toBe(true);
    const m = demoModel();
    expect(m.site.name).toBe(DEMO_SITE_NAME);
    expect(m.site.timeZone).toBe('Europe/London');
    expect(m.site.currency).toBe('GBP');
    expect(m.site.prices.map((p) => p.kind).sort()).toEqual(['electricity', 'fuel']);
  });

  it('self-consistency: has the units of the brief, each complete with the units the export carries', () => {
    const m = demoModel();
    expect(m.units.map((u) => u.kind).sort()).toEqual(['boiler', 'compressor', 'heat-exchanger', 'let-down-valve', 'mixer', 'pump', 'turbine']);
    // the tag hints the ingest stores are the export's units row
    const hints = new Map(DEMO_TAGS.map((t) => [t.tag, t.unit]));
    const siteLinks = m.units.flatMap((u) => u.links.map((l) => ({ unit: u.name, port: l.port, quantity: l.quantity, tag: l.tag })));
    const boilers = new Set(m.units.filter((u) => u.kind === 'boiler').map((u) => u.name));
    for (const u of m.units) {
      const s = unitStatus(u, { tagHints: hints, siteLinks, boilers });
      expect({ unit: u.name, missing: s.missing, conflicts: s.conflicts }).toEqual({ unit: u.name, missing: [], conflicts: [] });
      expect(Object.keys(u.parameters).some((k) => k.startsWith('minLoad'))).toBe(true);
    }
  });

  it('self-consistency: every linked tag is a column of the export, with the same engineering unit', () => {
    const [first] = generateExports({ days: 1, clean: true });
    const [names, , units] = first!.text.split('\r\n');
    expect(first!.text.startsWith(headerText())).toBe(true);
    const unitOf = new Map(names!.split(',').map((n, i) => [n, units!.split(',')[i]]));
    const m = demoModel();
    const links = [...m.units.flatMap((u) => u.links), { tag: m.site.deadState.T0Tag!.tag, unit: m.site.deadState.T0Tag!.unit }];
    for (const l of links) expect({ tag: l.tag, unit: unitOf.get(l.tag) }).toEqual({ tag: l.tag, unit: l.unit });
  });
});
