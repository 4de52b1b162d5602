/**
 * An upload as the uploads API answers it (src/server/services/uploads.ts uploadView) and the
 * uploads islands show it (src/components/uploads): one definition for both. Types only.
 */

/** One tag's values in a file: read, rejected, the share lost, the commonest rejected texts. */
export interface TagCountRow {
  tag: string;
  values: number;
  rejected?: number;
  lostShare?: number;
  examples?: { text: string; count: number }[];
}

/** One upload on the uploads page; `detection` while a person must answer a layout question. */
export interface UploadRow {
  uploadId: string;
  fileName: string;
  sizeBytes: number | null;
  status: string;
  progress: number;
  rowsRead: number;
  duplicateOf: string | null;
  reason: string | null;
  createdAt: string;
  /** Who sent it in words (a person's name, an API token's name), when known. */
  uploadedBy?: string | null;
  /** First and last hour start of the tag hours the file produced (UTC ISO), when it produced any. */
  hoursFrom?: string | null;
  hoursTo?: string | null;
  /** For a repeat: the earlier upload of the same bytes. */
  duplicateOfFile?: { id: string; fileName: string; createdAt: string } | null;
  summary: null | {
    rows?: number;
    tags?: number;
    newTags?: number;
    hours?: number;
    values?: number;
    rejected?: number;
    warnings?: { code: string; message: string; count: number }[];
    note?: string;
    /** Per tag: values read and rejected (src/lib/ingest); a tag that lost more than half is a problem. */
    perTag?: TagCountRow[];
    /** Why the upload ended read-with-problems, in words. */
    problems?: string | null;
    /** The quality codes the site counts as good, as the file was read with them. */
    goodQualityCodes?: string[];
  };
  /** The layout profile of src/lib/ingest and the first rows, drawn as they come. */
  detection?: { profile: any; preview: any[] };
}
