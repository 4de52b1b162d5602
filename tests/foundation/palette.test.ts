import { describe, expect, it } from 'vitest';
import { BACKGROUNDS, MARK_COLOURS, TEXT_COLOURS, contrastRatio } from '~/lib/palette';

describe('palette contrast (WCAG 2.1 AA)', () => {
  // Known pairs from the WCAG definition: black on white is 21:1, a colour against itself 1:1;
  // #767676 on white is the commonly quoted grey that just passes 4.5:1 (4.54, common practice).
  it('computes the ratio of the WCAG definition', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 6);
    expect(contrastRatio('#9a4924', '#9a4924')).toBeCloseTo(1, 9);
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });

  it('every text colour reaches 4.5:1 on every background (success criterion 1.4.3)', () => {
    const short = TEXT_COLOURS.flatMap((fg) => BACKGROUNDS.filter((bg) => contrastRatio(fg, bg) < 4.5).map((bg) => `${fg} on ${bg}`));
    expect(short).toEqual([]);
  });

  it('every mark colour reaches 3:1 on every background (success criterion 1.4.11)', () => {
    const short = MARK_COLOURS.flatMap((fg) => BACKGROUNDS.filter((bg) => contrastRatio(fg, bg) < 3).map((bg) => `${fg} on ${bg}`));
    expect(short).toEqual([]);
  });
});
