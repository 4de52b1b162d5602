/**
 * The monthly report as PDF (pdfkit), set in IBM Plex Sans embedded from @fontsource (WOFF files,
 * which pdfkit's font reader takes). Warm paper page, ink text, copper for destruction and loss,
 * teal for product; numbers right-aligned with their unit in the column head. One function a section;
 * the page machinery (fonts, headings, tables) is report-pdf-writer.ts.
 */
import { NOTICE_STATUS_WORDS } from '~/lib/words';
import type { NoticeStatus } from '~/lib/notice-view';
import type { ReportData } from './report';
import { mwhDecimals, reportNumbers } from './report-format';
import { writerOf } from '~/lib/units/writer';
import { siteStampWithZone } from '~/lib/site-time';
import { labelOf } from '~/lib/words';
import { siteStamp } from '~/lib/site-time';
import { HOUR_STATES as STATES } from '~/lib/hour-states';
import { C, MARGIN, Writer } from './report-pdf-writer';

export { plexFontFiles } from './report-pdf-writer';

/** Numbers in the site's display units, grouped and with the decimal marker of its locale. */
type Numbers = ReturnType<typeof reportNumbers>;

/** The title block: site, month, hours and zone, when it was made, and the uncertainty note. */
function titleBlock(w: Writer, r: ReportData): void {
  const { doc } = w;
  const tz = r.site.timeZone;
  w.font('regular', 8, C.faint).text('LOSSLINE · MONTHLY SITE REPORT', MARGIN, MARGIN + 4, { characterSpacing: 0.6 });
  w.font('bold', 20).text(r.site.name, MARGIN, doc.y + 2, { width: w.width });
  w.font('regular', 12, C.soft).text(`${r.period.label}  ·  ${r.period.hours} hours  ·  time zone ${r.site.timeZone}`, { width: w.width });
  w.font('regular', 8, C.faint).text(`Generated ${r.generated} (${tz}). Period ${siteStampWithZone(r.period.fromMs, tz)} to ${siteStampWithZone(r.period.toMs, tz)} (end exclusive).`, { width: w.width });
  doc.moveDown(0.5);
  w.para(r.uncertaintyNote, 7.8, C.faint);
}

/** The caution, in an amber box. */
function cautionBox(w: Writer, r: ReportData): void {
  const { doc } = w;
  doc.moveDown(0.6);
  const y = doc.y;
  w.font('regular', 8.5);
  const h = doc.heightOfString(r.caution, { width: w.width - 24 }) + 28;
  doc.save().rect(MARGIN, y, w.width, h).fillAndStroke(C.amberPale, C.amber).restore();
  w.font('bold', 9).text('Caution', MARGIN + 12, y + 8, { width: w.width - 24 });
  w.font('regular', 8.5).text(r.caution, MARGIN + 12, doc.y + 2, { width: w.width - 24 });
  doc.y = y + h;
  doc.x = MARGIN;
}

/** The loss ledger: units ranked by the cost of their destruction, with the site total. */
function ledgerSection(w: Writer, r: ReportData, n: Numbers): void {
  const { fixed, fixedU } = n;
  const cur = r.site.currency;
  const t = r.ledger.totals;
  const rows = r.ledger.rows;
  const dDec = mwhDecimals(Math.max(0, ...rows.map((x) => x.destruction_MWh), t.destruction_MWh));
  w.heading(
    'Loss ledger',
    `Units ranked by the cost of their exergy destruction over steady hours. Share of the site's ${r.ledger.shareBasis}. Site total ${fixedU(t.destruction_MWh, t.destruction_U_MWh, dDec).replace(' ± ', ' MWh ± ')} MWh destroyed${t.cost !== null ? `, costing ${cur} ${fixedU(t.cost, t.cost_U, 0)}` : ''}.`,
  );
  if (!rows.length) {
    w.para('The site has no units.');
    return;
  }
  w.table(
    [
      { head: '#', width: 14, align: 'right' },
      { head: 'Unit', width: 80 },
      { head: 'Kind', width: 50 },
      { head: 'Destruction [MWh]', width: 62, align: 'right' },
      { head: `Cost [${cur}]`, width: 90, align: 'right' },
      { head: 'Share [%]', width: 32, align: 'right' },
      { head: 'Efficiency [%]', width: 52, align: 'right' },
      { head: 'Steady [h]', width: 33, align: 'right' },
      { head: 'Unsettled [h]', width: 38, align: 'right' },
      { head: 'Idle [h]', width: 29, align: 'right' },
      { head: 'Suspect [h]', width: 35.28, align: 'right' },
    ],
    rows.map((x) => [
      String(x.rank),
      x.name,
      x.kindLabel,
      fixedU(x.destruction_MWh, x.destruction_U_MWh, dDec),
      x.cost === null ? 'no price' : fixedU(x.cost, x.cost_U, 0),
      fixed(x.share === null ? null : x.share * 100, 1),
      x.efficiencyMean === null ? '—' : fixedU(x.efficiencyMean * 100, x.efficiencyMean_U === null ? null : x.efficiencyMean_U * 100, 1),
      ...STATES.map((s) => String(x.hours[s])),
    ]),
    {
      bar: { col: 5, values: rows.map((x) => x.share) },
      total: ['', 'Site total', '', fixedU(t.destruction_MWh, t.destruction_U_MWh, dDec), t.cost === null ? '' : fixedU(t.cost, t.cost_U, 0), fixed(100, 1), '', ...STATES.map((s) => String(t.hours[s]))],
    },
  );
}

