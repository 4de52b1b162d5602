import { useEffect, useState } from 'react';
import { Notice } from '~/components/plant/common';
import { Options } from '~/components/ui/Field';
import { call, messageOf, type Message } from '~/components/api';

interface Settings {
  siteId: string;
  escalationMultiple: number;
  isDefault: boolean;
}

/** The energy lead's setting per site: the growth of cost per day since the last mail that sends the next one. */
export default function EscalationSetting({ sites }: { sites: { id: string; name: string }[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const [value, setValue] = useState('');
  const [current, setCurrent] = useState<Settings | null>(null);
  const [message, setMessage] = useState<Message>(null);

  useEffect(() => {
    if (!siteId) return;
    setMessage(null);
    call<{ settings: Settings }>(`/api/notices/settings?siteId=${siteId}`)
      .then((d) => {
        setCurrent(d.settings);
        setValue(String(d.settings.escalationMultiple));
      })
      .catch((e) => setMessage(messageOf(e)));
  }, [siteId]);

  async function save() {
    setMessage(null);
    try {
      const d = await call<{ settings: Settings }>(`/api/notices/settings?siteId=${siteId}`, 'PUT', { escalationMultiple: Number(value) });
      setCurrent(d.settings);
      setMessage({ ok: true, text: `An open notice is mailed again when its cost per day reaches ${d.settings.escalationMultiple} times the figure of its last mail.` });
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  if (!sites.length) return <p className="text-sm text-ink-faint">No site yet.</p>;
  return (
    <div className="space-y-2 text-sm">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1">
          <span className="label">Site</span>
          <select className="field" value={siteId} onChange={(e) => setSiteId(e.target.value)}>
            <Options choices={sites.map((s) => [s.id, s.name] as const)} />
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="label" id="multiple-label">
            Mail again when the cost per day has grown by a factor of
          </span>
          <input className="field w-28" type="number" min={1.1} max={100} step={0.1} value={value} onChange={(e) => setValue(e.target.value)} aria-labelledby="multiple-label" />
        </label>
        <button type="button" className="btn" onClick={save}>
          Save
        </button>
      </div>
      {current && <p className="text-xs text-ink-faint">{current.isDefault ? 'The default (2) applies at this site.' : 'Set for this site.'}</p>}
      <Notice message={message} />
    </div>
  );
}
