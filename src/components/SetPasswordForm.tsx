import { useState } from 'react';
import { authMessage, postAuth } from './authMessages';

export default function SetPasswordForm({ token, linkError }: { token: string | null; linkError: string | null }) {
  const [error, setError] = useState<string | null>(linkError ? authMessage(linkError, 400) : null);
  const [done, setDone] = useState(false);

  if (!token) {
    return (
      <p role="alert" className="notice-error">
        {error ?? 'This page needs the link from your e-mail.'} <a href="/forgot-password">Ask for a new link</a>.
      </p>
    );
  }
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const password = String(form.get('password') ?? '');
    if (password !== String(form.get('confirm') ?? '')) return setError('The two passwords differ.');
    const out = await postAuth('/reset-password', { token, newPassword: password });
    if (!out.ok) return setError(out.message);
    setDone(true);
  }
  if (done) {
    return (
      <p role="status" className="notice-ok">
        Your password is set. <a href="/sign-in">Sign in</a>.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} method="post" className="space-y-4">
      <div>
        <label className="label" htmlFor="password">New password (at least 10 characters)</label>
        <input className="field" id="password" name="password" type="password" autoComplete="new-password" required />
      </div>
      <div>
        <label className="label" htmlFor="confirm">The same again</label>
        <input className="field" id="confirm" name="confirm" type="password" autoComplete="new-password" required />
      </div>
      {error && <p role="alert" className="notice-error">{error}</p>}
      <button className="btn btn-primary" type="submit">Set password</button>
    </form>
  );
}
