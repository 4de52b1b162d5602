import AwsS3 from '@uppy/aws-s3';
import Uppy from '@uppy/core';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { fixed } from '~/lib/format';
import { Fragment, useEffect, useMemo, useState } from 'react';
import { StateMark } from '../StateMark';
import { call, useApi } from '~/components/api';
import { LayoutReview } from './LayoutReview';
import { READ_STATES, UPLOAD_STATE_LOOK } from './uploadStates';
import { TagCounts } from './TagCounts';
import type { UploadRow } from '~/lib/upload-view';

interface Site {
  id: string;
  name: string;
  timeZone: string;
}

/** An empty JSON body: the API takes JSON, never form posts (which Astro's origin check refuses cross-site). */

/** Files up to this size get their SHA-256 in the browser, so a repeat is known before it is sent. */
const HASH_IN_BROWSER_BYTES = 256 * 1024 * 1024;

async function sha256Hex(file: Blob): Promise<string | undefined> {
  if (file.size > HASH_IN_BROWSER_BYTES || !globalThis.crypto?.subtle) return undefined;
  const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

const fmtBytes = (n: number | null) =>
  n === null ? '' : n < 1024 ? `${n} B` : n < 1024 ** 2 ? `${(n / 1024).toFixed(1)} KiB` : `${(n / 1024 ** 2).toFixed(1)} MiB`;

export default function UploadsPanel({ sites, initialSiteId }: { sites: Site[]; initialSiteId: string | null }) {
  const [siteId, setSiteId] = useState(initialSiteId ?? sites[0]?.id ?? '');
  const [error, setError] = useState<string | null>(null);
  const [open, setOpen] = useState<string | null>(null);

  // Read again every 4 s, every 0.7 s while a file is on its way.
  const list = useApi<{ uploads: UploadRow[] }>(siteId ? `/api/sites/${siteId}/uploads` : null, {
    refreshMs: (d) => (d?.uploads.some((r) => ['awaiting-file', 'queued', 'processing'].includes(r.status)) ? 700 : 4000),
  });
  const rows = list.data?.uploads ?? null;
  const load = list.reload;

  const uppy = useMemo(() => {
    const u = new Uppy({ id: 'historian-files', autoProceed: false, restrictions: { maxFileSize: 4 * 1024 ** 3, allowedFileTypes: ['.csv', '.txt', '.tsv', 'text/*'] } });
    u.use(AwsS3, {
      shouldUseMultipart: false,
      async getUploadParameters(file) {
        const site = (file.meta as { siteId?: string }).siteId;
        const body = { fileName: file.name, sizeBytes: file.size, contentType: file.type || 'text/csv', sha256: await sha256Hex(file.data as Blob) };
        const data = await call<{ uploadId: string; url: string; headers: Record<string, string> }>(`/api/sites/${site}/uploads`, 'POST', body);
        u.setFileMeta(file.id, { uploadId: data.uploadId });
        return { method: 'PUT', url: data.url, headers: data.headers };
      },
    });
    return u;
  }, []);

  useEffect(() => {
    const onAdded = (file: { id: string }) => uppy.setFileMeta(file.id, { siteId });
    uppy.getFiles().forEach((f) => uppy.setFileMeta(f.id, { siteId }));
    uppy.on('file-added', onAdded);
    return () => void uppy.off('file-added', onAdded);
  }, [uppy, siteId]);

  useEffect(() => {
    const onSuccess = async (file: { meta: Record<string, unknown> } | undefined) => {
      const id = file?.meta.uploadId as string | undefined;
      if (!id) return;
      await call(`/api/uploads/${id}/complete`, 'POST', {}).catch((e: Error) => setError(e.message));
      load();
    };
    uppy.on('upload-success', onSuccess);
    return () => void uppy.off('upload-success', onSuccess);
  }, [uppy, load]);

  async function retry(id: string) {
    await call(`/api/uploads/${id}/retry`, 'POST', {}).catch((e: Error) => setError(e.message));
    load();
  }

  if (!sites.length) return <p className="notice-error">No site exists yet: an admin creates one in the plant model first.</p>;

  return (
    <div className="space-y-6">
      <div className="flex items-end gap-3">
        <div>
          <label className="label" htmlFor="site">Site</label>
          <select id="site" className="field" value={siteId} onChange={(e) => setSiteId(e.target.value)}>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>{s.name} ({s.timeZone})</option>
            ))}
          </select>
        </div>
        <p className="pb-2 text-sm text-ink-soft">Local times in a file are read on this site's clock.</p>
      </div>
      <div className="card p-2">
        <Dashboard uppy={uppy} proudlyDisplayPoweredByUppy={false} height={260} width="100%" note="Historian or logger exports as CSV (comma, semicolon or tab separated), up to 4 GiB each." />
      </div>
      {(error ?? list.error) && <p role="alert" className="notice-error">{error ?? list.error}</p>}
      <section className="card">
        <h2 className="mb-3">Files of this site</h2>
        {!rows ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : rows.length === 0 ? (
          <p className="text-sm text-ink-faint">No file uploaded yet. Drop one above.</p>
        ) : (
          <table className="grid-table" data-testid="uploads-table">
            <thead>
              <tr>
                <th>File</th>
                <th className="num">Size</th>
                <th>State</th>
                <th className="w-48">Progress</th>
                <th className="num">Rows</th>
                <th></th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => {
                const look = UPLOAD_STATE_LOOK[r.status] ?? { label: r.status, shape: 'ring' as const, className: 'text-slate' };
                return (
                  <Fragment key={r.uploadId}>
                    <tr data-testid={`upload-${r.fileName}`}>
                      <td className="max-w-xs truncate" title={r.fileName}>{r.fileName}</td>
                      <td className="num">{fmtBytes(r.sizeBytes)}</td>
                      <td><StateMark {...look} /></td>
                      <td>
                        <div
                          role="progressbar"
                          aria-label={`Reading ${r.fileName}`}
                          aria-valuemin={0}
                          aria-valuemax={100}
                          aria-valuenow={Math.round(r.progress * 100)}
                          className="h-2 w-full overflow-hidden rounded bg-paper-edge"
                        >
                          <div className="h-full bg-teal transition-all" style={{ width: `${Math.round(r.progress * 100)}%` }} />
                        </div>
                      </td>
                      <td className="num">{fixed(r.rowsRead, 0)}</td>
                      <td className="text-right">
                        {r.status === 'failed' && (
                          <button className="btn" type="button" onClick={() => retry(r.uploadId)}>Read again</button>
                        )}
                        {(READ_STATES.includes(r.status) || r.status === 'failed' || r.status === 'needs-review') && (
                          <button className="btn ml-1" type="button" onClick={() => setOpen(open === r.uploadId ? null : r.uploadId)}>
                            {r.status === 'needs-review' || r.detection ? 'Review layout' : open === r.uploadId ? 'Hide report' : 'Report'}
                          </button>
                        )}
                      </td>
                    </tr>
                    {open === r.uploadId && (
                      <tr>
                        <td colSpan={6} className="bg-paper-deep/40">
                          {(r.status === 'needs-review' || r.status === 'failed') && r.detection ? (
                            <LayoutReview upload={r} onSaved={() => { setOpen(null); void load(); }} />
                          ) : (
                            <UploadReport row={r} />
                          )}
                        </td>
                      </tr>
                    )}
                  </Fragment>
                );
              })}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}

function UploadReport({ row }: { row: UploadRow }) {
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
    return <p className="py-2 text-sm" data-testid="upload-report">{s.note ?? 'Same bytes as an earlier upload: not read again.'}</p>;
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
