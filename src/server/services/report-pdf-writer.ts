/**
 * The page machinery of the monthly report PDF (pdfkit): IBM Plex Sans embedded from @fontsource (WOFF
 * files, which pdfkit's font reader takes), the warm paper page, headings, paragraphs and tables.
 * The report's sections are in report-pdf.ts.
 */
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import PDFDocument from 'pdfkit';
import type { ReportData } from './report';
import { PALETTE } from '~/lib/palette';

/** Colours of the report, all from the one palette (src/lib/palette.ts). */
export const C = {
  paper: PALETTE.paper.DEFAULT,
  paperDeep: PALETTE.paper.deep,
  edge: PALETTE.paper.edge,
  ink: PALETTE.ink.DEFAULT,
  soft: PALETTE.ink.soft,
  faint: PALETTE.ink.faint,
  copper: PALETTE.copper.DEFAULT,
  copperPale: PALETTE.copper.pale,
  teal: PALETTE.teal.DEFAULT,
  amber: PALETTE.amber.DEFAULT,
  amberDeep: PALETTE.amber.deep,
  amberPale: PALETTE.amber.pale,
};

export const MARGIN = 40;

/** Paths of the two weights of IBM Plex Sans, or null when the package files cannot be found. */
export function plexFontFiles(): { regular: string; semibold: string } | null {
  const file = (w: number) => `@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-${w}-normal.woff`;
  try {
    const req = createRequire(import.meta.url);
    return { regular: req.resolve(file(400)), semibold: req.resolve(file(600)) };
  } catch {
    const base = join(process.cwd(), 'node_modules');
    const regular = join(base, file(400));
    const semibold = join(base, file(600));
    return existsSync(regular) && existsSync(semibold) ? { regular, semibold } : null;
  }
}

export interface Col {
  head: string;
  width: number;
  align?: 'left' | 'right';
}

export class Writer {
  readonly doc: PDFKit.PDFDocument;
  readonly width: number;
  private readonly regular: string;
  private readonly bold: string;

  constructor(readonly r: ReportData) {
    this.doc = new PDFDocument({
      size: 'A4',
      margins: { top: MARGIN, bottom: MARGIN + 14, left: MARGIN, right: MARGIN },
      bufferPages: true,
      info: { Title: `Lossline monthly site report: ${r.site.name}, ${r.period.label}`, Author: 'Lossline', Subject: 'Exergy loss ledger and baselines' },
    });
    const fonts = plexFontFiles();
    if (fonts) {
      this.doc.registerFont('plex', fonts.regular);
      this.doc.registerFont('plex-semibold', fonts.semibold);
      this.regular = 'plex';
      this.bold = 'plex-semibold';
    } else {
      // The package files are missing: fall back to the PDF standard font rather than fail the report.
      this.regular = 'Helvetica';
      this.bold = 'Helvetica-Bold';
    }
    this.width = this.doc.page.width - 2 * MARGIN;
    this.paint();
    this.doc.on('pageAdded', () => this.paint());
  }

  private paint() {
    const { doc } = this;
    doc.save().rect(0, 0, doc.page.width, doc.page.height).fill(C.paper).restore();
    doc.save().rect(0, 0, doc.page.width, 6).fill(C.copper).restore();
    doc.fillColor(C.ink);
  }

  font(weight: 'regular' | 'bold', size: number, color: string = C.ink) {
    return this.doc.font(weight === 'bold' ? this.bold : this.regular).fontSize(size).fillColor(color);
  }

  get bottom() {
    return this.doc.page.height - this.doc.page.margins.bottom;
  }

  ensure(h: number) {
    if (this.doc.y + h > this.bottom) this.doc.addPage();
  }

  heading(text: string, sub?: string) {
    this.ensure(60);
    this.doc.moveDown(0.8);
    this.font('bold', 12.5).text(text, MARGIN, this.doc.y, { width: this.width });
    if (sub) this.font('regular', 8, C.faint).text(sub, MARGIN, this.doc.y + 1, { width: this.width });
    this.doc.moveDown(0.4);
  }

  para(text: string, size = 8.5, color: string = C.soft) {
    this.font('regular', size, color).text(text, MARGIN, this.doc.y, { width: this.width });
  }

  table(cols: Col[], rows: string[][], opts: { total?: string[]; bar?: { col: number; values: (number | null)[] } } = {}) {
    const { doc } = this;
    const pad = 3;
    const size = 7.8;
    const headSize = 6.8;
    const head = () => {
      this.font('bold', headSize, C.soft);
      const h = Math.max(...cols.map((c) => doc.heightOfString(c.head, { width: c.width - 2 * pad }))) + 2 * pad;
      this.ensure(h + 16);
      const y = doc.y;
      doc.save().rect(MARGIN, y, this.width, h).fill(C.paperDeep).restore();
      let x = MARGIN;
      for (const c of cols) {
        this.font('bold', headSize, C.soft).text(c.head, x + pad, y + pad, { width: c.width - 2 * pad, align: c.align ?? 'left' });
        x += c.width;
      }
      doc.y = y + h;
    };
    const row = (cells: string[], bold: boolean, i: number | null) => {
      this.font(bold ? 'bold' : 'regular', size);
      const h = Math.max(...cells.map((t, k) => doc.heightOfString(t || ' ', { width: cols[k]!.width - 2 * pad }))) + 2 * pad + (opts.bar && i !== null ? 2.5 : 0);
      if (doc.y + h > this.bottom) {
        doc.addPage();
        head();
      }
      const y = doc.y;
      let x = MARGIN;
      cells.forEach((t, k) => {
        const c = cols[k]!;
        this.font(bold ? 'bold' : 'regular', size).text(t, x + pad, y + pad, { width: c.width - 2 * pad, align: c.align ?? 'left' });
        if (opts.bar && i !== null && k === opts.bar.col) {
          const v = opts.bar.values[i];
          if (v !== null && v !== undefined && v > 0) {
            const w = (c.width - 2 * pad) * Math.min(1, v);
            doc.save().rect(x + c.width - pad - w, y + h - 3.2, w, 2).fill(C.copper).restore();
          }
        }
        x += c.width;
      });
      doc.save().moveTo(MARGIN, y + h).lineTo(MARGIN + this.width, y + h).lineWidth(0.4).stroke(C.edge).restore();
      doc.y = y + h;
    };
    head();
    rows.forEach((cells, i) => row(cells, false, i));
    if (opts.total) row(opts.total, true, null);
    doc.x = MARGIN;
  }
}
