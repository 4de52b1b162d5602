import { sql } from 'drizzle-orm';
import {
  bigint,
  doublePrecision,
  index,
  integer,
  jsonb,
  real,
  smallint,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import type { LayoutProfile } from '~/lib/ingest/profile';
import { HOUR_S } from '~/lib/time';
import type { UploadDetection, UploadSummary } from '~/lib/upload-summary';
import { user } from './auth-schema';
import { idColumn, siteIdColumn } from './columns';

/** Upload states, in Lossline's words (also the API's). */
export const UPLOAD_STATUSES = ['awaiting-file', 'queued', 'needs-review', 'processing', 'done', 'read-with-problems', 'failed'] as const;
/** States of an upload whose file was read and whose hours are stored. */
export const READ_STATUSES = ['done', 'read-with-problems'] as const;
export type UploadStatus = (typeof UPLOAD_STATUSES)[number];

/**
 * One historian file. The raw object stays in the store forever under objectKey; the record is
 * created before the bytes arrive (browser uploads) and follows the file through the worker.
 */
export const uploads = pgTable(
  'uploads',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    fileName: text('file_name').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }),
    /** SHA-256 of the stored bytes, computed by the server (never the client's word). */
    sha256: text('sha256'),
    /** SHA-256 the browser declared; checked against the stored bytes (hashed while they are read, before the commit). */
    declaredSha256: text('declared_sha256'),
    objectKey: text('object_key').notNull().unique(),
    source: text('source').notNull(), // 'browser' | 'api' | 'demo'
    uploadedBy: text('uploaded_by').references(() => user.id, { onDelete: 'set null' }),
    apiTokenId: uuid('api_token_id'),
    status: text('status').$type<UploadStatus>().notNull().default('awaiting-file'),
    duplicateOf: uuid('duplicate_of'),
    profileId: uuid('profile_id'),
    rowsRead: bigint('rows_read', { mode: 'number' }).notNull().default(0),
    bytesRead: bigint('bytes_read', { mode: 'number' }).notNull().default(0),
    summary: jsonb('summary').$type<UploadSummary>(),
    /** Detected layout and questions while the upload needs review. */
    detection: jsonb('detection').$type<UploadDetection>(),
    failureReason: text('failure_reason'),
    attempts: integer('attempts').notNull().default(0),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('uploads_site_idx').on(t.siteId, t.createdAt), index('uploads_sha_idx').on(t.siteId, t.sha256)],
);

/**
 * Which quality codes of a site's wide files are good (src/lib/ingest/quality-codes.ts); a site
 * without a row uses DEFAULT_GOOD_QUALITY_CODES.
 */
