/**
 * The layout profile: every decision the sniffer made about one export, as plain JSON. The
 * operator may correct it (answer its questions) and the server stores it with the header
 * fingerprint, so later files of the same shape reuse it.
 */
import { z } from 'zod';

export const SEPARATORS = [',', ';', '\t', '|'] as const;

export const LayoutQuestionSchema = z.object({
  /** Dotted path of the profile field the question is about, e.g. 'time.dateOrder'. */
  field: z.string(),
  message: z.string(),
  /** The values the operator may choose from for that field. */
  choices: z.array(z.string()),
  /** True when the file cannot be read until the question is answered. */
  blocking: z.boolean(),
});
export type LayoutQuestion = z.infer<typeof LayoutQuestionSchema>;

export const TimeColumnsSchema = z.object({
  /** One column holding date and time, or two: [date column, time-of-day column]. */
  columns: z.array(z.number().int().min(0)).min(1).max(2),
  /** 'text': calendar text; 'unix-s' / 'unix-ms': seconds or milliseconds since 1970 UTC;
   *  'serial': spreadsheet serial days since 1899-12-30 (fraction = time of day, local clock). */
  kind: z.enum(['text', 'unix-s', 'unix-ms', 'serial']),
  /** Field order of a text date. 'ambiguous' blocks reading until the operator chooses. */
  dateOrder: z.enum(['ymd', 'dmy', 'mdy', 'ambiguous']),
  clock: z.enum(['24h', '12h']),
  /** 'local': wall-clock times in the site's zone; 'explicit': each cell carries Z or an offset
   *  (Unix times are explicit); 'mixed': some cells carry one, the others are local. */
  zone: z.enum(['local', 'explicit', 'mixed']),
  /** A time cell as written in the file, for the operator. */
  example: z.string(),
});
export type TimeColumns = z.infer<typeof TimeColumnsSchema>;

export const WideColumnSchema = z.object({
  index: z.number().int().min(0),
  tag: z.string().min(1),
  unit: z.string().nullable(),
  description: z.string().nullable(),
});
export type WideColumn = z.infer<typeof WideColumnSchema>;

/**
 * The number format of one column where it differs from the file's: quoted cells of a
 * comma-separated file keep their own format ("10,954.58" has comma thousands groups and a decimal
 * point even though the comma separates the fields).
 */
export const ColumnNumberFormatSchema = z.object({
  column: z.number().int().min(0),
  decimalMark: z.enum(['.', ',']),
  /** '' for none. */
  thousandsSeparator: z.enum(['', ',', '.', ' ', "'"]),
});
export type ColumnNumberFormat = z.infer<typeof ColumnNumberFormatSchema>;

/**
 * Wide files with a quality (status) column: per value column (`value`, `quality` pairs), or one
 * column for the whole row (`row`). A bad code rejects the sample with the code as its reason.
 */
export const QualityPairsSchema = z.object({
  kind: z.enum(['pairs', 'row']),
  /** value column index -> quality column index ('pairs'); empty for 'row'. */
  pairs: z.array(z.object({ value: z.number().int().min(0), quality: z.number().int().min(0) })),
  /** 'row': the one status column of the whole row. */
  rowColumn: z.number().int().min(0).nullable(),
});
export type QualityPairs = z.infer<typeof QualityPairsSchema>;

export const LayoutProfileSchema = z.object({
  version: z.literal(1),
  /** Encoding the decoder chose, when the caller passed it in. */
  encoding: z.string().nullable(),
  separator: z.enum(SEPARATORS),
  quote: z.literal('"'),
  decimalMark: z.enum(['.', ',']),
  /** '' for none; ' ' also accepts no-break spaces. */
  thousandsSeparator: z.enum(['', ',', '.', ' ', "'"]),
  /** Fields per record in the data part. */
  columnCount: z.number().int().min(1),
  /** Non-blank records before the first data record (preamble, tag names, units, descriptions). */
  headerRowCount: z.number().int().min(0),
  /** The header records as read (cells trimmed). */
  headerRows: z.array(z.array(z.string())),
  /** Index into headerRows of the names row, null for a file without one. */
  tagRowIndex: z.number().int().min(0).nullable(),
  unitRowIndex: z.number().int().min(0).nullable(),
  descriptionRowIndex: z.number().int().min(0).nullable(),
  /** Names of all columns (from the names row, or 'column N'). */
  columnNames: z.array(z.string()),
  layout: z.enum(['wide', 'long']),
  time: TimeColumnsSchema,
  /** Wide layout: one entry per value column. */
  wide: z.object({ columns: z.array(WideColumnSchema).min(1) }).nullable(),
  /** Long layout: which column holds what. */
  long: z
    .object({
      tagColumn: z.number().int().min(0),
      valueColumn: z.number().int().min(0),
      qualityColumn: z.number().int().min(0).nullable(),
      unitColumn: z.number().int().min(0).nullable(),
    })
    .nullable(),
  /** Columns whose numbers are written differently from the file's decimalMark/thousandsSeparator
   *  (absent in profiles saved before it existed: then none). */
  columnNumbers: z.array(ColumnNumberFormatSchema).optional(),
  /** Wide layout: quality columns beside the values (absent or null: none). */
  quality: QualityPairsSchema.nullable().optional(),
  /** FNV-1a 64-bit hex of layout, separator and the normalised names, units and description rows. */
  fingerprint: z.string().regex(/^[0-9a-f]{16}$/),
  /** 1 when every decision had clear evidence; lower for guesses; each question halves it. */
  confidence: z.number().min(0).max(1),
  questions: z.array(LayoutQuestionSchema),
  /** What was decided and on which evidence, one sentence each. */
  notes: z.array(z.string()),
});
export type LayoutProfile = z.infer<typeof LayoutProfileSchema>;
