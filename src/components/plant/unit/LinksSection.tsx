import { useState } from 'react';
import LinkForm, { type TagJson, type UnitJson } from '../LinkForm';
import { holdsNow, type LinkVersionAnswer } from '~/lib/plant/link-version';
import LinkVersionsTable from './LinkVersionsTable';
import type { LinkFormState } from './types';

interface Props {
  siteId: string;
  timeZone: string;
  unit: UnitJson;
  tags: TagJson[];
  history: LinkVersionAnswer[];
  canEdit: boolean;
  linkForm: LinkFormState | null;
  setLinkForm: (f: LinkFormState | null) => void;
  onDone: (text: string) => void;
  onEnd: (l: LinkVersionAnswer) => void;
}

/** The links that hold now, the form to add or change one, and every version on demand. */
export default function LinksSection(p: Props) {
  const [showHistory, setShowHistory] = useState(false);
  const portOrder = new Map(p.unit.ports.map((port, i) => [port.id, i]));
  const current = p.history
    .filter((l) => holdsNow(l))
    .sort((a, b) => (portOrder.get(a.portId ?? '') ?? 99) - (portOrder.get(b.portId ?? '') ?? 99) || a.quantity.localeCompare(b.quantity));
  const change = (l: LinkVersionAnswer) => p.setLinkForm({ target: `${l.portId ?? ''}|${l.quantity}`, tag: undefined, unit: l.engUnit, changing: true, key: Date.now() });
  return (
    <section className="card">
      <div className="mb-3 flex items-baseline justify-between">
        <h2>Tag links</h2>
        {p.canEdit && (
          <button type="button" className="btn" onClick={() => p.setLinkForm({ key: Date.now() })}>
            Link a tag…
          </button>
        )}
      </div>
      {p.linkForm && (
        <div className="mb-3">
          <LinkForm
            key={p.linkForm.key}
            siteId={p.siteId}
            timeZone={p.timeZone}
            units={[p.unit]}
            tags={p.tags}
            fixed={{ unitId: p.unit.id, target: p.linkForm.target, tag: p.linkForm.tag, unit: p.linkForm.unit }}
            changing={p.linkForm.changing}
            onCancel={() => p.setLinkForm(null)}
            onDone={p.onDone}
          />
        </div>
      )}
      <LinkVersionsTable links={current} timeZone={p.timeZone} actions={{ canEdit: p.canEdit, onChange: change, onEnd: p.onEnd }} />
      <button type="button" className="btn mt-3 text-xs" aria-expanded={showHistory} onClick={() => setShowHistory(!showHistory)}>
        {showHistory ? 'Hide' : 'Show'} every version ({p.history.length})
      </button>
      {showHistory && <LinkVersionsTable links={p.history} timeZone={p.timeZone} />}
      <p className="mt-2 text-xs text-ink-faint">
        Times in {p.timeZone}. Changing a link starts a new version; hours before it keep the old one, and only the hours it touches are recomputed.
      </p>
    </section>
  );
}
