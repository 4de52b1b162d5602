import { useState } from 'react';
import { call } from '~/components/api';
import { answeredProfile, blockingLeft as blockingOf, numberQuestions as numberQuestionsOf, type NumberAnswers } from '~/lib/ingest/layout-answers';
import type { LayoutProfile } from '~/lib/ingest/profile';
import type { PreviewRow } from '~/lib/ingest/reader';
import type { UploadRow } from '~/lib/upload-view';
import { DetectedFields, NumberQuestionFields, ReadingNotes } from './LayoutReviewFields';
import { LayoutPreview } from './LayoutPreview';

/** The layout's name, the save button, and why it waits while a question blocks. */
function SaveLayout({ name, setName, numbersLeft, blockingLeft, onSave }: { name: string; setName: (n: string) => void; numbersLeft: boolean; blockingLeft: boolean; onSave: () => void }) {
  return (
    <>
      <div className="flex items-end gap-3">
        <div className="flex-1">
          <label className="label" htmlFor="lr-name">Save this layout as</label>
          <input id="lr-name" className="field" value={name} onChange={(e) => setName(e.target.value)} />
        </div>
        <button type="button" className="btn btn-primary" disabled={blockingLeft} onClick={onSave}>
          Save layout and read the file
        </button>
      </div>
      {blockingLeft && (
        <p className="text-sm text-copper-deep">
          {numbersLeft ? 'Choose how the quoted numbers are written first: the file does not decide it.' : 'Choose the date order first: the file does not decide it.'}
        </p>
      )}
    </>
  );
}

/**
 * What the reader decided about a new file shape, with the first rows as read, for the operator to
 * check and correct. Saving stores it as a layout profile of the site: later files of the same shape
 * (same header fingerprint) are read with it without asking.
 */
export function LayoutReview({ upload, onSaved, timeZone = 'UTC' }: { upload: UploadRow; onSaved: () => void; timeZone?: string }) {
  const detected: LayoutProfile = upload.detection!.profile;
  const [profile, setProfile] = useState<LayoutProfile>(detected);
  const [name, setName] = useState(`Layout of ${upload.fileName}`);
  const [error, setError] = useState<string | null>(null);
  const preview: PreviewRow[] = upload.detection!.preview ?? [];
  const set = (patch: Partial<LayoutProfile>) => setProfile((p) => ({ ...p, ...patch }));
  const setTime = (patch: Partial<LayoutProfile['time']>) => setProfile((p) => ({ ...p, time: { ...p.time, ...patch } }));

  // quoted numbers that read two ways ('1,234'): one choice per column, answered here
  const numberQuestions = numberQuestionsOf(profile);
  const [numberAnswers, setNumberAnswers] = useState<NumberAnswers>({});

  async function save() {
    const answered = answeredProfile(profile, numberAnswers);
    const saved = await call(`/api/uploads/${upload.uploadId}/layout`, 'POST', { name, profile: answered }).then(() => true, (e: Error) => setError(e.message));
    if (saved) onSaved();
  }

  const { numbersLeft, blockingLeft } = blockingOf(profile, numberAnswers);
  const tagColumns = profile.wide?.columns ?? [];

  return (
    <div className="space-y-4 py-3" data-testid="layout-review">
      <p className="text-sm">
        This is the first file of this shape at the site. Check what was detected; correct it where it is wrong, then save. Later files
        with the same columns are read the same way without asking.
      </p>
      {!!profile.questions?.length && (
        <ul className="caution list-disc pl-8">
          {profile.questions.map((q) => (
            <li key={q.field}>{q.message}</li>
          ))}
        </ul>
      )}
      <DetectedFields profile={profile} set={set} setTime={setTime} />
      <NumberQuestionFields profile={profile} questions={numberQuestions} answers={numberAnswers} setAnswers={setNumberAnswers} />
      <ReadingNotes profile={profile} />
      {tagColumns.length > 0 && <LayoutPreview tagColumns={tagColumns} preview={preview} timeZone={timeZone} />}
      <SaveLayout name={name} setName={setName} numbersLeft={numbersLeft} blockingLeft={blockingLeft} onSave={save} />
      {error && <p role="alert" className="notice-error">{error}</p>}
    </div>
  );
}
