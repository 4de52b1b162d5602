/**
 * Simulation behind LARGER_FACTOR and LARGER_MARGIN (src/lib/analytics/notice-figures.ts): how often
 * re-signals of one persistent shift look clearly larger, and how fast a real jump opens its own
 * notice. Independent standard-normal hours, CUSUM k = 0.5, h = 5, restart after each signal, 3-hour
 * rule. Prints its figures; run with: node --import tsx scripts/notice-larger-sim.ts
 */
import { cusumInit, cusumStep } from '~/lib/analytics/drift';
import { clearlyLarger, shiftFigure, type ResidualHour } from '~/lib/analytics/notice-figures';
let seed = 12345;
const rnd = () => { seed = (seed * 1103515245 + 12345) % 2147483648; return seed / 2147483648; };
const gauss = () => Math.sqrt(-2 * Math.log(rnd() + 1e-12)) * Math.cos(2 * Math.PI * rnd());
for (const delta of [0.75, 1, 2, 3]) {
  let st = cusumInit(); const pts: (ResidualHour & { step: number })[] = []; let sigs = 0, larger = 0, openOnset = -1;
  for (let i = 0; i < 200_000; i++) {
    const x = delta + gauss();
    const r = cusumStep(st, x, { k: 0.5, h: 5, resetOnSignal: true, minRunLength: 3 }); st = r.state;
    pts.push({ hourStart_ms: i * 3600e3, residual_W: x, hourU_W: null, step: r.point.step });
    for (const s of r.point.signals) { if (s.direction !== 'up') continue;
      const hs = pts.filter((p) => p.step >= s.onsetStep);
      if (openOnset < 0) { openOnset = s.onsetStep; continue; }
      sigs++;
      const cur = shiftFigure(pts.filter((p) => p.step >= openOnset && p.step < s.onsetStep).slice(-24), 1, 0);
      if (clearlyLarger(shiftFigure(hs, 1, 0), cur, 'up', 0.5 + 5 / hs.length)) { larger++; openOnset = s.onsetStep; }
    }
    if (pts.length > 200) pts.splice(0, 100);
  }
  console.log(`persistent shift ${delta} sigma: ${sigs} re-signals in 200000 h, ${larger} judged clearly larger (${(100 * larger / Math.max(sigs, 1)).toFixed(2)} %)`);
}
seed = 987;
for (const [d1, d2] of [[1, 2], [1, 3], [2, 4], [1.5, 8]] as const) {
  const delays: number[] = []; let missed = 0; let early = 0;
  for (let t = 0; t < 300; t++) {
    let st = cusumInit(); const pts: (ResidualHour & { step: number })[] = []; let openOnset = -1; let found = -1;
    for (let i = 0; i < 500 && found < 0; i++) {
      const x = (i < 200 ? d1 : d2) + gauss();
      const r = cusumStep(st, x, { k: 0.5, h: 5, resetOnSignal: true, minRunLength: 3 }); st = r.state;
      pts.push({ hourStart_ms: i, residual_W: x, hourU_W: null, step: r.point.step });
      for (const s of r.point.signals) { if (s.direction !== 'up') continue;
        const hs = pts.filter((p) => p.step >= s.onsetStep);
        if (openOnset < 0) { openOnset = s.onsetStep; continue; }
        const cur = shiftFigure(pts.filter((p) => p.step >= openOnset && p.step < s.onsetStep).slice(-24), 1, 0);
        if (clearlyLarger(shiftFigure(hs, 1, 0), cur, 'up', 0.5 + 5 / hs.length)) { if (i < 200) { early++; openOnset = s.onsetStep; } else found = i - 200 + 1; }
      }
    }
    if (found < 0) missed++; else delays.push(found);
  }
  delays.sort((a, b) => a - b);
  console.log(`jump ${d1} -> ${d2} sigma: larger notice in ${delays.length}/300 runs within 300 h; median delay ${delays[Math.floor(delays.length / 2)] ?? '-'} h, 90th pct ${delays[Math.floor(delays.length * 0.9)] ?? '-'} h; before the jump ${early}`);
}
