/** Sign-in refusals come in the API's one error shape, with better-auth's own fields kept for its client and the sign-in page. */
import { expect, it } from 'vitest';
import { authHandler } from '~/server/auth';
import { describeIntegration } from '../support/integration';

describeIntegration('sign-in errors', () => {
  it('answers a wrong password 401 with { error: { code: UNAUTHENTICATED, message, reason } } and keeps code and message beside it', async () => {
    const base = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';
    const email = `nobody-${crypto.randomUUID().slice(0, 8)}@example.test`;
    const res = await authHandler(
      new Request(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: base }, body: JSON.stringify({ email, password: 'not-the-password-1' }) }),
      '203.0.113.7',
    );
    expect(res.status).toBe(401);
    const body = await res.json();
    expect(body.error.code).toBe('UNAUTHENTICATED');
    expect(body.error.reason).toBe('INVALID_EMAIL_OR_PASSWORD');
    expect(body.error.message).toMatch(/do not match an account/);
    expect(body.code).toBe('INVALID_EMAIL_OR_PASSWORD');
    expect(typeof body.message).toBe('string');
  });
});
