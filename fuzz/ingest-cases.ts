/**
 * fast-check arbitraries for hostile and careless historian exports: encodings, separators, line
 * breaks, ragged rows, quotes, huge fields, binary bytes, time chaos and numeric extremes. Each case
 * is the bytes of one file. Invented data only.
 */
import fc from 'fast-check';

const SEPARATORS = [',', ',', ',', ';', ';', '\t', '|', ' '];
const LINE_BREAKS = ['\n', '\r\n', '\r'];

/** The time format of a file (0..7), kept for most rows; the rest are chaos. */
const TIME_STYLES = 8;
function styled(i: number, style: number): string {
  const base = Date.UTC(2026, 2, 28, 22) + i * 60_000;
  const d = new Date(base);
  const p = (n: number, w = 2) => String(n).padStart(w, '0');
  const [y, mo, da, h, mi, s] = [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds()];
  switch (style) {
    case 1:
      return `${p(da)}.${p(mo)}.${y} ${p(h)}:${p(mi)}`;
    case 2:
      return `${p(mo)}/${p(da)}/${y} ${h % 12 || 12}:${p(mi)} ${h < 12 ? 'AM' : 'PM'}`;
    case 3:
      return `${p(da)}/${p(mo)}/${y} ${p(h)}:${p(mi)}`;
    case 4:
      return String(Math.floor(base / 1000));
    case 5:
      return String(base);
    case 6:
      return `${y}-${p(mo)}-${p(da)}T${p(h)}:${p(mi)}:${p(s)}+05:30`;
    case 7:
      return `${y}-${p(mo)}-${p(da)}T${p(h)}:${p(mi)}:${p(s)}Z`;
    default:
      return `${y}-${p(mo)}-${p(da)} ${p(h)}:${p(mi)}:${p(s)}`;
  }
}

/** Time cells: mostly the file's own format, now and then chaos. */
const fileTimeCell = (i: number, style: number): fc.Arbitrary<string> =>
  fc.oneof({ weight: 30, arbitrary: fc.constant(styled(i, style)) }, { weight: 1, arbitrary: timeCell(i) });

/** Time cells: the formats exports use, and the ways they go wrong. */
const timeCell = (i: number): fc.Arbitrary<string> => {
  const base = Date.UTC(2026, 2, 28, 22) + i * 60_000; // across a spring clock change in Europe
  const d = new Date(base);
  const p = (n: number, w = 2) => String(n).padStart(w, '0');
  const [y, mo, da, h, mi, s] = [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds()];
  return fc.oneof(
    { weight: 6, arbitrary: fc.constant(`${y}-${p(mo)}-${p(da)} ${p(h)}:${p(mi)}:${p(s)}`) },
    { weight: 2, arbitrary: fc.constant(`${p(da)}.${p(mo)}.${y} ${p(h)}:${p(mi)}`) },
    { weight: 2, arbitrary: fc.constant(`${p(mo)}/${p(da)}/${y} ${h % 12 || 12}:${p(mi)} ${h < 12 ? 'AM' : 'PM'}`) },
    { weight: 1, arbitrary: fc.constant(`${p(da)}/${p(mo)}/${y} ${p(h)}:${p(mi)}`) },
    { weight: 1, arbitrary: fc.constant(String(Math.floor(base / 1000))) },
    { weight: 1, arbitrary: fc.constant(String(base)) },
    { weight: 1, arbitrary: fc.constant(String(25569 + base / 86_400_000)) },
    { weight: 1, arbitrary: fc.constant(`${y}-${p(mo)}-${p(da)}T${p(h)}:${p(mi)}:${p(s)}+05:30`) },
    {
      weight: 1,
      arbitrary: fc.constantFrom(
        '9999-12-31 23:59:59',
        '0001-01-01 00:00',
        '1970-01-01 00:00',
        '2026-02-30 10:00',
        '2026-13-01 00:00',
        '24:00',
        '',
        'NaT',
        '#########',
        '2026-03-29 02:30:00',
        '2026-10-25 02:30:00',
        '99999999999999999999',
        '-1',
        '1e308',
      ),
    },
    { weight: 1, arbitrary: fc.string({ maxLength: 25 }) },
  );
};

