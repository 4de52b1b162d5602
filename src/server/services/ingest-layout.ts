/**
 * The layout an upload is read with: a profile a person confirmed, the site's saved profile of the
 * file's shape, or the file's own sniffed layout; checked against the file's first values. A browser
 * upload of a new shape, or any file whose layout is not certain, stops here for a person's answer
 * (needs-review) or, for a machine upload, with the question (failed).
 */
import { GetObjectCommand } from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import { and, eq, sql } from 'drizzle-orm';
import { IngestError, checkLayoutAgainstSample, createDecoder, previewRows, sniffLayout, type LayoutProfile } from '~/lib/ingest';
import { db } from '../db/client';
import { layoutProfiles, uploads } from '../db/schema';
import { bucket, s3 } from '../storage';
import type { IngestOutcome } from './ingest-failure';
import { storable, storableJson } from './ingest-text';

/** Bytes read from the start of a file to decide its layout. */
const SAMPLE_BYTES = 96 * 1024;

type Upload = typeof uploads.$inferSelect;

/** Bytes read from the start of a file to decide its layout. */
export const LAYOUT_SAMPLE_BYTES = SAMPLE_BYTES;

const emptyFile = () => new IngestError('EMPTY_FILE', 'The file is empty (0 bytes). Export the data again and upload the new file.');

async function headBytes(key: string, n: number, size: number | null): Promise<Uint8Array> {
  if (size === 0) throw emptyFile();
  const out = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key, Range: `bytes=0-${n - 1}` }));
  const chunks: Buffer[] = [];
  for await (const c of out.Body as Readable) chunks.push(c as Buffer);
  return new Uint8Array(Buffer.concat(chunks));
}

/**
 * Decides the layout from the file's first bytes: a saved profile of the site, or a fresh sniff.
 * `head` gives those bytes (at most LAYOUT_SAMPLE_BYTES, fewer only when the file is shorter)
 * instead of a ranged GET of the stored object: a read fed by the upload's own body.
 */
async function decideLayout(up: Upload, timeZone: string, head?: Uint8Array) {
  if (up.profileId) {
    // A person confirmed this layout for this very upload: no second guessing.
    const [p] = await db().select().from(layoutProfiles).where(eq(layoutProfiles.id, up.profileId));
    if (p) return { profile: p.profile, saved: true as const, confirmed: true as const };
  }
  if (head && head.length === 0) throw emptyFile();
  const bytes = head ? head.subarray(0, SAMPLE_BYTES) : await headBytes(up.objectKey, SAMPLE_BYTES, up.sizeBytes);
  const decoder = createDecoder();
  const text = decoder.push(bytes) + (bytes.length < SAMPLE_BYTES ? decoder.end() : '');
  const complete = bytes.length < SAMPLE_BYTES;
  const sniffed = sniffLayout(text, { complete, encoding: decoder.decision?.encoding ?? null });
  const [known] = await db()
    .select()
    .from(layoutProfiles)
    .where(and(eq(layoutProfiles.siteId, up.siteId), eq(layoutProfiles.fingerprint, sniffed.fingerprint)));
  let preview: unknown[] = [];
  try {
    preview = previewRows(text, sniffed, 8, { timeZone });
  } catch {
    preview = [];
  }
  const sample = { text, complete };
  if (known) return { profile: known.profile, saved: true as const, profileId: known.id, sniffed, preview, sample, encoding: decoder.decision };
  return { profile: sniffed, saved: false as const, preview, encoding: decoder.decision, sample };
}

/**
 * What the layout decision comes to, with no effect on the upload: the profile to read with
 * (`detected`: the file's own layout, which the read saves as the site's profile first), or the
 * question a person must answer (with what the uploads page shows for it).
 */
export type LayoutJudgement =
  | { kind: 'read'; profile: LayoutProfile; profileId: string | null; detected: boolean }
  | { kind: 'question'; profile: LayoutProfile; questions: LayoutProfile['questions']; detection: Record<string, unknown>; disagreement: unknown };

