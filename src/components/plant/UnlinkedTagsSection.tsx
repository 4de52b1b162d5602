import { useState } from 'react';
import LinkForm, { type TagJson } from './LinkForm';
import type { Overview } from './site-overview';
import { GridTable } from '~/components/ui/GridTable';

/** The unlinked tags, each with a button that opens the link form for it (admins). */
function UnlinkedTable({ unlinked, canLink, linking, setLinking }: { unlinked: TagJson[]; canLink: boolean; linking: string | null; setLinking: (tag: string | null) => void }) {
  return (
    <GridTable testId="unlinked-tags" columns={['Tag', 'Unit in the export', 'Description', '']}>
      {unlinked.map((t) => (
        <tr key={t.id} data-testid={`unlinked-${t.name}`}>
          <td className="font-mono text-xs">{t.name}</td>
          <td>{t.unitHint ?? ''}</td>
          <td>{t.description ?? ''}</td>
          <td className="text-right">
            {canLink && (
              <button type="button" className="btn" onClick={() => setLinking(linking === t.name ? null : t.name)}>
                Link {t.name}…
              </button>
            )}
          </td>
        </tr>
      ))}
    </GridTable>
  );
}

/** The Unlinked tags card: search, the list, and the link form of the tag chosen. */
export default function UnlinkedTagsSection({
  overview,
  canEdit,
  search,
  setSearch,
  unlinked,
  allTags,
  onLinked,
}: {
  overview: Overview;
  canEdit: boolean;
  search: string;
  setSearch: (s: string) => void;
  unlinked: TagJson[] | null;
  allTags: TagJson[];
  onLinked: (text: string) => Promise<void>;
}) {
  const [linking, setLinking] = useState<string | null>(null);
  return (
    <section className="card">
      <h2 className="mb-1">Unlinked tags</h2>
      <p className="mb-3 text-sm text-ink-soft">Tags from uploaded files that no unit uses yet.</p>
      <input aria-label="Search tags" className="field mb-3 max-w-sm" placeholder="Search name or description" value={search} onChange={(e) => setSearch(e.target.value)} />
      {!unlinked ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : unlinked.length === 0 ? (
        <p className="text-sm text-ink-faint">{search ? 'No unlinked tag matches.' : 'Every tag is linked.'}</p>
      ) : (
        <UnlinkedTable unlinked={unlinked} canLink={canEdit && overview.units.length > 0} linking={linking} setLinking={setLinking} />
      )}
      {linking && (
        <div className="mt-3">
          <LinkForm
            key={linking}
            siteId={overview.site.id}
            timeZone={overview.site.timeZone}
            units={overview.units}
            tags={allTags}
            fixed={{ tag: linking }}
            onCancel={() => setLinking(null)}
            onDone={async (text) => {
              setLinking(null);
              await onLinked(text);
            }}
          />
        </div>
      )}
    </section>
  );
}