/** Value cells: numbers in every dress, and what is not a number. */
const valueCell: fc.Arbitrary<string> = fc.oneof(
  { weight: 8, arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }).map((v) => v.toFixed(3)) },
  { weight: 2, arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }).map((v) => v.toFixed(2).replace('.', ',')) },
  { weight: 1, arbitrary: fc.integer({ min: 1000, max: 9_999_999 }).map((v) => v.toLocaleString('de-DE')) },
  { weight: 1, arbitrary: fc.integer({ min: 1000, max: 9_999_999 }).map((v) => v.toLocaleString('en-US')) },
  { weight: 2, arbitrary: fc.double().map(String) },
  {
    weight: 2,
    arbitrary: fc.constantFrom(
      '',
      ' ',
      'NaN',
      'nan',
      'Infinity',
      '-Infinity',
      '1e308',
      '-1e308',
      '1e400',
      '3.4028235e38',
      '-0',
      '0x1F',
      '1.2.3',
      '--5',
      '+',
      'Shutdown',
      'I/O Timeout',
      '#N/A',
      '=1+1',
      '@SUM(A1)',
      '"quoted"',
      '12"5',
      '1' + '0'.repeat(400),
      '0.' + '1'.repeat(400),
    ),
  },
  { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 8 }) },
);

const nameCell: fc.Arbitrary<string> = fc.oneof(
  { weight: 20, arbitrary: fc.stringMatching(/^[A-Z]{1,3}\.[A-Z]{2}-\d{2,3}$/) },
  { weight: 1, arbitrary: fc.string({ maxLength: 20 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 10 }) },
  { weight: 1, arbitrary: fc.constantFrom('', 'Time', 'Zeit', 'value', 'a\u0000b', '=cmd|calc', '<script>x</script>', 'x'.repeat(300)) },
);

const unitCell = fc.constantFrom('degC', '°C', 'bar(g)', 'barg', 'bara', 't/h', 'kg/s', 'kW', '%', 'K', 'ppm', '', '???');

/** Quotes a cell now and then, sometimes badly. */
const quoteAs = (cell: string, mode: number) => (mode === 1 ? `"${cell.replace(/"/g, '""')}"` : mode === 2 ? `"${cell}` : mode === 3 ? `${cell}"x` : cell);

interface FileShape {
  sep: string;
  br: string;
  mixedBreaks: boolean;
  names: string[];
  units: string[] | null;
  long: boolean;
  rows: { time: string; values: string[]; quote: number[]; dropOrAdd: number }[];
  preamble: string[];
  blankLines: number;
  hugeField: number;
  encoding: 'utf8' | 'utf8bom' | 'utf16le' | 'utf16be' | 'latin1';
  mutations: { at: number; byte: number }[];
  truncateTo: number | null;
  binary: boolean;
}