/** Judges the upload's layout (see LayoutJudgement); `head` as for decideLayout. */
export async function judgeLayout(up: Upload, timeZone: string, head?: Uint8Array): Promise<LayoutJudgement> {
  const layout = await decideLayout(up, timeZone, head);
  const profile = layout.profile;
  const profileId = 'profileId' in layout ? layout.profileId : up.profileId;
  // The layout against the file's own values (decimal mark, date order): never guess.
  const disagreement = 'sample' in layout && layout.sample ? checkLayoutAgainstSample(layout.sample.text, profile, { timeZone, complete: layout.sample.complete }) : null;
  const machineQuestions = !layout.saved && up.source !== 'browser' ? profile.questions : [];
  if (disagreement || (!layout.saved && up.source === 'browser') || machineQuestions.length > 0 || (!layout.saved && profile.questions.some((q) => q.blocking))) {
    const questions = [...(disagreement ? [disagreement.question] : []), ...profile.questions];
    const asked = { ...profile, questions } as LayoutProfile;
    const detection = {
      profile: asked,
      preview: 'preview' in layout ? layout.preview : [],
      encoding: 'encoding' in layout ? (layout.encoding ?? null) : null,
      disagreement: disagreement ?? null,
    } as Record<string, unknown>;
    return { kind: 'question', profile, questions, detection, disagreement };
  }
  return { kind: 'read', profile, profileId: profileId ?? null, detected: !layout.saved };
}

/**
 * The layout to read the upload with and the saved profile's id; or the outcome when the upload
 * stops for a question. `beforeQuestion` runs before the upload stops for one: its outcome (the
 * file repeats an earlier upload) ends the upload instead of the question.
 */
export async function settleLayout(
  up: Upload,
  timeZone: string,
  beforeQuestion?: () => Promise<IngestOutcome | null>,
): Promise<{ profile: LayoutProfile; profileId: string | null } | IngestOutcome> {
  const judged = await judgeLayout(up, timeZone);
  if (judged.kind === 'question') {
    const { questions, detection, disagreement } = judged;
    const instead = await beforeQuestion?.();
    if (instead) return instead;
    if (up.source === 'browser' || questions.length === 0) {
      await db().update(uploads).set({ status: 'needs-review', detection: JSON.parse(storableJson(detection)) }).where(eq(uploads.id, up.id));
      return { kind: 'needs-review' };
    }
    // A machine upload never guesses: it stops with the question; a person answers it on the
    // uploads page (the confirmed layout reads the file) or the export is fixed.
    const reason = `Not read: the layout is not certain for this file. ${questions.map((q) => q.message).join(' ')}`;
    await db()
      .update(uploads)
      .set({
        status: 'failed',
        failureReason: storable(reason),
        finishedAt: sql`clock_timestamp()`,
        detection: JSON.parse(storableJson(detection)),
        summary: JSON.parse(storableJson({ code: 'LAYOUT_QUESTION', questions, details: disagreement ?? {} })),
      })
      .where(eq(uploads.id, up.id));
    return { kind: 'failed', reason };
  }
  if (judged.detected) return saveDetectedProfile(up, judged.profile);
  return { profile: judged.profile, profileId: judged.profileId };
}

/**
 * A machine upload of a shape the file itself decides: the decision is kept as the site's profile.
 * jsonb holds no NUL character: the stored copy goes without them (a header cell may carry one).
 */
export async function saveDetectedProfile(up: Upload, profile: LayoutProfile): Promise<{ profile: LayoutProfile; profileId: string }> {
  const clean = JSON.parse(storableJson(profile)) as typeof profile;
  const [saved] = await db()
    .insert(layoutProfiles)
    .values({ siteId: up.siteId, fingerprint: profile.fingerprint, name: `detected from ${up.fileName}`, profile: clean })
    .onConflictDoUpdate({ target: [layoutProfiles.siteId, layoutProfiles.fingerprint], set: { fingerprint: profile.fingerprint } })
    .returning();
  // Another file of this shape may have saved its profile first: read with that one; else with this file's own.
  return { profile: JSON.stringify(saved!.profile) !== JSON.stringify(clean) ? saved!.profile : profile, profileId: saved!.id };
}
