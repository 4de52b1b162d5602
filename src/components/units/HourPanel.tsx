import { useEffect, useId, useRef, useState } from 'react';
import { HourDetail } from './HourDetail';
import { siteTime } from './format';
import type { UnitInfo } from '~/lib/views/unit-hour';

/**
 * One hour opened up in place: a side sheet over the hour table in the browser's own modal <dialog>
 * (focus moves in and stays in, the table behind is inert, Escape closes), with the address that
 * opens this hour directly. `onClose` runs once however it is closed (Escape, the button, the page).
 */
export function HourPanel({ unit, hourStart, link, onClose }: { unit: UnitInfo; hourStart: string; link: string; onClose: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  const closeButton = useRef<HTMLButtonElement>(null);
  const id = useId();
  const [copied, setCopied] = useState<string>('');

  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (!d.open) d.showModal();
    closeButton.current?.focus();
    return () => {
      if (d.open) d.close();
    };
  }, []);

  useEffect(() => setCopied(''), [hourStart]);

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(link);
      setCopied('Link copied.');
    } catch {
      setCopied('The browser did not let the page copy: copy the address of “Link to this hour” instead.');
    }
  };

  // !m-0: the page's spaced column (space-y-*) would push the sheet 24 px down from the window's top.
  return (
    <dialog
      ref={ref}
      aria-modal="true"
      aria-labelledby={`${id}-title`}
      className="fixed inset-y-0 left-auto right-0 !m-0 h-full max-h-full w-full max-w-6xl overflow-y-auto border-0 border-l border-paper-edge bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40"
      data-testid="hour-detail"
      onCancel={(e) => {
        // Escape: closed by the page, so the opener gets its focus back and the address loses the hour.
        e.preventDefault();
        onClose();
      }}
      onClose={onClose}
    >
      <header className="sticky top-0 z-10 flex flex-wrap items-center gap-3 border-b border-paper-edge bg-paper px-5 py-3">
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {unit.name}, hour from {siteTime(hourStart, unit.timeZone)} ({unit.timeZone})
        </h2>
        <div className="ml-auto flex flex-wrap items-center gap-2">
          <a href={link} data-testid="hour-link" className="text-sm">
            Link to this hour
          </a>
          <button type="button" className="btn px-2 py-0.5 text-sm" onClick={() => void copy()}>
            Copy link
          </button>
          <button ref={closeButton} type="button" className="btn" onClick={onClose}>
            Close the hour
          </button>
        </div>
        <p role="status" className="w-full text-xs text-ink-soft">
          {copied}
        </p>
      </header>
      <div className="px-5 py-4">
        <HourDetail unit={unit} hourStart={hourStart} />
      </div>
    </dialog>
  );
}