const shape: fc.Arbitrary<FileShape> = fc
  .record({
    sep: fc.constantFrom(...SEPARATORS),
    br: fc.constantFrom(...LINE_BREAKS),
    mixedBreaks: fc.boolean(),
    nCols: fc.integer({ min: 1, max: 8 }),
    nRows: fc.integer({ min: 0, max: 150 }),
    long: fc.boolean(),
    withUnits: fc.boolean(),
    preamble: fc.array(fc.string({ maxLength: 40 }), { maxLength: 3 }),
    blankLines: fc.oneof({ weight: 9, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: fc.integer({ min: 1, max: 120_000 }) }),
    hugeField: fc.oneof({ weight: 19, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: fc.integer({ min: 60_000, max: 1_200_000 }) }),
    encoding: fc.constantFrom('utf8', 'utf8', 'utf8', 'utf8', 'utf8bom', 'utf16le', 'utf16be', 'latin1'),
    mutations: fc.oneof(
      { weight: 4, arbitrary: fc.constant([] as { at: number; byte: number }[]) },
      { weight: 1, arbitrary: fc.array(fc.record({ at: fc.nat(), byte: fc.integer({ min: 0, max: 255 }) }), { maxLength: 6 }) },
    ),
    timeStyle: fc.integer({ min: 0, max: TIME_STYLES - 1 }),
    badQuotes: fc.oneof({ weight: 9, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
    truncate: fc.option(fc.nat(), { freq: 8 }),
    binary: fc.oneof({ weight: 19, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
  })
  .chain((r) =>
    fc.record({
      sep: fc.constant(r.sep),
      br: fc.constant(r.br),
      mixedBreaks: fc.constant(r.mixedBreaks),
      names: fc.array(nameCell, { minLength: r.nCols, maxLength: r.nCols }),
      units: r.withUnits ? fc.array(unitCell, { minLength: r.nCols, maxLength: r.nCols }) : fc.constant(null),
      long: fc.constant(r.long),
      rows: fc.tuple(...Array.from({ length: r.nRows }, (_, i) =>
        fc.record({
          time: fileTimeCell(i, r.timeStyle),
          values: fc.array(valueCell, { minLength: r.long ? 2 : r.nCols, maxLength: r.long ? 2 : r.nCols }),
          quote: fc.array(fc.oneof({ weight: 40, arbitrary: fc.constant(0) }, { weight: 6, arbitrary: fc.constant(1) }, { weight: r.badQuotes ? 1 : 0, arbitrary: fc.integer({ min: 2, max: 3 }) }), {
            minLength: 9,
            maxLength: 9,
          }),
          dropOrAdd: fc.oneof({ weight: 15, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: fc.integer({ min: -3, max: 3 }) }),
        }),
      )),
      preamble: fc.constant(r.preamble),
      blankLines: fc.constant(r.blankLines),
      hugeField: fc.constant(r.hugeField),
      encoding: fc.constant(r.encoding as FileShape['encoding']),
      mutations: fc.constant(r.mutations),
      truncateTo: fc.constant(r.truncate),
      binary: fc.constant(r.binary),
    }),
  );

function encode(text: string, encoding: FileShape['encoding']): Uint8Array {
  if (encoding === 'utf8') return new TextEncoder().encode(text);
  if (encoding === 'utf8bom') return new TextEncoder().encode('\ufeff' + text);
  if (encoding === 'latin1') return Uint8Array.from(text, (c) => c.charCodeAt(0) & 0xff);
  const out = new Uint8Array(2 + text.length * 2);
  const le = encoding === 'utf16le';
  out[0] = le ? 0xff : 0xfe;
  out[1] = le ? 0xfe : 0xff;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[2 + 2 * i] = le ? c & 0xff : c >> 8;
    out[3 + 2 * i] = le ? c >> 8 : c & 0xff;
  }
  return out;
}

/** Renders a file shape into bytes. */
export function render(f: FileShape): Uint8Array {
  const lines: string[] = [...f.preamble];
  const header = f.long ? ['Time', 'Tag', 'Value'] : ['Time', ...f.names];
  lines.push(header.join(f.sep));
  if (f.units && !f.long) lines.push(['', ...f.units].join(f.sep));
  f.rows.forEach((r, i) => {
    let cells = f.long ? [r.time, f.names[i % f.names.length] ?? 'T', r.values[0] ?? ''] : [r.time, ...r.values];
    cells = cells.map((c, k) => quoteAs(c, r.quote[k % r.quote.length] ?? 0));
    if (r.dropOrAdd < 0) cells = cells.slice(0, Math.max(1, cells.length + r.dropOrAdd));
    else if (r.dropOrAdd > 0) cells = [...cells, ...Array.from({ length: r.dropOrAdd }, () => '9')];
    if (f.hugeField && i === Math.floor(f.rows.length / 2)) cells[cells.length - 1] = 'x'.repeat(f.hugeField);
    lines.push(cells.join(f.sep));
  });
  const br = (k: number) => (f.mixedBreaks ? LINE_BREAKS[k % 3]! : f.br);
  let text = lines.map((l, k) => l + br(k)).join('');
  if (f.blankLines) {
    const cut = text.indexOf(f.br, text.indexOf(f.br) + 1) + 1 || text.length;
    text = text.slice(0, cut) + f.br.repeat(f.blankLines) + text.slice(cut);
  }
  let bytes = encode(text, f.encoding);
  if (f.binary) {
    const junk = new Uint8Array(2048);
    for (let i = 0; i < junk.length; i++) junk[i] = (i * 7919) & 0xff;
    const b = new Uint8Array(bytes.length + junk.length);
    b.set(bytes.subarray(0, Math.floor(bytes.length / 2)));
    b.set(junk, Math.floor(bytes.length / 2));
    b.set(bytes.subarray(Math.floor(bytes.length / 2)), Math.floor(bytes.length / 2) + junk.length);
    bytes = b;
  }
  if (bytes.length && f.mutations.length) {
    bytes = Uint8Array.from(bytes);
    for (const m of f.mutations) bytes[m.at % bytes.length] = m.byte;
  }
  if (f.truncateTo !== null) bytes = bytes.subarray(0, f.truncateTo % (bytes.length + 1));
  return bytes;
}

/** One hostile export, as bytes. */
export const hostileExport: fc.Arbitrary<Uint8Array> = shape.map(render);
