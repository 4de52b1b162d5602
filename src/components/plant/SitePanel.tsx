import { useCallback, useState } from 'react';
import { Notice } from './common';
import { call, messageOf, type Message } from '~/components/api';
import ModelFileSection from './ModelFileSection';
import SiteSettingsForm from './SiteSettingsForm';
import SiteUnitsSection from './SiteUnitsSection';
import UnlinkedTagsSection from './UnlinkedTagsSection';
import { useSiteTags } from './useSiteTags';
import type { Overview } from './site-overview';

/** A site: its settings, units with what each lacks, unlinked tags, and the model file. */
export default function SitePanel({ initial, canEdit }: { initial: Overview; canEdit: boolean }) {
  const siteId = initial.site.id;
  const [overview, setOverview] = useState<Overview>(initial);
  const [message, setMessage] = useState<Message>(null);
  const [search, setSearch] = useState('');
  const { unlinked, allTags, loadTags } = useSiteTags(siteId, search, (e) => setMessage(messageOf(e)));

  const reload = useCallback(async () => {
    setOverview(await call<Overview>(`/api/sites/${siteId}`));
  }, [siteId]);
  const reloadAll = async () => {
    await reload();
    await loadTags();
  };

  return (
    <div className="space-y-6">
      <Notice message={message} />
      <SiteUnitsSection siteId={siteId} units={overview.units} canEdit={canEdit} onMessage={setMessage} onAdded={reload} />
      <UnlinkedTagsSection
        overview={overview}
        canEdit={canEdit}
        search={search}
        setSearch={setSearch}
        unlinked={unlinked}
        allTags={allTags}
        onLinked={async (text) => {
          setMessage({ ok: true, text });
          await reloadAll();
        }}
      />
      <section className="card">
        <h2 className="mb-3">Site settings</h2>
        <SiteSettingsForm
          key={JSON.stringify(overview.settings)}
          overview={overview}
          canEdit={canEdit}
          onSaved={async (m) => {
            setMessage(m);
            if (m?.ok) await reload();
          }}
        />
      </section>
      <ModelFileSection siteId={siteId} canEdit={canEdit} onMessage={setMessage} onReplaced={reloadAll} />
    </div>
  );
}
