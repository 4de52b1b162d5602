import { createHash } from 'node:crypto';

/** Headers on every answer, static files included (scripts/serve.ts sets them first). */
export const BASELINE_HEADERS: Record<string, string> = {
  'content-security-policy': "default-src 'self'; frame-ancestors 'none'; base-uri 'self'; form-action 'self'; object-src 'none'",
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'same-origin',
  'x-frame-options': 'DENY',
};

/** The hashes ('sha256-...') of a page's inline scripts, which the policy admits one by one. */
export function inlineScriptHashes(html: string): string[] {
  const out = new Set<string>();
  for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)) {
    if (/\bsrc\s*=/i.test(m[1]!)) continue;
    if (/type\s*=\s*["']?application\/(ld\+)?json/i.test(m[1]!)) continue;
    out.add(`'sha256-${createHash('sha256').update(m[2]!, 'utf8').digest('base64')}'`);
  }
  return [...out];
}

/**
 * The policy of an HTML page: scripts only from our origin plus the exact inline scripts Astro wrote
 * into this page (its island loader), never any other inline script; no framing; forms post home.
 * Inline style attributes stay allowed (chart libraries position with them); they cannot run code.
 * connectTo: other origins the page's scripts may call (the object store that uploads go to).
 */
export function pagePolicy(html: string, connectTo: readonly string[] = []): string {
  return [
    "default-src 'self'",
    `script-src 'self' ${inlineScriptHashes(html).join(' ')}`.trim(),
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    `connect-src 'self' ${connectTo.join(' ')}`.trim(),
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "object-src 'none'",
  ].join('; ');
}

/** Adds the headers to an answer of the app (API or page); pages get their own script policy. */
export async function withSecurityHeaders(res: Response, connectTo: readonly string[] = []): Promise<Response> {
  let out = res;
  const type = res.headers.get('content-type') ?? '';
  if (type.includes('text/html')) {
    const html = await res.text();
    const headers = new Headers(res.headers);
    headers.set('content-security-policy', pagePolicy(html, connectTo));
    out = new Response(html, { status: res.status, statusText: res.statusText, headers });
  }
  try {
    for (const [k, v] of Object.entries(BASELINE_HEADERS)) if (k !== 'content-security-policy' || !out.headers.has(k)) out.headers.set(k, v);
  } catch {
    // Immutable headers (a fetched Response): copy into a new one.
    const headers = new Headers(out.headers);
    for (const [k, v] of Object.entries(BASELINE_HEADERS)) if (k !== 'content-security-policy' || !headers.has(k)) headers.set(k, v);
    out = new Response(out.body, { status: out.status, statusText: out.statusText, headers });
  }
  return out;
}
