import { counted } from '~/lib/counts';
import { call, messageOf, type Message } from '~/components/api';

/** The Model file card: download the whole model; admins replace it from a file (all or nothing). */
export default function ModelFileSection({ siteId, canEdit, onMessage, onReplaced }: { siteId: string; canEdit: boolean; onMessage: (m: Message) => void; onReplaced: () => Promise<void> }) {
  async function importFile(file: File | undefined) {
    if (!file) return;
    try {
      const out = await call<{ units: number }>(`/api/v1/sites/${siteId}/model`, 'PUT', await file.text());
      onMessage({ ok: true, text: `Model replaced from ${file.name}: ${counted(out.units, 'unit', 'units')}.` });
      await onReplaced();
    } catch (e) {
      onMessage(messageOf(e));
    }
  }

  return (
    <section className="card">
      <h2 className="mb-1">Model file</h2>
      <p className="mb-3 text-sm text-ink-soft">
        The whole model as one JSON file (<a href="/help/model-file">its format</a>), to keep under version control or set up a site in one step.
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <a className="btn no-underline" href={`/api/v1/sites/${siteId}/model`} download>
          Download model file
        </a>
        {canEdit && (
          <label className="text-sm">
            Replace the model from a file (all or nothing):{' '}
            <input type="file" accept="application/json,.json" aria-label="Model file to import" onChange={(e) => importFile(e.target.files?.[0])} />
          </label>
        )}
      </div>
    </section>
  );
}
