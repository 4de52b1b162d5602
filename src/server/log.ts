/**
 * Log lines never carry e-mail addresses, token secrets or token hashes: redact() masks them in any
 * text before it is printed (database errors quote the values they refused, stacks quote inputs).
 */
export function redact(text: string): string {
  return text
    .replace(/[A-Za-z0-9._%+-]+@[A-Za-z0-9.-]+\.[A-Za-z]{2,}/g, '<e-mail>')
    .replace(/\bllt_[A-Za-z0-9_-]+/g, '<token>')
    .replace(/\b[0-9a-f]{40,}\b/gi, '<hash>')
    .replace(/\b[A-Za-z0-9_-]{43}\b/g, (m) => (/[0-9]/.test(m) && /[A-Za-z]/.test(m) ? '<hash>' : m));
}
