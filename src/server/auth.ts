import { APIError, betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { eq } from 'drizzle-orm';
import { CLIENT_IP_HEADER } from './client-ip';
import { db } from './db/client';
import * as schema from './db/schema';
import { env } from './env';
import { escapeHtml, sendMail } from './mail';

/** Minimum password length; better-auth rejects shorter ones with PASSWORD_TOO_SHORT. */
export const MIN_PASSWORD_LENGTH = 10;
/** How long an invitation or reset link stays valid. */
export const RESET_LINK_SECONDS = 60 * 60 * 24 * 3;

function resetMail(kind: 'invite' | 'reset', to: string, name: string, url: string) {
  const intro =
    kind === 'invite'
      ? `You have been invited to Lossline, where your plant's hourly exergy balances are kept. Set your password to sign in:`
      : `Someone (hopefully you) asked to set a new Lossline password for this address. Choose one here:`;
  const subject = kind === 'invite' ? 'Your Lossline invitation' : 'Set a new Lossline password';
  const note = `The link works once and expires in ${RESET_LINK_SECONDS / 3600} hours. If you did not expect this e-mail, ignore it.`;
  return {
    to,
    subject,
    text: `Hello ${name},\n\n${intro}\n\n${url}\n\n${note}\n`,
    html: `<p>Hello ${escapeHtml(name)},</p><p>${intro}</p><p><a href="${escapeHtml(url)}">${escapeHtml(url)}</a></p><p>${note}</p>`,
  };
}

function createAuth() {
  const e = env();
  return betterAuth({
    appName: 'Lossline',
    baseURL: e.PUBLIC_BASE_URL,
    secret: e.BETTER_AUTH_SECRET,
    telemetry: { enabled: false },
    database: drizzleAdapter(db(), {
      provider: 'pg',
      schema: { ...schema, rateLimit: schema.rateLimit },
    }),
    user: {
      additionalFields: {
        role: { type: 'string', required: false, defaultValue: 'operator', input: false },
        deactivated: { type: 'boolean', required: false, defaultValue: false, input: false },
      },
    },
    emailAndPassword: {
      enabled: true,
      disableSignUp: true,
      minPasswordLength: MIN_PASSWORD_LENGTH,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: RESET_LINK_SECONDS,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, url }) => {
        // An account that has never set a password gets the invitation wording.
        const [invite] = await db()
          .select()
          .from(schema.invitations)
          .where(eq(schema.invitations.userId, user.id))
          .limit(1);
        const kind = invite && !invite.acceptedAt ? 'invite' : 'reset';
        await sendMail(resetMail(kind, user.email, user.name, url));
      },
      onPasswordReset: async ({ user }) => {
        await db()
          .update(schema.invitations)
          .set({ acceptedAt: new Date() })
          .where(eq(schema.invitations.userId, user.id));
      },
    },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: 60,
      max: 300,
      customRules: {
        '/sign-in/email': { window: 60, max: e.SIGN_IN_LIMIT_PER_MINUTE },
        '/request-password-reset': { window: 60, max: 5 },
      },
    },
    advanced: {
      ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
    },
    databaseHooks: {
      session: {
        create: {
          before: async (s) => {
            const [u] = await db().select().from(schema.user).where(eq(schema.user.id, s.userId)).limit(1);
            if (u?.deactivated) {
              throw new APIError('FORBIDDEN', {
                code: 'ACCOUNT_DEACTIVATED',
                message: 'This account has been deactivated. Ask a Lossline admin to reactivate it.',
              });
            }
          },
        },
      },
    },
  });
}

let instance: ReturnType<typeof createAuth> | undefined;

/** The better-auth instance (created on first use, so env is read at run time, not at build time). */
export function auth() {
  instance ??= createAuth();
  return instance;
}
