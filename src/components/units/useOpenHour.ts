import { useCallback, useEffect, useRef, useState } from 'react';
import { hourFromAddress, hourInAddress } from './format';

/** The page's address with the opened hour (?hour=...), or without it. */
function addressWith(iso: string | null): URL {
  const url = new URL(window.location.href);
  if (iso) url.searchParams.set('hour', hourInAddress(iso));
  else url.searchParams.delete('hour');
  return url;
}

/** The key of a history entry this page pushed for an opened hour (its value: the hour). */
const HOUR_ENTRY = 'lossline.hour';

/**
 * The hour opened in the side sheet, kept in the address and the browser's history: opening an hour
 * pushes an entry (?hour=...), so Back closes the panel and Forward opens it again; closing by Escape
 * or the button goes back over that entry when this page pushed it, and otherwise (an address that
 * opened the hour directly) replaces it. The focus goes back to what opened the hour.
 */
export function useOpenHour(initialHour: string | null): { open: string | null; openHour: (iso: string, button: HTMLElement) => void; closeHour: () => void } {
  const [open, setOpen] = useState<string | null>(() => hourFromAddress(initialHour));
  const openRef = useRef(open);
  const opener = useRef<HTMLElement | null>(null);

  const openHour = useCallback((iso: string, button: HTMLElement) => {
    opener.current = button;
    openRef.current = iso;
    setOpen(iso);
    window.history.pushState({ ...(window.history.state ?? {}), [HOUR_ENTRY]: iso }, '', addressWith(iso));
  }, []);

  /** Closes the panel on screen (once) and gives the focus back to what opened it; the address is the caller's. */
  const closePanel = useCallback((): string | null => {
    const was = openRef.current;
    if (!was) return null;
    openRef.current = null;
    setOpen(null);
    const back = opener.current?.isConnected
      ? opener.current
      : document.querySelector<HTMLElement>(`tr[data-hour-ms="${Date.parse(was)}"] button[data-open-hour]`);
    opener.current = null;
    requestAnimationFrame(() => back?.focus());
    return was;
  }, []);

  /** Closes the opened hour (once, however asked: Escape, the button) and takes the hour out of the address. */
  const closeHour = useCallback(() => {
    const was = closePanel();
    if (!was) return;
    if ((window.history.state as Record<string, unknown> | null)?.[HOUR_ENTRY] === was) window.history.back();
    else window.history.replaceState(window.history.state, '', addressWith(null));
  }, [closePanel]);

  // Back and Forward: the address says which hour is open, if any.
  useEffect(() => {
    const onPop = () => {
      const hour = hourFromAddress(new URL(window.location.href).searchParams.get('hour'));
      if (hour === openRef.current) return;
      if (openRef.current) closePanel();
      if (hour) {
        opener.current = null;
        openRef.current = hour;
        setOpen(hour);
      }
    };
    window.addEventListener('popstate', onPop);
    return () => window.removeEventListener('popstate', onPop);
  }, [closePanel]);

  return { open, openHour, closeHour };
}
