/**
 * Lossline's palette (docs/design.md, "Look"): warm paper, ink, one copper accent for destruction and
 * loss, teal for product exergy, amber for unsettled hours, slate for idle, red for alerts. One
 * definition for the pages (tailwind.config.ts), the charts and the PDF report.
 *
 * Contrast (WCAG 2.1, relative luminance): every text colour (ink.faint, copper, teal, slate, alert and
 * the .deep shades) reaches 4.5:1 on paper, paper.deep, white and every .pale tint; amber.DEFAULT is
 * a mark colour (3:1 against the same backgrounds, WCAG 1.4.11) and amber.deep is its text shade.
 * tests/foundation/palette.test.ts checks these ratios.
 */
export const PALETTE = {
  paper: { DEFAULT: '#f7f3ea', deep: '#efe8d9', edge: '#ddd3bf' },
  ink: { DEFAULT: '#22201c', soft: '#4a463e', faint: '#655f55' },
  copper: { DEFAULT: '#9a4924', deep: '#8e3f1c', pale: '#f3dccd' },
  teal: { DEFAULT: '#1b6a63', deep: '#155a54', pale: '#d3ebe7' },
  amber: { DEFAULT: '#a4700f', deep: '#80580c', pale: '#f7e6bf' },
  slate: { DEFAULT: '#58616b', pale: '#e1e4e8' },
  alert: { DEFAULT: '#a3262a', pale: '#f5d6d4' },
} as const;

/** Backgrounds text is drawn on. */
export const BACKGROUNDS = [PALETTE.paper.DEFAULT, PALETTE.paper.deep, '#ffffff', PALETTE.copper.pale, PALETTE.teal.pale, PALETTE.amber.pale, PALETTE.slate.pale, PALETTE.alert.pale] as const;
/** Colours used for text. */
export const TEXT_COLOURS = [PALETTE.ink.DEFAULT, PALETTE.ink.soft, PALETTE.ink.faint, PALETTE.copper.DEFAULT, PALETTE.copper.deep, PALETTE.teal.DEFAULT, PALETTE.teal.deep, PALETTE.amber.deep, PALETTE.slate.DEFAULT, PALETTE.alert.DEFAULT] as const;
/** Colours used only for marks and lines (non-text contrast, 3:1). */
export const MARK_COLOURS = [PALETTE.amber.DEFAULT] as const;

/** WCAG 2.1 relative luminance of an sRGB colour written #rrggbb. */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}

/** WCAG 2.1 contrast ratio of two colours (1 to 21). */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}