type LedgerRow = ReportData['ledger']['rows'][number];

/** One unit's band: teal product, light copper loss (hatched), copper destruction, then its efficiency. */
function fuelBand(w: Writer, x: LedgerRow, n: Numbers, labelW: number, barW: number): void {
  const { doc } = w;
  w.ensure(16);
  const y = doc.y;
  w.font('regular', 7.8).text(x.name, MARGIN, y + 2, { width: labelW - 6, lineBreak: false, ellipsis: true });
  const f = x.fuel_MWh;
  const parts: [number, string, boolean][] = [
    [x.product_MWh / f, C.teal, false],
    [x.loss_MWh / f, C.copperPale, true],
    [x.destruction_MWh / f, C.copper, false],
  ];
  let px = MARGIN + labelW;
  const end = px + barW; // the band never runs past its row's width (shares may sum above 1 by rounding)
  for (const [share, color, hatch] of parts) {
    const pw = Math.min(end - px, Math.max(0, Math.min(1, share)) * barW);
    if (pw <= 0) continue;
    doc.save().rect(px, y + 1, pw, 10).fill(color).restore();
    if (hatch) {
      doc.save().rect(px, y + 1, pw, 10).clip();
      for (let hx = px - 10; hx < px + pw; hx += 4) doc.moveTo(hx, y + 11).lineTo(hx + 10, y + 1);
      doc.lineWidth(0.5).stroke(C.copper).restore();
    }
    px += pw;
  }
  w.font('regular', 7.2, C.soft).text(x.efficiencyMean === null ? 'dissipative' : `efficiency ${n.pct(x.efficiencyMean)} %`, MARGIN + labelW + barW + 6, y + 2, { width: 64, align: 'right' });
  doc.y = y + 14;
  doc.x = MARGIN;
}

/** Where each unit's fuel exergy went: a stacked band per unit with fuel (none when no unit had fuel). */
function fuelBandsSection(w: Writer, r: ReportData, n: Numbers): void {
  const flows = r.ledger.rows.filter((x) => x.fuel_MWh > 0);
  if (!flows.length) return;
  w.heading('Where each unit’s fuel exergy went', 'Share of each unit’s fuel exergy over steady hours: product (teal, left), loss (light copper, hatched), destruction (copper, right).');
  const labelW = 120;
  const barW = w.width - labelW - 70;
  for (const x of flows) fuelBand(w, x, n, labelW, barW);
}

/** Efficiency against baseline: measured against expected over the same steady hours. */
function efficiencySection(w: Writer, r: ReportData, n: Numbers): void {
  const { fixed, fixedU, pct, power, powerU, powerUnit: P } = n;
  w.heading('Efficiency against baseline', 'Measured mean against the active baseline’s expected mean over the same steady hours. Difference in percentage points.');
  w.table(
    [
      { head: 'Unit', width: 92 },
      { head: 'Baseline', width: 118 },
      { head: 'Hours compared [h]', width: 46, align: 'right' },
      { head: 'Measured efficiency [%]', width: 66, align: 'right' },
      { head: 'Expected efficiency [%]', width: 52, align: 'right' },
      { head: 'Difference [pp]', width: 44, align: 'right' },
      { head: `Measured destruction [${P}]`, width: 52.28, align: 'right' },
      { head: `Expected destruction [${P}]`, width: 45, align: 'right' },
    ],
    r.efficiency.map((e) => [
      e.name,
      e.baseline ?? 'no active baseline (measured over all steady hours)',
      `${e.hoursCompared} of ${e.steadyHours}`,
      e.measuredEfficiency === null ? '—' : fixedU(e.measuredEfficiency * 100, e.measuredEfficiency_U === null || e.measuredEfficiency_U === undefined ? null : e.measuredEfficiency_U * 100, 1),
      e.expectedEfficiency === null ? '—' : pct(e.expectedEfficiency),
      e.measuredEfficiency !== null && e.expectedEfficiency !== null ? fixed((e.measuredEfficiency - e.expectedEfficiency) * 100, 1) : '—',
      e.measuredDestruction_W === null ? '—' : powerU(e.measuredDestruction_W, e.measuredDestruction_U_W),
      e.expectedDestruction_W === null ? '—' : power(e.expectedDestruction_W),
    ]),
  );
}

