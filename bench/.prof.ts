import { buildSite, hourOf, rng } from './engine';
import { computeUnitHour } from '~/lib/engine';
const units = buildSite();
const r = rng(1);
for (let h = 0; h < 600; h++) for (const u of units) computeUnitHour({ ...u.input, tagHours: hourOf(u, h, r), hourStartMs: Date.UTC(2025,0,1) + h * 3600000 }, { uncertainty: true });
