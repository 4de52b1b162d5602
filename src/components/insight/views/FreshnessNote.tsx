/** "Latest data: 11 months ago (hour … in the site's clock)" when a site's figures are older than a day. */
import type { Freshness } from '~/lib/views/freshness';

export default function FreshnessNote({ freshness, always = false }: { freshness: Freshness; always?: boolean }) {
  if (!freshness.stale && !always) return null;
  return (
    <p className={`mb-3 rounded border px-3 py-1.5 text-sm ${freshness.stale ? 'border-amber/60 bg-paper-deep' : 'border-paper-edge'}`} role="note" data-testid="freshness">
      {freshness.stale && <span className="font-semibold">Not current. </span>}
      {freshness.text}
    </p>
  );
}