/** The drift notices opened in the month or not yet closed, times in the site's clock. */
function noticesSection(w: Writer, r: ReportData, n: Numbers): void {
  const { fixed, powerU, powerUnit: P } = n;
  const tz = r.site.timeZone;
  const cur = r.site.currency;
  w.heading('Drift notices', 'Opened in the month, or not yet closed. A notice is a sustained shift from the expected value: a prompt to look, not an alarm.');
  if (!r.notices.length) {
    w.para('No drift notices.');
    return;
  }
  const at = (ms: number) => siteStamp(ms, r.site.timeZone);
  w.table(
    [
      { head: 'Unit', width: 92 },
      { head: 'Shift', width: 82 },
      { head: 'Status', width: 58 },
      { head: `Onset (${tz})`, width: 68 },
      { head: `Signal (${tz})`, width: 68 },
      { head: `Extra destruction [${P}]`, width: 72.28, align: 'right' },
      { head: `Extra cost [${cur}/day]`, width: 75, align: 'right' },
    ],
    r.notices.map((x) => [
      x.unitName,
      x.direction === 'up' ? 'more destruction than expected' : 'less destruction than expected',
      NOTICE_STATUS_WORDS[x.status as NoticeStatus]?.label ?? 'other',
      at(x.onsetMs),
      at(x.signalMs),
      powerU(x.extra_W, x.shiftU_W) + (x.exceedsUncertainty === false ? ' (within uncertainty)' : ''),
      fixed(x.extraCost_per_day, 0),
    ]),
  );
}

/** Data quality: hours by state per unit, and the commonest reasons for hours that are not steady. */
function qualitySection(w: Writer, r: ReportData): void {
  const { doc } = w;
  w.heading('Data quality', 'Hours of the month by state for each unit; “no unit hour” means no data or not computed.');
  w.table(
    [
      { head: 'Unit', width: 175 },
      { head: 'Steady [h]', width: 68, align: 'right' },
      { head: 'Unsettled [h]', width: 68, align: 'right' },
      { head: 'Idle [h]', width: 68, align: 'right' },
      { head: 'Suspect [h]', width: 68, align: 'right' },
      { head: 'No unit hour [h]', width: 68.28, align: 'right' },
    ],
    r.quality.units.map((q) => [q.name, ...STATES.map((s) => String(q.hours[s])), String(q.noHour)]),
  );
  doc.moveDown(0.6);
  w.font('bold', 9).text('Most frequent reasons for hours that are not steady', MARGIN, doc.y, { width: w.width });
  doc.moveDown(0.3);
  if (!r.quality.reasons.length) w.para('None: every hour with data was steady.');
  else
    w.table(
      [
        { head: 'Reason', width: 110 },
        { head: 'Example', width: 345.28 },
        { head: 'Hours [h]', width: 60, align: 'right' },
      ],
      r.quality.reasons.map((q) => [labelOf(q.code, 'other reason'), q.example, String(q.hours)]),
    );
}

/** The footer of every page: site, month, page of pages. */
function pageFooters(w: Writer, r: ReportData): void {
  const { doc } = w;
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const fy = doc.page.height - MARGIN + 6;
    const keep = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    w.font('regular', 7, C.faint).text(`Lossline · ${r.site.name} · ${r.period.label} · page ${i + 1} of ${range.count}`, MARGIN, fy, { width: w.width, align: 'right', lineBreak: false });
    doc.page.margins.bottom = keep;
  }
}

/** Writes the report; returns the pdfkit document (a readable stream), already ended. */
export function reportPdf(r: ReportData): PDFKit.PDFDocument {
  const w = new Writer(r);
  const n = reportNumbers(writerOf(r.display));
  titleBlock(w, r);
  cautionBox(w, r);
  ledgerSection(w, r, n);
  fuelBandsSection(w, r, n);
  efficiencySection(w, r, n);
  noticesSection(w, r, n);
  qualitySection(w, r);
  pageFooters(w, r);
  w.doc.end();
  return w.doc;
}

/** The whole PDF in memory (for tests and small sites). */
export function reportPdfBuffer(r: ReportData): Promise<Buffer> {
  const doc = reportPdf(r);
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}
