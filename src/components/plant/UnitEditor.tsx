import { useCallback, useState } from 'react';
import { kindSpec } from '~/lib/plant/kinds';
import { call, messageOf, type Message } from '~/components/api';
import { useConfirm } from '~/components/ConfirmDialog';
import { Notice } from './common';
import type { TagJson, UnitJson } from './LinkForm';
import AddPortForm from './unit/AddPortForm';
import FuelEditor from './unit/FuelEditor';
import LinksSection from './unit/LinksSection';
import ParametersForm from './unit/ParametersForm';
import PortsTable from './unit/PortsTable';
import UnitStatusCard from './unit/UnitStatusCard';
import type { LinkVersionAnswer } from '~/lib/plant/link-version';
import type { LinkFormState, UnitPageData } from './unit/types';

export type { UnitPageData } from './unit/types';
export { slotCountWords } from './unit/slot-words';

/** The unit's data, reloaded after each change, and the changes that need no form. */
function useUnit(initial: UnitPageData) {
  const [data, setData] = useState<UnitPageData>(initial);
  const { site, unit } = data;
  const reload = useCallback(async () => {
    const [u, t] = await Promise.all([
      call<{ unit: UnitJson; history: LinkVersionAnswer[] }>(`/api/sites/${site.id}/units/${unit.id}`),
      call<{ tags: TagJson[] }>(`/api/sites/${site.id}/tags`),
    ]);
    setData((d) => ({ ...d, unit: u.unit, history: u.history, tags: t.tags }));
  }, [site.id, unit.id]);
  const base = `/api/sites/${site.id}`;
  return {
    data,
    reload,
    removePort: (id: string) => call(`${base}/units/${unit.id}/ports/${id}`, 'DELETE'),
    endLink: (id: string) => call(`${base}/links/${id}`, 'DELETE'),
    removeUnit: () => call(`${base}/units/${unit.id}`, 'DELETE'),
  };
}

/** One unit: what it lacks, its ports and fluids, its tag links and their versions, its parameters. */
export default function UnitEditor({ initial, canEdit }: { initial: UnitPageData; canEdit: boolean }) {
  const u = useUnit(initial);
  const { site, unit } = u.data;
  const spec = kindSpec(unit.kind);
  const [message, setMessage] = useState<Message>(null);
  const [linkForm, setLinkForm] = useState<LinkFormState | null>(null);
  const { dialog, ask } = useConfirm();

  const done = async (m: Message) => {
    setMessage(m);
    setLinkForm(null);
    await u.reload();
  };
  const attempt = (work: () => Promise<unknown>, after: () => Promise<void> | void) => work().then(after, (e) => setMessage(messageOf(e)));
  async function removePort(p: { id: string; name: string }) {
    if (!(await ask({ title: `Remove port ${p.name}?`, body: 'Its tag links go with it.', confirm: 'Remove the port', danger: true }))) return;
    await attempt(() => u.removePort(p.id), () => done({ ok: true, text: `Port ${p.name} removed.` }));
  }
  const endLink = (l: LinkVersionAnswer) => attempt(() => u.endLink(l.id), () => done({ ok: true, text: `${l.tagName} no longer linked from now on; older hours keep it.` }));
  async function removeUnit() {
    if (!(await ask({ title: `Delete unit ${unit.name}?`, body: 'Its ports and tag links are deleted with it.', confirm: 'Delete the unit', danger: true }))) return;
    await attempt(u.removeUnit, () => void (window.location.href = `/plant/${site.id}`));
  }

  return (
    <div className="space-y-6">
      {dialog}
      <UnitStatusCard unit={unit} canEdit={canEdit} onLink={(target) => setLinkForm({ target, key: Date.now() })} />
      <Notice message={message} />
      <LinksSection
        siteId={site.id}
        timeZone={site.timeZone}
        unit={unit}
        tags={u.data.tags}
        history={u.data.history}
        canEdit={canEdit}
        linkForm={linkForm}
        setLinkForm={setLinkForm}
        onDone={(text) => done({ ok: true, text })}
        onEnd={endLink}
      />
      <section className="card">
        <h2 className="mb-3">Ports</h2>
        <PortsTable unit={unit} canEdit={canEdit} onRemove={removePort} />
        {canEdit && spec.ports.length > 0 && <AddPortForm data={u.data} onDone={done} />}
      </section>
      {spec.needsFuel && (
        <section className="card">
          <h2 className="mb-3">Fuel</h2>
          <FuelEditor key={JSON.stringify(unit.fuel ?? null)} data={u.data} canEdit={canEdit} onSaved={done} />
        </section>
      )}
      <section className="card">
        <h2 className="mb-3">Parameters</h2>
        <ParametersForm key={JSON.stringify(unit.parameters)} data={u.data} canEdit={canEdit} onSaved={done} />
      </section>
      <section className="card text-sm text-ink-soft">
        <h2 className="mb-2 text-ink">{spec.label}: how it is balanced</h2>
        <p>
          Fuel: {spec.fuel}. Product: {spec.product}.
        </p>
        {canEdit && (
          <button type="button" className="btn btn-danger mt-3" onClick={removeUnit}>
            Delete this unit
          </button>
        )}
      </section>
    </div>
  );
}
