import { describe } from 'vitest';

/**
 * Integration tests need the services that docker-free-start.sh test starts. Outside it, they are
 * reported as a failure (not skipped): run the README's test command.
 */
export function requireServices(): void {
  if (!process.env.DATABASE_URL || !process.env.BETTER_AUTH_SECRET) {
    throw new Error('Integration tests need PostgreSQL and the fakes: run ./docker-free-start.sh test');
  }
}

export const describeIntegration = (name: string, fn: () => void) =>
  describe(name, () => {
    requireServices();
    fn();
  });

/** The mail catcher's messages, newest first. */
export async function caughtMail(): Promise<{ id: string; to: string[]; subject: string; text: string; html: string | null }[]> {
  const res = await fetch(`${process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1080'}/api/messages`);
  return res.json();
}

export async function waitForMail(to: string, subjectPart: string, timeoutMs = 10_000) {
  const t0 = Date.now();
  while (Date.now() - t0 < timeoutMs) {
    const hit = (await caughtMail()).find((m) => m.to.includes(to) && m.subject.includes(subjectPart));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`No mail to ${to} with subject containing "${subjectPart}" arrived within ${timeoutMs} ms`);
}

let ipCounter = 0;
/** A distinct client address per call, so better-auth's per-IP rate limit does not mix tests. */
export function freshIp(): string {
  ipCounter += 1;
  return `10.${(process.pid >> 8) & 255}.${process.pid & 255}.${ipCounter % 250}`;
}
