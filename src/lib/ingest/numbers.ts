/**
 * Number cells read straight from char codes. Accepted: surrounding spaces (also no-break spaces),
 * a leading '+' or '-', digits with an optional thousands separator between digits, one decimal mark
 * (point or comma, as the layout says), and an exponent (e or E, optional sign). Anything else is not
 * a number and the caller records the cell as rejected text.
 *
 * Up to 15 significant digits and a decimal power within 10^±22 are converted with one IEEE
 * multiplication or division of exact operands, which rounds correctly (the same double as
 * Number()); longer inputs fall back to Number() on a normalised copy.
 */

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

export type DecimalMark = '.' | ',';
export type ThousandsSeparator = '' | ',' | '.' | ' ' | "'";

function isSpace(c: number): boolean {
  return c === 32 || c === 9 || c === 160 || c === 8239 || c === 8201;
}

/**
 * Parses text[start, end) as a number. Returns NaN when the cell is not a number (and also when it is
 * blank: callers check blankness first with {@link isBlank}).
 * @param decimalCode char code of the decimal mark (46 '.' or 44 ',')
 * @param thousandsCode char code of the thousands separator, or -1 for none; a space separator also
 *   accepts no-break and narrow no-break spaces.
 */
export function parseNumberAt(text: string, start: number, end: number, decimalCode: number, thousandsCode: number): number {
  // Fast path: [-]digits[<mark>digits] in at most 15 characters (so below 2^53), nothing else.
  if (end - start <= 15 && end > start) {
    let i = start;
    let c = text.charCodeAt(i);
    const neg = c === 45;
    if (neg) i++;
    let m = 0;
    let scale = 0;
    let digits = 0;
    for (; i < end; i++) {
      c = text.charCodeAt(i);
      const d = c - 48;
      if (d >= 0 && d <= 9) {
        m = m * 10 + d;
        digits++;
      } else break;
    }
    if (digits > 0) {
      if (i === end) return neg ? -m : m;
      if (c === decimalCode) {
        i++;
        const fracStart = i;
        for (; i < end; i++) {
          const d = text.charCodeAt(i) - 48;
          if (d >= 0 && d <= 9) m = m * 10 + d;
          else break;
        }
        scale = i - fracStart;
        if (i === end && scale > 0) {
          const v = m / POW10[scale]!; // scale < 15: the cell is at most 15 characters
          return neg ? -v : v;
        }
      }
    }
  }
  return parseGeneral(text, start, end, decimalCode, thousandsCode);
}

function parseGeneral(text: string, start: number, end: number, decimalCode: number, thousandsCode: number): number {
  while (start < end && isSpace(text.charCodeAt(start))) start++;
  while (end > start && isSpace(text.charCodeAt(end - 1))) end--;
  if (start >= end) return NaN;
  let i = start;
  let negative = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0; // significant digits accumulated
  let anyDigit = false;
  let scale = 0; // decimal power to apply
  let seenDecimal = false;
  let exact = true;
  const spaceThousands = thousandsCode === 32;
  for (; i < end; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      anyDigit = true;
      if (digits < 15) {
        if (mantissa !== 0 || c !== 48) digits++;
        mantissa = mantissa * 10 + (c - 48);
        if (seenDecimal) scale--;
      } else {
        exact = false;
        if (!seenDecimal) scale++;
      }
      continue;
    }
    if (c === decimalCode && !seenDecimal) {
      seenDecimal = true;
      continue;
    }
    if (!seenDecimal && (c === thousandsCode || (spaceThousands && (c === 160 || c === 8239 || c === 8201)))) {
      // a thousands separator must sit between digits
      const prev = text.charCodeAt(i - 1);
      const next = i + 1 < end ? text.charCodeAt(i + 1) : 0;
      if (prev >= 48 && prev <= 57 && next >= 48 && next <= 57) continue;
      return NaN;
    }
    break;
  }
  if (!anyDigit) return NaN;
  if (i < end) {
    // exponent
    if (c !== 101 && c !== 69) return NaN;
    i++;
    let expNeg = false;
    if (i < end) {
      const s = text.charCodeAt(i);
      if (s === 45 || s === 43) {
        expNeg = s === 45;
        i++;
      }
    }
    if (i >= end) return NaN;
    let e = 0;
    for (; i < end; i++) {
      const d = text.charCodeAt(i);
      if (d < 48 || d > 57) return NaN;
      if (e < 100000) e = e * 10 + (d - 48);
    }
    scale += expNeg ? -e : e;
  }
  let value: number;
  if (exact && scale >= -22 && scale <= 22) {
    value = scale < 0 ? mantissa / POW10[-scale]! : mantissa * POW10[scale]!; // |scale| <= 22 checked above
  } else {
    value = slowParse(text, start, end, decimalCode, thousandsCode);
    return Number.isFinite(value) ? value : NaN; // sign handled inside
  }
  return negative ? -value : value;
}

function slowParse(text: string, start: number, end: number, decimalCode: number, thousandsCode: number): number {
  let s = '';
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c === thousandsCode || (thousandsCode === 32 && (c === 160 || c === 8239 || c === 8201))) continue;
    s += c === decimalCode ? '.' : text[i];
  }
  return Number(s);
}

/** Parses a whole string (see {@link parseNumberAt}). */
export function parseNumber(text: string, decimalMark: DecimalMark = '.', thousands: ThousandsSeparator = ''): number {
  return parseNumberAt(text, 0, text.length, decimalMark.charCodeAt(0), thousands === '' ? -1 : thousands.charCodeAt(0));
}

/** True when text[start, end) holds only spaces. */
export function isBlankAt(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (!isSpace(text.charCodeAt(i))) return false;
  return true;
}
