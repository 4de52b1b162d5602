import { useState } from 'react';
import { safeNextPath } from '../lib/safe-next';
import { postAuth } from './authMessages';

export default function SignInForm({ next, initialError = null }: { next: string; initialError?: string | null }) {
  const [error, setError] = useState<string | null>(initialError);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    const out = await postAuth('/sign-in/email', { email: form.get('email'), password: form.get('password') });
    setBusy(false);
    if (!out.ok) return setError(out.message);
    window.location.href = safeNextPath(next);
  }

  return (
    // method="post" to this page: a submit before the script has loaded still posts (never a GET).
    <form onSubmit={onSubmit} method="post" action="/sign-in" className="space-y-4" noValidate>
      <input type="hidden" name="next" value={next} />
      <div>
        <label className="label" htmlFor="email">E-mail</label>
        <input className="field" id="email" name="email" type="email" autoComplete="username" required />
      </div>
      <div>
        <label className="label" htmlFor="password">Password</label>
        <input className="field" id="password" name="password" type="password" autoComplete="current-password" required />
      </div>
      {error && <p role="alert" className="notice-error">{error}</p>}
      <button className="btn btn-primary w-full justify-center" disabled={busy} type="submit">
        {busy ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
