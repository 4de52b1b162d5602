import { fixed } from '~/lib/format';
import { Fragment } from 'react';
import { siteStamp } from '~/lib/site-time';
import type { UploadRow } from '~/lib/upload-view';
import { StateMark } from '../StateMark';
import { LayoutReview } from './LayoutReview';
import { UploadReport } from './UploadReport';
import { READ_STATES, UPLOAD_STATE_LOOK } from './uploadStates';
import { GridTable, ACTIONS, num } from '~/components/ui/GridTable';

const fmtBytes = (n: number | null) =>
  n === null ? '' : n < 1024 ? `${n} B` : n < 1024 ** 2 ? `${fixed(n / 1024, 1)} KiB` : `${fixed(n / 1024 ** 2, 1)} MiB`;

const FALLBACK_LOOK = { shape: 'ring' as const, className: 'text-slate' };

/** The state of a row in words: a repeat says which file it repeats, not "read, 0 rows". */
function lookOf(r: UploadRow) {
  if (r.duplicateOf) return { ...UPLOAD_STATE_LOOK.done!, label: `same file as ${r.duplicateOfFile?.fileName ?? 'an earlier upload'}, already read` };
  return UPLOAD_STATE_LOOK[r.status] ?? { ...FALLBACK_LOOK, label: r.status };
}

/** The progress of reading a file, named for the file; "read" once it is. */
function Progress({ r }: { r: UploadRow }) {
  const pct = Math.round(r.progress * 100);
  const read = READ_STATES.includes(r.status);
  return (
    <div
      role="progressbar"
      aria-label={read ? `${r.fileName} read` : `Reading ${r.fileName}`}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={pct}
      aria-valuetext={read ? 'read' : `${pct} % read`}
      className="h-2 w-full overflow-hidden rounded bg-paper-edge"
    >
      <div className="h-full bg-teal transition-all" style={{ width: `${pct}%` }} />
    </div>
  );
}

interface RowProps {
  r: UploadRow;
  timeZone: string;
  isOpen: boolean;
  onToggle: () => void;
  onRetry: () => void;
}

/** The buttons of a row, each named with its file. */
function RowActions({ r, isOpen, onToggle, onRetry }: Omit<RowProps, 'timeZone'>) {
  const review = r.status === 'needs-review' || !!r.detection;
  const word = review ? 'Review layout' : isOpen ? 'Hide report' : 'Report';
  const of = review ? `of ${r.fileName}` : `for ${r.fileName}`;
  return (
    <>
      {r.status === 'failed' && (
        <button className="btn" type="button" aria-label={`Read ${r.fileName} again`} onClick={onRetry}>
          Read again
        </button>
      )}
      {(READ_STATES.includes(r.status) || r.status === 'failed' || r.status === 'needs-review') && (
        <button className="btn ml-1" type="button" aria-label={`${word} ${of}`} aria-expanded={isOpen} onClick={onToggle}>
          {word}
        </button>
      )}
    </>
  );
}

function UploadTableRow(p: RowProps) {
  const { r, timeZone } = p;
  return (
    <tr data-testid={`upload-${r.fileName}`}>
      <td className="max-w-xs truncate" title={r.fileName}>{r.fileName}</td>
      <td className="whitespace-nowrap text-sm">
        {siteStamp(r.createdAt, timeZone)}
        {r.uploadedBy ? <span className="block text-xs text-ink-soft">by {r.uploadedBy}</span> : null}
      </td>
      <td className="num">{fmtBytes(r.sizeBytes)}</td>
      <td><StateMark {...lookOf(r)} /></td>
      <td><Progress r={r} /></td>
      <td className="num">{r.duplicateOf ? '–' : fixed(r.rowsRead, 0)}</td>
      <td className="whitespace-nowrap text-right">
        <RowActions r={r} isOpen={p.isOpen} onToggle={p.onToggle} onRetry={p.onRetry} />
      </td>
    </tr>
  );
}

interface TableProps {
  rows: UploadRow[];
  siteId: string;
  timeZone: string;
  open: string | null;
  setOpen: (id: string | null) => void;
  onRetry: (id: string) => void;
  onSaved: () => void;
}

/** A site's files: when and by whom each came, its state, how far it was read, and its report. */
export function UploadsTable({ rows, siteId, timeZone, open, setOpen, onRetry, onSaved }: TableProps) {
  return (
    <div className="overflow-x-auto">
      <GridTable testId="uploads-table" columns={['File', <>Uploaded ({timeZone})</>, num('Size'), 'State', { label: 'Progress', className: 'w-40' }, num('Rows'), ACTIONS]}>
        {rows.map((r) => (
          <Fragment key={r.uploadId}>
            <UploadTableRow r={r} timeZone={timeZone} isOpen={open === r.uploadId} onToggle={() => setOpen(open === r.uploadId ? null : r.uploadId)} onRetry={() => onRetry(r.uploadId)} />
            {open === r.uploadId && (
              <tr>
                <td colSpan={7} className="bg-paper-deep/40">
                  {(r.status === 'needs-review' || r.status === 'failed') && r.detection ? (
                    <LayoutReview upload={r} onSaved={onSaved} timeZone={timeZone} />
                  ) : (
                    <UploadReport row={r} timeZone={timeZone} siteId={siteId} />
                  )}
                </td>
              </tr>
            )}
          </Fragment>
        ))}
      </GridTable>
    </div>
  );
}
