/**
 * Where to go after signing in: only a path of this very site. Anything that a browser could read
 * as another host (//evil.example, /\evil.example, /%5Cevil.example, /%09/evil.example, an absolute
 * URL), or that carries a backslash or a control character at any level of %-decoding, gives '/'.
 */
export function safeNextPath(next: unknown): string {
  if (typeof next !== 'string' || next.length === 0 || next.length > 2000) return '/';
  let probe = next;
  for (let i = 0; i < 4; i++) {
    if (/[\\\u0000-\u001f\u007f]/.test(probe)) return '/';
    if (!probe.startsWith('/') || probe.startsWith('//')) return '/';
    let decoded: string;
    try {
      decoded = decodeURIComponent(probe);
    } catch {
      return '/';
    }
    if (decoded === probe) break;
    probe = decoded;
  }
  if (/[\\\u0000-\u001f\u007f]/.test(probe) || !probe.startsWith('/') || probe.startsWith('//')) return '/';
  const base = 'http://lossline.invalid';
  let url: URL;
  try {
    url = new URL(next, base);
  } catch {
    return '/';
  }
  if (url.origin !== base) return '/';
  return url.pathname + url.search + url.hash;
}
