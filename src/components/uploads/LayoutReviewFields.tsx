import type { LayoutProfile } from '~/lib/ingest/profile';
import { questionColumn, type NumberAnswers } from '~/lib/ingest/layout-answers';

const SEP_LABEL: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'bar' };

type Time = LayoutProfile['time'];

/** The detected shape, separator, decimal mark and time column, each a select to correct it. */
export function DetectedFields({ profile, set, setTime }: { profile: LayoutProfile; set: (patch: Partial<LayoutProfile>) => void; setTime: (patch: Partial<Time>) => void }) {
  return (
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
        <select id="lr-sep" className="field" value={profile.separator} onChange={(e) => set({ separator: e.target.value as LayoutProfile['separator'] })}>
          {Object.entries(SEP_LABEL).map(([v, l]) => (
            <option key={l} value={v}>{l}</option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="lr-dec">Decimal mark</label>
        <select id="lr-dec" className="field" value={profile.decimalMark} onChange={(e) => set({ decimalMark: e.target.value as LayoutProfile['decimalMark'] })}>
          <option value=".">point (1.5)</option>
          <option value=",">comma (1,5)</option>
        </select>
      </div>
      <TimeFields profile={profile} setTime={setTime} />
    </div>
  );
}

/** The time column, its date order and its clock. */
function TimeFields({ profile, setTime }: { profile: LayoutProfile; setTime: (patch: Partial<Time>) => void }) {
  return (
    <>
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
        <select id="lr-order" className="field" value={profile.time.dateOrder} onChange={(e) => setTime({ dateOrder: e.target.value as Time['dateOrder'] })}>
          <option value="ymd">year-month-day</option>
          <option value="dmy">day/month/year</option>
          <option value="mdy">month/day/year</option>
          <option value="ambiguous">cannot tell — choose</option>
        </select>
      </div>
      <div>
        <label className="label" htmlFor="lr-zone">Times are</label>
        <select id="lr-zone" className="field" value={profile.time.zone} onChange={(e) => setTime({ zone: e.target.value as Time['zone'] })}>
          <option value="local">the site's local clock</option>
          <option value="explicit">with an offset or Z</option>
          <option value="mixed">mixed</option>
        </select>
      </div>
    </>
  );
}

/** One select per column whose quoted numbers read two ways. */
export function NumberQuestionFields({ profile, questions, answers, setAnswers }: { profile: LayoutProfile; questions: LayoutProfile['questions']; answers: NumberAnswers; setAnswers: (f: (a: NumberAnswers) => NumberAnswers) => void }) {
  return (
    <>
      {questions.map((q) => {
        const col = questionColumn(q);
        return (
          <div key={q.field}>
            <label className="label" htmlFor={`lr-num-${col}`}>Numbers of {profile.columnNames[col]}</label>
            <select
              id={`lr-num-${col}`}
              className="field"
              value={answers[col] ?? ''}
              onChange={(e) => setAnswers((a) => ({ ...a, [col]: e.target.value as 'thousands' | 'decimal' }))}
            >
              <option value="">choose</option>
              <option value="thousands">comma between thousands (1,234 = 1234)</option>
              <option value="decimal">decimal comma (1,234 = 1.234)</option>
            </select>
          </div>
        );
      })}
    </>
  );
}

/** The quality columns found, and how the time and units rows were read. */
export function ReadingNotes({ profile }: { profile: LayoutProfile }) {
  const quality = profile.quality;
  return (
    <>
      {quality && (
        <p className="text-sm" data-testid="quality-columns">
          Quality codes:{' '}
          {quality.kind === 'row'
            ? `column ${profile.columnNames[quality.rowColumn!]} applies to the whole row`
            : quality.pairs.map((p) => `${profile.columnNames[p.value]} with ${profile.columnNames[p.quality]}`).join('; ')}
          . Samples whose code is not one of the site's good codes are rejected with their code.
        </p>
      )}
      <p className="text-xs text-ink-soft">
        Time as written: <code>{profile.time.example}</code> · {profile.time.clock === '12h' ? '12-hour clock' : '24-hour clock'} · units row:{' '}
        {profile.unitRowIndex === null ? 'none' : `line ${profile.unitRowIndex + 1}`}
      </p>
    </>
  );
}
