import { useEffect, useState } from 'react';
import { useConfirm } from '~/components/ConfirmDialog';
import { call, messageOf, type Message } from '~/components/api';
import type { BaselineSummary, FitView } from './types';

const DISCARD = {
  title: 'Discard this baseline version?',
  body: 'A discarded version can no longer be accepted; fit a new version to try again.',
  confirm: 'Discard the version',
  danger: true,
};

/**
 * A baseline version and its fit (GET /api/baselines/{baselineId}), and the decision on a draft:
 * accept, or discard after a question (POST /api/baselines/{baselineId}/accept or /discard).
 */
export function useBaselineDecision(baselineId: string) {
  const [data, setData] = useState<{ baseline: BaselineSummary; fit: FitView } | null>(null);
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);
  const { dialog, ask } = useConfirm();

  useEffect(() => {
    let live = true;
    setData(null);
    call<{ baseline: BaselineSummary; fit: FitView }>(`/api/baselines/${baselineId}`)
      .then((d) => live && setData(d))
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [baselineId]);

  async function decide(what: 'accept' | 'discard') {
    if (what === 'discard' && !(await ask(DISCARD))) return;
    setBusy(true);
    setMessage(null);
    try {
      const { baseline } = await call<{ baseline: BaselineSummary }>(`/api/baselines/${baselineId}/${what}`, 'POST', {});
      setData((d) => (d ? { ...d, baseline } : d));
      setMessage({
        ok: true,
        text: what === 'accept' ? `Version ${baseline.version} is now the active baseline of ${baseline.unitName}.` : `Version ${baseline.version} is discarded.`,
      });
    } catch (e) {
      setMessage(messageOf(e));
    } finally {
      setBusy(false);
    }
  }

  return { data, message, busy, dialog, decide };
}
