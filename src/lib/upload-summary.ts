import type { LayoutProfile } from './ingest/profile';

/**
 * What an upload's row keeps about its outcome (uploads.summary, jsonb): the reader's counts when the
 * file was read, or the stable code and details of why it stopped or was not read again.
 */
export interface UploadSummary {
  /** Why the upload stopped (an ingest error code, LAYOUT_QUESTION ...); absent when it was read. */
  code?: string;
  details?: unknown;
  duplicateOf?: string;
  note?: string;
  [key: string]: unknown;
}

/** The layout found for an upload that waits for a person (uploads.detection, jsonb). */
export interface UploadDetection {
  /** The detected layout with the questions a person answers. */
  profile: LayoutProfile;
  /** The first rows of the file as cells. */
  preview?: unknown[];
  encoding?: unknown;
  disagreement?: unknown;
}
