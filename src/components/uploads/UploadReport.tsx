import { fixed } from '~/lib/format';
import { siteStampWithZone } from '~/lib/site-time';
import type { UploadRow } from '~/lib/upload-view';
import { TagCounts } from './TagCounts';

/** The day of an instant in the site's clock, for a link to the hours. */
const dayIn = (iso: string, tz: string) => siteStampWithZone(iso, tz).slice(0, 10);

/** The span of tag hours a file produced, with a link to the unit hours of those days. */
function HoursSpan({ row, timeZone, siteId }: { row: UploadRow; timeZone: string; siteId: string }) {
  if (!row.hoursFrom || !row.hoursTo) return <p className="text-sm text-ink-soft">The file produced no tag hours.</p>;
  const href = `/units?site=${siteId}&from=${dayIn(row.hoursFrom, timeZone)}&to=${dayIn(row.hoursTo, timeZone)}`;
  return (
    <p className="text-sm" data-testid="upload-span">
      Hours from {siteStampWithZone(row.hoursFrom, timeZone)} to {siteStampWithZone(row.hoursTo, timeZone)} (hour starts).{' '}
      <a href={href}>Unit hours of these days</a>
    </p>
  );
}

/** What became of one file: its figures, warnings, tags, rejected cells and the hours it produced. */
export function UploadReport({ row, timeZone, siteId }: { row: UploadRow; timeZone: string; siteId: string }) {
  const s = row.summary ?? {};
  if (row.status === 'failed') {
    return (
      <div className="space-y-2 py-2" data-testid="upload-report">
        <p className="notice-error">{row.reason}</p>
        <p className="text-sm text-ink-soft">The raw file is kept in the store; nothing of it entered the tag hours.</p>
      </div>
    );
  }
  if (row.duplicateOf) {
    const first = row.duplicateOfFile;
    return (
      <p className="py-2 text-sm" data-testid="upload-report">
        {first
          ? `Same file as ${first.fileName} (uploaded ${siteStampWithZone(first.createdAt, timeZone)}), already read: not read again.`
          : (s.note ?? 'Same file as an earlier upload, already read: not read again.')}
      </p>
    );
  }
  return (
    <div className="space-y-2 py-2" data-testid="upload-report">
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-6">
        <dt className="text-ink-soft">Rows</dt><dd className="tabular-nums">{fixed(s.rows, 0)}</dd>
        <dt className="text-ink-soft">Tags</dt><dd className="tabular-nums">{s.tags} ({s.newTags ?? 0} new)</dd>
        <dt className="text-ink-soft">Tag hours</dt><dd className="tabular-nums">{fixed(s.hours, 0)}</dd>
        <dt className="text-ink-soft">Values</dt><dd className="tabular-nums">{fixed(s.values, 0)}</dd>
        <dt className="text-ink-soft">Rejected cells</dt><dd className="tabular-nums">{fixed(s.rejected, 0)}</dd>
        <dt className="text-ink-soft">Warnings</dt><dd className="tabular-nums">{s.warnings?.length ?? 0}</dd>
      </dl>
      <HoursSpan row={row} timeZone={timeZone} siteId={siteId} />
      {!!s.warnings?.length && (
        <ul className="list-disc pl-5 text-sm">
          {s.warnings.map((w) => (
            <li key={w.code}>{w.message} ({w.count}×)</li>
          ))}
        </ul>
      )}
      {!!s.goodQualityCodes?.length && (
        <p className="text-sm text-ink-soft">Good quality codes of this site: {s.goodQualityCodes.join(', ')}; samples with other codes were rejected with their code.</p>
      )}
      {!!s.perTag?.length && <TagCounts rows={s.perTag} />}
      {!!s.rejected && (
        <a className="text-sm" href={`/api/uploads/${row.uploadId}/rejects.csv`} download>
          Download every rejected cell with its reason (CSV)
        </a>
      )}
    </div>
  );
}
