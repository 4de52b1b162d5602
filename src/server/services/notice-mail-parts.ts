/**
 * The parts every notice mail shares, drift or rule alike: the link and the caution it ends with, as
 * text and as HTML, and the HTML body of a head line, a list of figures and the link. Composition only.
 */
import { SAFETY_CAUTION } from '~/lib/caution';
import { PALETTE } from '~/lib/palette';
import { escapeHtml } from '../mail';

/** The text lines a notice mail ends with: the link, then the product's caution. */
export const textTail = (url: string, caution: string = SAFETY_CAUTION): string[] => ['', `Open the notice: ${url}`, '', caution];

/** The caution as the HTML box of a mail. */
export const htmlCaution = (caution: string = SAFETY_CAUTION): string =>
  `<p style="border:1px solid ${PALETTE.amber.DEFAULT};background:${PALETTE.amber.pale};padding:8px">${escapeHtml(caution)}</p>`;

/** A notice mail's HTML: the head (already HTML), the figures as a list, the link and the caution. */
export const htmlBody = (headHtml: string, lines: readonly string[], url: string, caution: string = SAFETY_CAUTION): string =>
  [
    `<p>${headHtml}</p>`,
    `<ul>${lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul>`,
    `<p><a href="${escapeHtml(url)}">Open the notice</a></p>`,
    htmlCaution(caution),
  ].join('\n');
