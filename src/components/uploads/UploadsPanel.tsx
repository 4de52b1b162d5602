import { fixed } from '~/lib/format';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { useEffect, useState } from 'react';
import { call, useApi } from '~/components/api';
import { counted } from '~/lib/counts';
import type { UploadRow } from '~/lib/upload-view';
import { UploadsTable } from './UploadsTable';
import { uppyThemeCss } from './uppyTheme';
import { useUppyUploads } from './useUppyUploads';

interface Site {
  id: string;
  name: string;
  timeZone: string;
}

/** One page of the site's files as the API answers it. */
interface UploadPage {
  uploads: UploadRow[];
  next: string | null;
  total: number;
}
const PAGE_SIZE = 25;

/** Pages of the list by cursor: the cursors of the pages seen so far, the newest page first. */
function usePages(siteId: string) {
  const [cursors, setCursors] = useState<(string | null)[]>([null]);
  useEffect(() => setCursors([null]), [siteId]);
  const before = cursors.at(-1) ?? null;
  const url = siteId ? `/api/sites/${siteId}/uploads?limit=${PAGE_SIZE}${before ? `&before=${encodeURIComponent(before)}` : ''}` : null;
  return {
    url,
    index: cursors.length - 1,
    older: (next: string) => setCursors((c) => [...c, next]),
    newer: () => setCursors((c) => (c.length > 1 ? c.slice(0, -1) : c)),
  };
}

/** Newer and older pages of the list, and where this page is in it. */
function Pager({ page, index, onNewer, onOlder }: { page: UploadPage; index: number; onNewer: () => void; onOlder: () => void }) {
  const first = index * PAGE_SIZE + 1;
  if (page.total <= PAGE_SIZE && index === 0) return <p className="mt-2 text-xs text-ink-faint">{counted(page.total, 'file', 'files')} in all.</p>;
  return (
    <nav aria-label="Pages of files" className="mt-3 flex flex-wrap items-center gap-3 text-sm">
      <button type="button" className="btn" disabled={index === 0} onClick={onNewer}>
        ← Newer files
      </button>
      <span className="text-ink-soft">
        Files {fixed(first, 0)} to {fixed(first + page.uploads.length - 1, 0)} of {fixed(page.total, 0)}, newest first
      </span>
      <button type="button" className="btn" disabled={!page.next} onClick={() => page.next && onOlder()}>
        Older files →
      </button>
    </nav>
  );
}

/** The site the files go to, in its clock. */
function SitePicker({ sites, siteId, setSiteId }: { sites: Site[]; siteId: string; setSiteId: (id: string) => void }) {
  return (
    <div className="flex flex-wrap items-end gap-3">
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
  );
}

/** The uploads page: the site, the drop zone, and the site's files page by page with their reports. */
export default function UploadsPanel({ sites, initialSiteId }: { sites: Site[]; initialSiteId: string | null }) {
  const [siteId, setSiteId] = useState(initialSiteId ?? sites[0]?.id ?? '');
  const [error, setError] = useState<string | null>(null);
  const [open, setOpen] = useState<string | null>(null);

  const pages = usePages(siteId);
  const timeZone = sites.find((s) => s.id === siteId)?.timeZone ?? 'UTC';
  // Read again every 4 s, every 0.7 s while a file is on its way.
  const list = useApi<UploadPage>(pages.url, {
    refreshMs: (d) => (d?.uploads.some((r) => ['awaiting-file', 'queued', 'processing'].includes(r.status)) ? 700 : 4000),
  });
  const rows = list.data?.uploads ?? null;
  const load = list.reload;
  const uppy = useUppyUploads(siteId, load, setError);

  async function retry(id: string) {
    await call(`/api/uploads/${id}/retry`, 'POST', {}).catch((e: Error) => setError(e.message));
    load();
  }

  if (!sites.length) return <p className="notice-error">No site exists yet: an admin creates one in the plant model first.</p>;

  return (
    <div className="space-y-6">
      <style>{uppyThemeCss()}</style>
      <SitePicker sites={sites} siteId={siteId} setSiteId={setSiteId} />
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
          <>
            <UploadsTable rows={rows} siteId={siteId} timeZone={timeZone} open={open} setOpen={setOpen} onRetry={retry} onSaved={() => { setOpen(null); void load(); }} />
            <Pager page={list.data!} index={pages.index} onNewer={pages.newer} onOlder={() => pages.older(list.data!.next!)} />
          </>
        )}
      </section>
    </div>
  );
}
