import { useState } from 'react';
import { useConfirm, type ConfirmOptions } from '~/components/ConfirmDialog';
import { call, messageOf, type Message } from '~/components/api';
import type { Notice } from './looks';

/** The question before closing: a closed notice takes no later signal. */
function closeQuestion(n: Notice): ConfirmOptions {
  return {
    title: `Close the notice of ${n.unitName}?`,
    body: 'A closed notice is not reopened; a later shift of this unit opens a new notice.',
    confirm: 'Close the notice',
  };
}

/**
 * A notice as it is acted on: marked as seen (POST /api/notices/{id}/acknowledge) or closed after a
 * question (POST /api/notices/{id}/close); the answer replaces the notice. `dialog` is the question's
 * element, to be placed in the page.
 */
export function useNoticeActions(initial: Notice) {
  const [n, setN] = useState(initial);
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);
  const { dialog, ask } = useConfirm();

  async function act(what: 'acknowledge' | 'close', body: Record<string, string>) {
    if (what === 'close' && !(await ask(closeQuestion(n)))) return;
    setMessage(null);
    setBusy(true);
    try {
      const out = await call<{ notice: Notice }>(`/api/notices/${n.id}/${what}`, 'POST', body);
      setN({ ...out.notice, display: out.notice.display ?? n.display });
      setMessage({ ok: true, text: what === 'close' ? 'The notice is closed.' : 'Marked as seen.' });
    } catch (e) {
      setMessage(messageOf(e));
    } finally {
      setBusy(false);
    }
  }

  return { n, message, busy, dialog, act };
}
