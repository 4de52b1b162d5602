import { useState } from 'react';
import { postAuth } from './authMessages';

export default function ForgotPasswordForm() {
  const [state, setState] = useState<{ kind: 'idle' | 'sent' | 'error'; message?: string }>({ kind: 'idle' });
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const email = new FormData(e.currentTarget).get('email');
    const out = await postAuth('/request-password-reset', { email, redirectTo: '/set-password' });
    setState(out.ok ? { kind: 'sent' } : { kind: 'error', message: out.message });
  }
  if (state.kind === 'sent') {
    return (
      <p role="status" className="notice-ok">
        If an account uses that address, a link to set a new password is on its way. It expires in 72 hours.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} method="post" className="space-y-4">
      <div>
        <label className="label" htmlFor="email">E-mail</label>
        <input className="field" id="email" name="email" type="email" required />
      </div>
      {state.kind === 'error' && <p role="alert" className="notice-error">{state.message}</p>}
      <button className="btn btn-primary" type="submit">Send the link</button>
    </form>
  );
}
