/**
 * Byte decoding of uploaded exports: Uint8Array chunks in, strings out, with flat memory.
 *
 * The encoding is decided once, from the first `sampleBytes` bytes (64 KiB by default), in this order:
 * 1. a byte-order mark (UTF-8 EF BB BF, UTF-16LE FF FE, UTF-16BE FE FF) decides, and is stripped;
 * 2. many zero bytes on one parity only (odd offsets: LE, even offsets: BE) means UTF-16 without a mark;
 * 3. any other zero byte means the file is binary (fatal);
 * 4. bytes that are valid UTF-8 are UTF-8, otherwise the text is read as windows-1252 (Latin-1 with
 *    the printable 0x80-0x9F range, as browsers read "latin1");
 * 5. a decoded sample with more than 2 % control characters (other than tab, CR, LF, form feed) is
 *    binary (fatal).
 * Multi-byte sequences split across chunks are kept whole by TextDecoder's streaming mode.
 */
import { IngestError } from './errors';

export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface EncodingDecision {
  encoding: TextEncodingName;
  /** True when a byte-order mark was found (and stripped). */
  bom: boolean;
  /** Why the decision was made, for the upload report. */
  reason: string;
}

export interface StreamDecoder {
  /** Feeds one chunk; returns the text that is ready (empty while the first sample is buffered). */
  push(chunk: Uint8Array): string;
  /** Ends the stream; returns the remaining text. Throws EMPTY_FILE when no byte arrived. */
  end(): string;
  /** The decision, or null before the sample is complete. */
  readonly decision: EncodingDecision | null;
  /** U+FFFD replacement characters produced after the sample (invalid bytes later in a UTF-8 file). */
  readonly replacementCount: number;
  /** Bytes seen so far. */
  readonly byteCount: number;
}

export interface DecoderOptions {
  /** Bytes inspected before deciding [bytes]; default 65536. */
  sampleBytes?: number;
}

const CONTROL_RATIO_LIMIT = 0.02;

/** Decides the encoding of a byte sample (see module comment). Throws BINARY_FILE. */
export function detectEncoding(sample: Uint8Array): EncodingDecision {
  const n = sample.length;
  if (n >= 3 && sample[0] === 0xef && sample[1] === 0xbb && sample[2] === 0xbf) {
    return { encoding: 'utf-8', bom: true, reason: 'UTF-8 byte-order mark' };
  }
  if (n >= 2 && sample[0] === 0xff && sample[1] === 0xfe) {
    return { encoding: 'utf-16le', bom: true, reason: 'UTF-16LE byte-order mark' };
  }
  if (n >= 2 && sample[0] === 0xfe && sample[1] === 0xff) {
    return { encoding: 'utf-16be', bom: true, reason: 'UTF-16BE byte-order mark' };
  }
  let zeroEven = 0;
  let zeroOdd = 0;
  for (let i = 0; i < n; i++) {
    if (sample[i] === 0) {
      if (i & 1) zeroOdd++;
      else zeroEven++;
    }
  }
  const half = n / 2;
  if (n >= 4 && zeroOdd > 0.3 * half && zeroEven < 0.05 * half) {
    return { encoding: 'utf-16le', bom: false, reason: 'UTF-16LE without mark (zero bytes at odd offsets)' };
  }
  if (n >= 4 && zeroEven > 0.3 * half && zeroOdd < 0.05 * half) {
    return { encoding: 'utf-16be', bom: false, reason: 'UTF-16BE without mark (zero bytes at even offsets)' };
  }
  if (zeroEven + zeroOdd > 0) {
    throw new IngestError(
      'BINARY_FILE',
      `The file contains ${zeroEven + zeroOdd} NUL bytes in its first ${n} bytes, so it is not a text export. ` +
        'Upload the CSV file itself (not a spreadsheet workbook or an archive).',
      { nulBytes: zeroEven + zeroOdd, sampleBytes: n },
    );
  }
  try {
    // stream: true so that a multi-byte sequence cut at the end of the sample is not counted as invalid.
    new TextDecoder('utf-8', { fatal: true }).decode(sample, { stream: true });
    return { encoding: 'utf-8', bom: false, reason: 'valid UTF-8' };
  } catch {
    return { encoding: 'windows-1252', bom: false, reason: 'not valid UTF-8; read as windows-1252 (Latin-1)' };
  }
}

/** Counts control characters other than tab, LF, CR and form feed. */
function controlCount(text: string): number {
  let count = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 127) count++;
  }
  return count;
}

function countReplacement(text: string): number {
  let count = 0;
  let i = text.indexOf('\uFFFD');
  while (i >= 0) {
    count++;
    i = text.indexOf('\uFFFD', i + 1);
  }
  return count;
}

/**
 * Creates a streaming decoder. Memory stays flat: at most `sampleBytes` are buffered before the
 * decision, after which every chunk is decoded as it arrives.
 */
export function createDecoder(options: DecoderOptions = {}): StreamDecoder {
  const sampleBytes = options.sampleBytes ?? 65536;
  if (!(sampleBytes >= 4)) throw new IngestError('INVALID_OPTIONS', `sampleBytes must be at least 4, got ${sampleBytes}.`);
  let pending: Uint8Array[] = [];
  let pendingBytes = 0;
  let decision: EncodingDecision | null = null;
  let decoder: TextDecoder | null = null;
  let replacementCount = 0;
  let byteCount = 0;

  function decide(): string {
    const sample = new Uint8Array(pendingBytes);
    let off = 0;
    for (const p of pending) {
      sample.set(p, off);
      off += p.length;
    }
    pending = [];
    pendingBytes = 0;
    decision = detectEncoding(sample);
    decoder = new TextDecoder(decision.encoding);
    const text = decoder.decode(sample, { stream: true });
    const controls = controlCount(text);
    if (text.length > 0 && controls > CONTROL_RATIO_LIMIT * text.length) {
      throw new IngestError(
        'BINARY_FILE',
        `${controls} of the first ${text.length} characters are control characters, so the file is not a text export. ` +
          'Upload the CSV file itself.',
        { controlCharacters: controls, sampleCharacters: text.length },
      );
    }
    return text;
  }

  return {
    push(chunk: Uint8Array): string {
      byteCount += chunk.length;
      if (decoder) {
        const text = decoder.decode(chunk, { stream: true });
        if (decision!.encoding === 'utf-8') replacementCount += countReplacement(text);
        return text;
      }
      if (chunk.length > 0) {
        pending.push(chunk);
        pendingBytes += chunk.length;
      }
      return pendingBytes >= sampleBytes ? decide() : '';
    },
    end(): string {
      if (!decoder) {
        if (pendingBytes === 0) {
          throw new IngestError('EMPTY_FILE', 'The file is empty (0 bytes). Export the data again and upload the new file.');
        }
        return decide() + decoder!.decode();
      }
      const text = decoder.decode();
      if (decision!.encoding === 'utf-8') replacementCount += countReplacement(text);
      return text;
    },
    get decision() {
      return decision;
    },
    get replacementCount() {
      return replacementCount;
    },
    get byteCount() {
      return byteCount;
    },
  };
}

/** Decodes a whole byte array at once (small files, tests, previews). */
export function decodeAll(bytes: Uint8Array, options: DecoderOptions = {}): { text: string; decision: EncodingDecision } {
  const d = createDecoder(options);
  const text = d.push(bytes) + d.end();
  return { text, decision: d.decision! };
}