export const siteQualityCodes = pgTable('site_quality_codes', {
  siteId: siteIdColumn().primaryKey(),
  goodCodes: jsonb('good_codes').$type<string[]>().notNull(),
  updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A site's saved file shape: later files with the same header fingerprint use it without asking. */
export const layoutProfiles = pgTable(
  'layout_profiles',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    fingerprint: text('fingerprint').notNull(),
    name: text('name').notNull(),
    profile: jsonb('profile').$type<LayoutProfile>().notNull(),
    confirmedBy: text('confirmed_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('layout_profiles_site_fp').on(t.siteId, t.fingerprint)],
);

/** A tag as it appears in the site's exports; created unlinked the first time a file brings it. */
export const tags = pgTable(
  'tags',
  {
    id: idColumn(),
    /** A narrow key for the tag's hours (4 bytes instead of 16 in every tag hour and its index). */
    seq: integer('seq').notNull().unique().generatedAlwaysAsIdentity(),
    siteId: siteIdColumn(),
    name: text('name').notNull(),
    /** Unit text from the file's units row, if any (a hint for the admin who links it). */
    unitHint: text('unit_hint'),
    description: text('description'),
    /** 'analog' (mean by linear interpolation) or 'status' (mean by step hold). */
    kind: text('kind').notNull().default('analog'),
    /** Frozen-value limit [s] (the model file's tags[].frozenLimit_s). */
    flatlineLimitSeconds: integer('flatline_limit_seconds').notNull().default(4 * HOUR_S),
    /** The tag's own spread limit in the steady-state test (tags[].spreadLimit); null: its unit's. */
    spreadLimit: doublePrecision('spread_limit'),
    /** The tag's own least coverage of the hour [-] (tags[].minCoverage); null: its unit's. */
    minCoverage: doublePrecision('min_coverage'),
    validMin: doublePrecision('valid_min'),
    validMax: doublePrecision('valid_max'),
    firstSeenAt: timestamp('first_seen_at', { withTimezone: true }).notNull().defaultNow(),
    lastUploadId: uuid('last_upload_id'),
  },
  (t) => [uniqueIndex('tags_site_name').on(t.siteId, t.name)],
);

/** Bits of tag_hours.flags: what the reader noticed in the hour (counts stay in the upload's report). */
export const TAG_HOUR_FLAGS = {
  flatline: 1,
  'duplicate-times': 2,
  'backwards-times': 4,
  'bad-quality': 8,
  'uncertain-quality': 16,
  'replaced-older-file': 32,
  'combined-files': 64,
} as const;
export type TagHourFlag = keyof typeof TAG_HOUR_FLAGS;

/** The flag names of a flags value. */
export function tagHourFlagNames(bits: number): TagHourFlag[] {
  return (Object.keys(TAG_HOUR_FLAGS) as TagHourFlag[]).filter((k) => (bits & TAG_HOUR_FLAGS[k]) !== 0);
}

/**
 * The statistics of one tag in one local clock hour (hourStart is the UTC instant it starts).
 *
 * Lean on purpose (docs/scale.md): 48 bytes of data per row, columns ordered so that nothing is
 * padded (with the 24-byte tuple header a row is 72 bytes, a multiple of the 8-byte alignment).
 * Values are float4 (7 significant digits, finer than any plant instrument); the tag by its 4-byte
 * `tags.seq`; covered time in whole seconds; the reader's remarks as bits (TAG_HOUR_FLAGS). The
 * first and last sample's times are not stored: nothing read them (overlapping files are merged from
 * the raw files' samples), and the 8 bytes took every row from 80 to 88 bytes on disk (migration
 * tag-hours-48-bytes). Which uploads brought an hour is in tag_hour_uploads (one row per upload and
 * tag). Partitioned by month (migration scale-partitions).
 */
export const tagHours = pgTable(
  'tag_hours',
  {
    hourStart: timestamp('hour_start', { withTimezone: true }).notNull(),
    /**
     * tags.seq. No foreign key (no per-row check during COPY, no lock on tags when a month partition
     * is attached): a statement trigger on tags deletes the hours of deleted tags (scale-partitions).
     */
    tagId: integer('tag_id').notNull(),
    samples: integer('samples').notNull(),
    mean: real('mean'),
    min: real('min'),
    max: real('max'),
    std: real('std'),
    first: real('first'),
    last: real('last'),
    /** Seconds of the hour on which the signal is defined (covered fraction x 3600), whole seconds. */
    coveredSeconds: smallint('covered_s').notNull().default(0),
    /** Counts, capped at 32767. */
    nonNumeric: smallint('non_numeric').notNull().default(0),
    outOfRange: smallint('out_of_range').notNull().default(0),
    /** TAG_HOUR_FLAGS bits (flatline among them). */
    flags: smallint('flags').notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.tagId, t.hourStart] })],
);

/**
 * Covered fraction [-] of a tag hour, as SQL (covered_s / HOUR_S). The hour's length is written into the
 * text as the literal 3600.0 (sql.raw), not sent as a parameter: the statement's text stays what it was.
 */
export const coveredFractionSql = sql<number>`(${tagHours.coveredSeconds}::float8 / ${sql.raw(HOUR_S.toFixed(1))})`;
/** Flatline flag of a tag hour, as SQL. */
export const flatlineSql = sql<boolean>`((${tagHours.flags} & ${TAG_HOUR_FLAGS.flatline}) <> 0)`;

/** Which uploads brought hours of a tag: one row per upload and tag, with the first and last hour. */
export const tagHourUploads = pgTable(
  'tag_hour_uploads',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => uploads.id, { onDelete: 'cascade' }),
    /** tags.seq */
    tagId: integer('tag_id').notNull(),
    firstHour: timestamp('first_hour', { withTimezone: true }).notNull(),
    lastHour: timestamp('last_hour', { withTimezone: true }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.uploadId, t.tagId] }), index('tag_hour_uploads_tag').on(t.tagId, t.lastHour)],
);

/** Figures a later file replaced, kept with the upload that brought them. */
export const tagHourHistory = pgTable(
  'tag_hour_history',
  {
    id: idColumn(),
    /** tags.seq */
    tagId: integer('tag_id').notNull(),
    hourStart: timestamp('hour_start', { withTimezone: true }).notNull(),
    replacedByUploadId: uuid('replaced_by_upload_id').notNull(),
    previous: jsonb('previous').$type<Record<string, unknown>>().notNull(),
    replacedAt: timestamp('replaced_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('tag_hour_history_tag_idx').on(t.tagId, t.hourStart)],
);

/** Every rejected cell of an upload (not a number, bad quality, out of range ...), for its report. */
export const uploadRejects = pgTable(
  'upload_rejects',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => uploads.id, { onDelete: 'cascade' }),
    seq: integer('seq').notNull(),
    line: bigint('line', { mode: 'number' }),
    tag: text('tag'),
    time: text('time'),
    raw: text('raw'),
    reason: text('reason').notNull(),
  },
  (t) => [primaryKey({ columns: [t.uploadId, t.seq] })],
);
