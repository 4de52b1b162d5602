/** Answers of the files and uploads under /api/v1: POST .../files, GET .../uploads, GET /api/v1/uploads/{uploadId}. */
import { z } from 'zod';
import { pageOf } from './paging';
import { Id, Instant } from './common';

/** States of an upload (docs/api.md, "GET /api/v1/uploads/{uploadId}"). */
export const UPLOAD_STATES = ['awaiting-file', 'queued', 'needs-review', 'processing', 'done', 'read-with-problems', 'failed'] as const;

export const FileAccepted = z.object({
  uploadId: Id,
  duplicateOf: Id.nullable().describe('An earlier upload with the same bytes: this one is not read again.'),
});
export type FileAccepted = z.infer<typeof FileAccepted>;

/** An upload with its state and its report. */
export const UploadItem = z.object({
  uploadId: Id,
  siteId: Id,
  fileName: z.string(),
  sizeBytes: z.number().nullable(),
  sha256: z.string().nullable(),
  source: z.string().describe('browser or api'),
  status: z.enum(UPLOAD_STATES),
  progress: z.number().min(0).max(1).describe('Share of the bytes read [-].'),
  rowsRead: z.number().nullable(),
  duplicateOf: Id.nullable(),
  summary: z
    .record(z.string(), z.unknown())
    .nullable()
    .describe('The report: rows, tags, newTags, hours, values, rejected, warnings, perTag, problemTags ...; when failed, code and details.'),
  detection: z.unknown().optional().describe('The proposed layout while a person must answer a layout question.'),
  reason: z.string().nullable().describe('Why it failed, in words; null unless failed.'),
  createdAt: Instant,
  finishedAt: Instant.nullable(),
});
export type UploadItem = z.infer<typeof UploadItem>;

export const UploadsPage = pageOf(UploadItem);
export type UploadsPage = z.infer<typeof UploadsPage>;

export const UploadsFilter = z.object({ status: z.enum(UPLOAD_STATES).optional() });
