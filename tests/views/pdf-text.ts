import { inflateSync } from 'node:zlib';

/**
 * A small text extractor for the PDFs pdfkit writes (embedded subset fonts, hex glyph strings in
 * TJ/Tj, a ToUnicode CMap per font, Flate-compressed streams). Enough to check that a report says
 * what it should; not a general PDF reader.
 */
export function pdfText(pdf: Buffer): string {
  const src = pdf.toString('latin1');
  const objects = new Map<number, { dict: string; stream: Buffer | null }>();
  const objRe = /(\d+) 0 obj\s*([\s\S]*?)endobj/g;
  for (let m = objRe.exec(src); m; m = objRe.exec(src)) {
    const body = m[2]!;
    const at = body.search(/stream\r?\n/);
    if (at < 0) {
      objects.set(Number(m[1]), { dict: body, stream: null });
      continue;
    }
    const dict = body.slice(0, at);
    const start = at + body.slice(at).indexOf('\n') + 1;
    const end = body.lastIndexOf('endstream');
    let raw = Buffer.from(body.slice(start, end).replace(/\r?\n$/, ''), 'latin1');
    if (/\/FlateDecode/.test(dict)) raw = inflateSync(raw);
    objects.set(Number(m[1]), { dict, stream: raw });
  }

  // Font resource names (F1, F2 ...) to their ToUnicode maps.
  const cmapOf = new Map<number, Map<string, string>>();
  const parseCmap = (text: string) => {
    const map = new Map<string, string>();
    // A target may hold several code points, written with or without spaces: <0066 0069> is "fi".
    const hexToStr = (h: string) => String.fromCodePoint(...(h.replace(/\s+/g, '').match(/.{4}/g) ?? []).map((x) => parseInt(x, 16)));
    for (const block of text.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
      for (const p of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F\s]+)>/g)) map.set(p[1]!.toLowerCase(), hexToStr(p[2]!));
    }
    for (const block of text.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
      for (const p of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(<[0-9a-fA-F\s]+>|\[[^\]]*\])/g)) {
        const a = parseInt(p[1]!, 16);
        const b = parseInt(p[2]!, 16);
        const width = p[1]!.length;
        if (p[3]!.startsWith('[')) {
          const list = [...p[3]!.matchAll(/<([0-9a-fA-F\s]+)>/g)].map((x) => hexToStr(x[1]!));
          for (let i = a; i <= b; i++) map.set(i.toString(16).padStart(width, '0'), list[i - a] ?? '');
        } else {
          const first = parseInt(p[3]!.slice(1, -1), 16);
          for (let i = a; i <= b; i++) map.set(i.toString(16).padStart(width, '0'), String.fromCodePoint(first + i - a));
        }
      }
    }
    return map;
  };
  const fontByName = new Map<string, Map<string, string>>();
  for (const [, o] of objects) {
    for (const f of o.dict.matchAll(/\/(F\d+)\s+(\d+) 0 R/g)) {
      const font = objects.get(Number(f[2]));
      const tu = font?.dict.match(/\/ToUnicode\s+(\d+) 0 R/);
      if (!tu) continue;
      const id = Number(tu[1]);
      if (!cmapOf.has(id)) cmapOf.set(id, parseCmap(objects.get(id)?.stream?.toString('latin1') ?? ''));
      fontByName.set(f[1]!, cmapOf.get(id)!);
    }
  }

  const out: string[] = [];
  for (const [, o] of objects) {
    if (!o.stream || /\/Length1|\/Subtype\s*\/(Type1C|CIDFontType0C|OpenType)|\/FontFile/.test(o.dict)) continue;
    const text = o.stream.toString('latin1');
    if (!/\bT[Jj]\b/.test(text)) continue;
    let cmap: Map<string, string> | undefined;
    for (const op of text.matchAll(/\/(F\d+)\s+[\d.]+\s+Tf|\[((?:[^\]])*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj/g)) {
      if (op[1]) {
        cmap = fontByName.get(op[1]);
        continue;
      }
      const hexes = op[2] !== undefined ? [...op[2].matchAll(/<([0-9a-fA-F]*)>/g)].map((x) => x[1]!) : [op[3]!];
      const decoded = hexes.map((h) => (h.match(/.{4}/g) ?? []).map((g) => cmap?.get(g.toLowerCase()) ?? '').join('')).join('');
      out.push(decoded);
    }
  }
  return out.join(' ').replace(/\s+/g, ' ');
}
