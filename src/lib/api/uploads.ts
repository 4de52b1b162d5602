/**
 * What the uploads endpoints of /api/v1 answer: one zod schema each, which types the endpoint's answer
 * and describes it in the OpenAPI document (src/server/openapi.ts). Pure shapes: no server imports.
 */
import { z } from 'zod';

/** Upload states, in Lossline's words (the server's UPLOAD_STATUSES; the endpoint's type check keeps them one list). */
export const UploadStatus = z
  .enum(['awaiting-file', 'queued', 'needs-review', 'processing', 'done', 'read-with-problems', 'failed'])
  .meta({ description: 'done and read-with-problems: read, hours stored; failed: nothing stored (reason says why); needs-review: a person answers a layout question on the uploads page.' });

export const UploadAccepted = z
  .object({
    uploadId: z.uuid(),
    duplicateOf: z.uuid().nullable().meta({ description: 'An earlier upload with the same bytes: this one is not read again.' }),
  })
  .meta({ id: 'UploadAccepted' });
export type UploadAccepted = z.infer<typeof UploadAccepted>;

const Instant = z.iso.datetime({ offset: true });

export const UploadAnswer = z
  .object({
    uploadId: z.uuid(),
    siteId: z.uuid(),
    fileName: z.string(),
    sizeBytes: z.number().int().nullable(),
    sha256: z.string().nullable(),
    source: z.string().meta({ description: 'api, browser or demo.' }),
    status: UploadStatus,
    progress: z.number().min(0).max(1),
    rowsRead: z.number().int(),
    duplicateOf: z.uuid().nullable(),
    summary: z
      .looseObject({ code: z.string().optional(), note: z.string().optional(), duplicateOf: z.string().optional() })
      .nullable()
      .meta({ description: "The reader's counts when the file was read (rows, tags, hours, values, rejected, warnings, perTag ...), or the code and details of why it stopped." }),
    detection: z
      .object({ profile: z.unknown(), preview: z.array(z.unknown()).optional(), encoding: z.unknown().optional(), disagreement: z.unknown().optional() })
      .nullable()
      .optional()
      .meta({ description: 'The detected layout and its questions, while a person must answer them.' }),
    reason: z.string().nullable().meta({ description: 'Why the upload failed, in words; null unless failed.' }),
    createdAt: Instant,
    finishedAt: Instant.nullable(),
  })
  .meta({ id: 'Upload' });
export type UploadAnswer = z.infer<typeof UploadAnswer>;
