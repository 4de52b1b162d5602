import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { user } from './auth-schema';
import { sites } from './plant-schema';

/** Upload states, in Lossline's words (also the API's). */
export const UPLOAD_STATUSES = ['awaiting-file', 'queued', 'needs-review', 'processing', 'done', 'failed'] as const;
export type UploadStatus = (typeof UPLOAD_STATUSES)[number];

/**
 * One historian file. The raw object stays in the store forever under objectKey; the record is
 * created before the bytes arrive (browser uploads) and follows the file through the worker.
 */
export const uploads = pgTable(
  'uploads',
  {
    id: uuid('id').primaryKey().default(sql`gen_random_uuid()`),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    fileName: text('file_name').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }),
    /** SHA-256 of the stored bytes, computed by the server (never the client's word). */
    sha256: text('sha256'),
    /** SHA-256 the browser declared; checked against the stored bytes before reading. */
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
    summary: jsonb('summary').$type<Record<string, unknown>>(),
    /** Detected layout and questions while the upload needs review. */
    detection: jsonb('detection').$type<Record<string, unknown>>(),
    failureReason: text('failure_reason'),
    attempts: integer('attempts').notNull().default(0),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('uploads_site_idx').on(t.siteId, t.createdAt), index('uploads_sha_idx').on(t.siteId, t.sha256)],
);

/** A site's saved file shape: later files with the same header fingerprint use it without asking. */
export const layoutProfiles = pgTable(
  'layout_profiles',
  {
    id: uuid('id').primaryKey().default(sql`gen_random_uuid()`),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    fingerprint: text('fingerprint').notNull(),
    name: text('name').notNull(),
    profile: jsonb('profile').$type<Record<string, unknown>>().notNull(),
    confirmedBy: text('confirmed_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('layout_profiles_site_fp').on(t.siteId, t.fingerprint)],
);

/** A tag as it appears in the site's exports; created unlinked the first time a file brings it. */
export const tags = pgTable(
  'tags',
  {
    id: uuid('id').primaryKey().default(sql`gen_random_uuid()`),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** Unit text from the file's units row, if any (a hint for the admin who links it). */
    unitHint: text('unit_hint'),
    description: text('description'),
    /** 'analog' (mean by linear interpolation) or 'status' (mean by step hold). */
    kind: text('kind').notNull().default('analog'),
    flatlineLimitSeconds: integer('flatline_limit_seconds').notNull().default(4 * 3600),
    validMin: doublePrecision('valid_min'),
    validMax: doublePrecision('valid_max'),
    firstSeenAt: timestamp('first_seen_at', { withTimezone: true }).notNull().defaultNow(),
    lastUploadId: uuid('last_upload_id'),
  },
  (t) => [uniqueIndex('tags_site_name').on(t.siteId, t.name)],
);

/** The statistics of one tag in one local clock hour (hourStart is the UTC instant it starts). */
export const tagHours = pgTable(
  'tag_hours',
  {
    tagId: uuid('tag_id')
      .notNull()
      .references(() => tags.id, { onDelete: 'cascade' }),
    hourStart: timestamp('hour_start', { withTimezone: true }).notNull(),
    mean: doublePrecision('mean'),
    min: doublePrecision('min'),
    max: doublePrecision('max'),
    std: doublePrecision('std'),
    first: doublePrecision('first'),
    last: doublePrecision('last'),
    samples: integer('samples').notNull(),
    coveredFraction: doublePrecision('covered_fraction').notNull(),
    nonNumeric: integer('non_numeric').notNull().default(0),
    outOfRange: integer('out_of_range').notNull().default(0),
    flatline: boolean('flatline').notNull().default(false),
    /** Seconds of the hour on which the signal is defined (coveredFraction x 3600). */
    coveredSeconds: doublePrecision('covered_seconds').notNull().default(0),
    /** Time of the first and last usable sample in the hour (for combining two files' parts). */
    spanStart: timestamp('span_start', { withTimezone: true, precision: 3 }),
    spanEnd: timestamp('span_end', { withTimezone: true, precision: 3 }),
    /** Uploads whose samples make this hour, newest first. */
    uploadIds: uuid('upload_ids').array().notNull(),
    flags: text('flags').array().notNull().default(sql`'{}'::text[]`),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.tagId, t.hourStart] })],
);

/** Figures a later file replaced, kept with the upload that brought them. */
export const tagHourHistory = pgTable(
  'tag_hour_history',
  {
    id: uuid('id').primaryKey().default(sql`gen_random_uuid()`),
    tagId: uuid('tag_id').notNull(),
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
