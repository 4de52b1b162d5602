import { useEffect, useState } from 'react';
import { Notice } from '~/components/plant/common';
import { call, messageOf, type Message } from '~/components/api';

/** The signed-in person's opt-in to the daily digest of notices not yet closed. */
export default function DigestPreference() {
  const [on, setOn] = useState<boolean | null>(null);
  const [message, setMessage] = useState<Message>(null);

  useEffect(() => {
    call<{ preferences: { dailyDigest: boolean } }>('/api/notices/preferences')
      .then((d) => setOn(d.preferences.dailyDigest))
      .catch((e) => setMessage(messageOf(e)));
  }, []);

  async function change(next: boolean) {
    setMessage(null);
    try {
      const d = await call<{ preferences: { dailyDigest: boolean; sendsAt: string } }>('/api/notices/preferences', 'PUT', { dailyDigest: next });
      setOn(d.preferences.dailyDigest);
      setMessage({ ok: true, text: next ? `You will get the digest. ${d.preferences.sendsAt}` : 'No daily digest.' });
    } catch (e) {
      setMessage(messageOf(e));
    }
  }

  return (
    <div className="space-y-2 text-sm">
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={on ?? false} disabled={on === null} onChange={(e) => change(e.target.checked)} />
        E-mail me a daily digest of drift notices not yet closed
      </label>
      <Notice message={message} />
    </div>
  );
}
