/** Shared by the sign-in pages (src/components/authMessages.ts) and the sign-in error answers (src/server/auth.ts). */
/** Plain-language messages for better-auth's error codes, in Lossline's own words. */
export function authMessage(code: string | undefined, status: number, serverMessage?: string): string {
  switch (code) {
    case 'PASSWORD_TOO_WEAK':
    case 'SIGN_IN_PAUSED':
    case 'INVALID_NAME':
      if (serverMessage) return serverMessage;
      break;
    case 'INVALID_EMAIL_OR_PASSWORD':
    case 'INVALID_PASSWORD':
    case 'USER_NOT_FOUND':
    case 'CREDENTIAL_ACCOUNT_NOT_FOUND':
      return 'That e-mail and password do not match an account. Check both, or set a new password below.';
    case 'PASSWORD_TOO_SHORT':
      return 'That password is too short: use at least 10 characters.';
    case 'PASSWORD_TOO_LONG':
      return 'That password is too long: use at most 128 characters.';
    case 'INVALID_TOKEN':
      return 'This link has expired or was already used. Ask for a new one below.';
    case 'ACCOUNT_DEACTIVATED':
      return 'This account has been deactivated. Ask a Lossline admin to reactivate it.';
    case 'INVALID_EMAIL':
      return 'That does not look like an e-mail address.';
  }
  if (status === 429) return 'Too many attempts in a short time. Wait a minute, then try again.';
  return 'Something went wrong on our side. Try again in a moment.';
}
