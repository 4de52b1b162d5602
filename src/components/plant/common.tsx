import { siteNowWall, siteStamp, siteWallTime } from '~/lib/site-time';
import type { Message } from '~/components/api';

/** A status line, and the JSON path of each issue when the server sent some. */
export function Notice({ message }: { message: Message }) {
  if (!message) return null;
  return (
    <div role={message.ok ? 'status' : 'alert'} className={message.ok ? 'notice-ok' : 'notice-error'}>
      <p>{message.text}</p>
      {message.issues && message.issues.length > 1 && (
        <ul className="mt-1 list-disc pl-5 text-xs" data-testid="issues">
          {message.issues.map((i, n) => (
            <li key={n}>
              <code>{i.path}</code>: {i.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** The labelled form field, kept in src/components/ui/Field.tsx. */
export { Field, FieldError } from '~/components/ui/Field';

/** SI values shown and typed in a display unit (the plant forms' one conversion, kept in src/lib). */
export { readSI, showSI } from '~/lib/plant/site-settings-form';

/** An instant as 'yyyy-MM-dd HH:mm' in the site's time zone ('from the start' for the epoch). */
export function showInstant(iso: string | null | undefined, timeZone: string): string {
  if (!iso) return '';
  const d = new Date(iso);
  if (d.getTime() === 0) return 'from the start';
  return siteStamp(d, timeZone);
}

/** A 'yyyy-MM-ddTHH:mm' input read as wall time in the site's time zone, to an ISO instant. */
export function wallTimeToIso(local: string, timeZone: string): string | null {
  const ms = siteWallTime(local, timeZone);
  return ms === null ? null : new Date(ms).toISOString();
}

/** Now as a 'yyyy-MM-ddTHH:mm' wall time in the site's time zone. */
export function nowWallTime(timeZone: string): string {
  return siteNowWall(timeZone);
}

/** 'CH4=0.93, C2H6=0.04' to { CH4: 0.93, C2H6: 0.04 }; null when it does not read. */
export function parseComposition(text: string): Record<string, number> | null {
  const out: Record<string, number> = {};
  for (const part of text.split(/[,;\n]+/).map((p) => p.trim()).filter(Boolean)) {
    const m = /^([A-Za-z0-9]+)\s*[=:]\s*([0-9.eE+-]+)$/.exec(part);
    if (!m) return null;
    out[m[1]!] = Number(m[2]);
  }
  return Object.keys(out).length ? out : null;
}

export function showComposition(c: Record<string, number> | undefined): string {
  return c ? Object.entries(c).map(([k, v]) => `${k}=${v}`).join(', ') : '';
}

/** The caution of docs/domain.md section 8. */
export { Caution } from '../Caution';
