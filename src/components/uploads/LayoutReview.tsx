import { useState } from 'react';
import { call } from '~/components/api';
import { answerColumnNumbers } from '~/lib/ingest/column-numbers';
import type { UploadRow } from '~/lib/upload-view';
import { siteStamp } from '~/lib/site-time';

const SEP_LABEL: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'bar' };

/**
 * What the reader decided about a new file shape, with the first rows as read, for the operator to
 * check and correct. Saving stores it as a layout profile of the site: later files of the same shape
 * (same header fingerprint) are read with it without asking.
 */
export function LayoutReview({ upload, onSaved, timeZone = 'UTC' }: { upload: UploadRow; onSaved: () => void; timeZone?: string }) {
  const detected = upload.detection!.profile;
  const [profile, setProfile] = useState<any>(detected);
  const [name, setName] = useState(`Layout of ${upload.fileName}`);
  const [error, setError] = useState<string | null>(null);
  const preview = upload.detection!.preview ?? [];
  const set = (patch: any) => setProfile((p: any) => ({ ...p, ...patch }));
  const setTime = (patch: any) => setProfile((p: any) => ({ ...p, time: { ...p.time, ...patch } }));

  // quoted numbers that read two ways ('1,234'): one choice per column, answered here
  const numberQuestions = profile.questions.filter((q: any) => q.field.startsWith('columnNumbers.'));
  const [numberAnswers, setNumberAnswers] = useState<Record<number, 'thousands' | 'decimal'>>({});

  async function save() {
    let columnNumbers = profile.columnNumbers;
    for (const [col, a] of Object.entries(numberAnswers)) columnNumbers = answerColumnNumbers(columnNumbers, Number(col), a);
    const answered = {
      ...profile,
      columnNumbers,
      questions: profile.questions.filter(
        (q: any) =>
          (!q.blocking || q.field !== 'time.dateOrder' || profile.time.dateOrder === 'ambiguous') &&
          !(q.field.startsWith('columnNumbers.') && numberAnswers[Number(q.field.split('.')[1])]),
      ),
    };
    const saved = await call(`/api/uploads/${upload.uploadId}/layout`, 'POST', { name, profile: answered }).then(() => true, (e: Error) => setError(e.message));
    if (saved) onSaved();
  }

  const numbersLeft = numberQuestions.some((q: any) => q.blocking && !numberAnswers[Number(q.field.split('.')[1])]);
  const blockingLeft = (profile.time.kind === 'text' && profile.time.dateOrder === 'ambiguous') || numbersLeft;
  const pairs: { value: number; quality: number }[] = profile.quality?.pairs ?? [];
  const tagColumns: { index: number; tag: string; unit: string | null }[] = profile.wide?.columns ?? [];

  return (
    <div className="space-y-4 py-3" data-testid="layout-review">
      <p className="text-sm">
        This is the first file of this shape at the site. Check what was detected; correct it where it is wrong, then save. Later files
        with the same columns are read the same way without asking.
      </p>
      {!!profile.questions?.length && (
        <ul className="caution list-disc pl-8">
          {profile.questions.map((q: any) => (
            <li key={q.field}>{q.message}</li>
          ))}
        </ul>
      )}
      <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <div>
          <label className="label" htmlFor="lr-layout">Shape</label>
          <select id="lr-layout" className="field" value={profile.layout} disabled>
            <option value="wide">one column per tag</option>
            <option value="long">tag, time, value rows</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="lr-sep">Separator</label>
          <select id="lr-sep" className="field" value={profile.separator} onChange={(e) => set({ separator: e.target.value })}>
            {Object.entries(SEP_LABEL).map(([v, l]) => (
              <option key={l} value={v}>{l}</option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="lr-dec">Decimal mark</label>
          <select id="lr-dec" className="field" value={profile.decimalMark} onChange={(e) => set({ decimalMark: e.target.value })}>
            <option value=".">point (1.5)</option>
            <option value=",">comma (1,5)</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="lr-time">Time column</label>
          <select
            id="lr-time"
            className="field"
            value={profile.time.columns[0]}
            onChange={(e) => setTime({ columns: [Number(e.target.value), ...profile.time.columns.slice(1)] })}
          >
            {profile.columnNames.map((c: string, i: number) => (
              <option key={i} value={i}>{c}</option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="lr-order">Date order</label>
          <select id="lr-order" className="field" value={profile.time.dateOrder} onChange={(e) => setTime({ dateOrder: e.target.value })}>
            <option value="ymd">year-month-day</option>
            <option value="dmy">day/month/year</option>
            <option value="mdy">month/day/year</option>
            <option value="ambiguous">cannot tell — choose</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="lr-zone">Times are</label>
          <select id="lr-zone" className="field" value={profile.time.zone} onChange={(e) => setTime({ zone: e.target.value })}>
            <option value="local">the site's local clock</option>
            <option value="explicit">with an offset or Z</option>
            <option value="mixed">mixed</option>
          </select>
        </div>
      </div>
      {numberQuestions.map((q: any) => {
        const col = Number(q.field.split('.')[1]);
        return (
          <div key={q.field}>
            <label className="label" htmlFor={`lr-num-${col}`}>Numbers of {profile.columnNames[col]}</label>
            <select
              id={`lr-num-${col}`}
              className="field"
              value={numberAnswers[col] ?? ''}
              onChange={(e) => setNumberAnswers((a) => ({ ...a, [col]: e.target.value as 'thousands' | 'decimal' }))}
            >
              <option value="">choose</option>
              <option value="thousands">comma between thousands (1,234 = 1234)</option>
              <option value="decimal">decimal comma (1,234 = 1.234)</option>
            </select>
          </div>
        );
      })}
      {profile.quality && (
        <p className="text-sm" data-testid="quality-columns">
          Quality codes:{' '}
          {profile.quality.kind === 'row'
            ? `column ${profile.columnNames[profile.quality.rowColumn]} applies to the whole row`
            : pairs.map((p) => `${profile.columnNames[p.value]} with ${profile.columnNames[p.quality]}`).join('; ')}
          . Samples whose code is not one of the site's good codes are rejected with their code.
        </p>
      )}
      <p className="text-xs text-ink-soft">
        Time as written: <code>{profile.time.example}</code> · {profile.time.clock === '12h' ? '12-hour clock' : '24-hour clock'} · units row:{' '}
        {profile.unitRowIndex === null ? 'none' : `line ${profile.unitRowIndex + 1}`}
      </p>
      {tagColumns.length > 0 && (
        <div className="overflow-x-auto">
          <table className="grid-table">
            <thead>
              <tr>
                <th>Time as read ({timeZone})</th>
                {tagColumns.slice(0, 8).map((c) => (
                  <th key={c.index} className="num">{c.tag}{c.unit ? ` [${c.unit}]` : ''}</th>
                ))}
              </tr>
            </thead>
            <tbody>
              {preview.slice(0, 6).map((r: any) => (
                <tr key={r.line}>
                  <td className="whitespace-nowrap">{r.timeIso ? siteStamp(r.timeIso, timeZone, 'yyyy-MM-dd HH:mm:ss') : (r.timeChoices ? `${r.timeChoices.dmy ?? '?'} or ${r.timeChoices.mdy ?? '?'}` : r.timeText)}</td>
                  {r.cells.slice(0, 8).map((c: any, i: number) => (
                    <td key={i} className="num">{c.value ?? <span className="text-copper">{c.rejected ?? ''}</span>}</td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="flex items-end gap-3">
        <div className="flex-1">
          <label className="label" htmlFor="lr-name">Save this layout as</label>
          <input id="lr-name" className="field" value={name} onChange={(e) => setName(e.target.value)} />
        </div>
        <button type="button" className="btn btn-primary" disabled={blockingLeft} onClick={save}>
          Save layout and read the file
        </button>
      </div>
      {blockingLeft && (
        <p className="text-sm text-copper-deep">
          {numbersLeft ? 'Choose how the quoted numbers are written first: the file does not decide it.' : 'Choose the date order first: the file does not decide it.'}
        </p>
      )}
      {error && <p role="alert" className="notice-error">{error}</p>}
    </div>
  );
}
