import { expect, it } from 'vitest';
import { redact } from '~/server/log';

it('masks e-mail addresses, token secrets and token hashes in log text, and leaves ordinary words', () => {
  const hash = 'a3f1'.repeat(16); // a SHA-256 in hex, as api_tokens.token_hash holds it
  const line = `duplicate key value (email)=(ines.invitee+x@example.test) token_hash=${hash} Bearer llt_Zm9vYmFyYmF6cXV4MTIz at /api/sites`;
  const out = redact(line);
  expect(out).not.toContain('ines.invitee');
  expect(out).not.toContain(hash);
  expect(out).not.toContain('llt_Zm9v');
  expect(out).toContain('duplicate key value');
  expect(out).toContain('/api/sites');
});
