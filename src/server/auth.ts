import { APIError, betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { createAuthMiddleware } from 'better-auth/api';
import { createAccessControl } from 'better-auth/plugins/access';
import { admin } from 'better-auth/plugins/admin';
import { defaultStatements } from 'better-auth/plugins/admin/access';
import { and, eq, lt, ne, sql } from 'drizzle-orm';
import { QUEUES, sendJob } from '../jobs';
import { passwordProblem } from './password-strength';
import { CLIENT_IP_HEADER } from './client-ip';
import { db } from './db/client';
import * as schema from './db/schema';
import { env, type AppEnv } from './env';
import { invitationWords, passwordMail } from './invitation-mail';
import { queue } from './queue';
import { sha256Hex } from '~/lib/engine/hash';
import type { Role } from '~/lib/roles';
import { authMessage } from '~/lib/auth-words';
import type { ErrorCode } from './errors';

/** Minimum password length; better-auth rejects shorter ones with PASSWORD_TOO_SHORT. */
export const MIN_PASSWORD_LENGTH = 10;
/** How long an invitation or reset link stays valid. */
export const RESET_LINK_SECONDS = 60 * 60 * 24 * 3;
/** Longest display name a person may have (the people page and every header show it). */
export const MAX_NAME_LENGTH = 120;

/**
 * Per-account sign-in pauses: the first FREE_FAILURES wrong passwords cost nothing; each further one
 * pauses sign-in to that account for PAUSE_FIRST_SECONDS, doubling up to PAUSE_MAX_SECONDS. The cap
 * keeps an attacker from locking a person out for long (and a password reset by e-mail, which is
 * never paused, clears the count). Failures older than FAILURE_MEMORY_SECONDS are forgotten.
 */
export const SIGN_IN_PAUSE = { FREE_FAILURES: 5, PAUSE_FIRST_SECONDS: 15, PAUSE_MAX_SECONDS: 300, FAILURE_MEMORY_SECONDS: 24 * 3600 } as const;

/** The pause after the n-th consecutive failure, in seconds (0 while still free). */
export function pauseAfterFailure(n: number): number {
  if (n < SIGN_IN_PAUSE.FREE_FAILURES) return 0;
  return Math.min(SIGN_IN_PAUSE.PAUSE_FIRST_SECONDS * 2 ** (n - SIGN_IN_PAUSE.FREE_FAILURES), SIGN_IN_PAUSE.PAUSE_MAX_SECONDS);
}

/**
 * A request for a password link answers after at least this long whether or not the address has an
 * account (the mail itself goes out from the queue), so the answer's timing tells nothing.
 */
export const RESET_REQUEST_FLOOR_MS = 400;

/** How reset and invitation tokens are stored: SHA-256 of the identifier, never the token itself. */
export function hashIdentifier(identifier: string): string {
  return sha256Hex(identifier);
}

/** The answer to a deactivated person's sign-in (code ACCOUNT_DEACTIVATED, 403). */
export const DEACTIVATED_MESSAGE = 'This account has been deactivated. Ask a Lossline admin to reactivate it.';

const ac = createAccessControl(defaultStatements);

/**
 * What each role may do through better-auth's admin plugin: admins deactivate and reactivate people
 * (the plugin's ban, which also ends their sessions) and end sessions; nothing else of the plugin is
 * granted (no impersonation, no accounts made or removed around the invitations).
 */
const PLUGIN_ROLES = {
  admin: ac.newRole({ user: ['ban', 'get'], session: ['revoke'] }),
  'energy-lead': ac.newRole({}),
  operator: ac.newRole({}),
  planner: ac.newRole({}),
} satisfies Record<Role, unknown>;

/**
 * The admin plugin's HTTP routes are closed: people are managed through /api/admin/users, whose rules
 * (the last active admin, no self-deactivation, invitations, sites) the plugin does not know. The
 * service calls the plugin's endpoints on the server with the acting admin's session.
 */
const ADMIN_PLUGIN_PATHS = [
  '/admin/set-role',
  '/admin/get-user',
  '/admin/create-user',
  '/admin/update-user',
  '/admin/list-users',
  '/admin/list-user-sessions',
  '/admin/unban-user',
  '/admin/ban-user',
  '/admin/impersonate-user',
  '/admin/stop-impersonating',
  '/admin/revoke-user-session',
  '/admin/revoke-user-sessions',
  '/admin/remove-user',
  '/admin/set-user-password',
  '/admin/has-permission',
];

/** Ends every outstanding reset or invitation link of a person (their value is the user id). */
async function endLinksOf(userId: string): Promise<void> {
  await db().delete(schema.verification).where(eq(schema.verification.value, userId));
}

function weakPassword(password: unknown): void {
  if (typeof password !== 'string' || password.length < MIN_PASSWORD_LENGTH) return; // better-auth says "too short"
  const problem = passwordProblem(password);
  if (problem) throw new APIError('BAD_REQUEST', { code: 'PASSWORD_TOO_WEAK', message: problem });
}

function checkName(name: unknown): void {
  if (typeof name !== 'string') return;
  if (name.length > MAX_NAME_LENGTH || /[\u0000-\u001f\u007f]/.test(name)) {
    throw new APIError('BAD_REQUEST', { code: 'INVALID_NAME', message: `A name has at most ${MAX_NAME_LENGTH} characters and no control characters.` });
  }
}

/** Sends a reset link, or the invitation for an account that never set a password, from the queue. */
async function sendPasswordLink({ user, url }: { user: { id: string; email: string; name: string }; url: string }): Promise<void> {
  // An account that has never set a password gets the invitation wording: who invited, to which role and sites.
  const mail = passwordMail(await invitationWords(user.id), user.email, user.name, url, RESET_LINK_SECONDS / 3600);
  // From the queue (the worker sends it): the answer does not wait for the mail server.
  await sendJob(await queue(), QUEUES.sendMail, mail, { retryLimit: 5, retryDelay: 30 });
}

/** After a reset: the invitation counts as accepted, other links end, and the sign-in failures are forgotten. */
async function afterPasswordReset({ user }: { user: { id: string; email: string } }): Promise<void> {
  await db()
    .update(schema.invitations)
    .set({ acceptedAt: new Date() })
    .where(eq(schema.invitations.userId, user.id));
  await endLinksOf(user.id);
  await db().delete(schema.signInFailures).where(eq(schema.signInFailures.email, user.email.toLowerCase()));
}

/** Before a password change or reset: refuse a weak password; a change always ends every other session. */
const beforeAuthRequest = createAuthMiddleware(async (ctx) => {
  if (ctx.path === '/reset-password' || ctx.path === '/change-password') weakPassword(ctx.body?.newPassword);
  if (ctx.path === '/change-password') {
    // A changed password ends every other session, always.
    return { context: { body: { ...ctx.body, revokeOtherSessions: true } } };
  }
});

/** After a request: a deactivated person's refusal keeps Lossline's code; a changed password ends the person's links. */
const afterAuthRequest = createAuthMiddleware(async (ctx) => {
  const returned = ctx.context.returned;
  if (returned instanceof APIError && (returned.body as { code?: string } | undefined)?.code === 'BANNED_USER') {
    // The plugin refuses a deactivated person's new session; the answer keeps Lossline's code.
    throw new APIError('FORBIDDEN', { code: 'ACCOUNT_DEACTIVATED', message: DEACTIVATED_MESSAGE });
  }
  if (ctx.path !== '/change-password') return;
  const userId = ctx.context.session?.user.id ?? ctx.context.newSession?.user.id;
  const ok = !(ctx.context.returned instanceof Error);
  if (userId && ok) await endLinksOf(userId);
});

/** Requests per minute per address, kept in the database; sign-in and link requests have their own limits. */
function rateLimitOf(e: AppEnv) {
  return {
    enabled: true,
    storage: 'database' as const,
    window: 60,
    max: 300,
    customRules: {
      '/sign-in/email': { window: 60, max: e.SIGN_IN_LIMIT_PER_MINUTE },
      '/request-password-reset': { window: 60, max: 5 },
    },
  };
}

/** Passwords: invitation only (no sign-up), length limits, links valid RESET_LINK_SECONDS, sessions ended by a reset. */
const EMAIL_AND_PASSWORD = {
  enabled: true,
  disableSignUp: true,
  minPasswordLength: MIN_PASSWORD_LENGTH,
  maxPasswordLength: 128,
  resetPasswordTokenExpiresIn: RESET_LINK_SECONDS,
  revokeSessionsOnPasswordReset: true,
  sendResetPassword: sendPasswordLink,
  onPasswordReset: afterPasswordReset,
};

export function createAuth(e: AppEnv = env()) {
  const base = new URL(e.PUBLIC_BASE_URL);
  return betterAuth({
    appName: 'Lossline',
    baseURL: e.PUBLIC_BASE_URL,
    trustedOrigins: [base.origin],
    secret: e.BETTER_AUTH_SECRET,
    telemetry: { enabled: false },
    database: drizzleAdapter(db(), {
      provider: 'pg',
      schema: { ...schema, rateLimit: schema.rateLimit },
    }),
    // Accounts come by invitation only; people do not rename, re-address or delete themselves here.
    disabledPaths: ['/sign-up/email', '/update-user', '/change-email', '/delete-user', ...ADMIN_PLUGIN_PATHS],
    plugins: [
      admin({
        roles: PLUGIN_ROLES,
        adminRoles: ['admin'],
        defaultRole: 'operator',
        bannedUserMessage: DEACTIVATED_MESSAGE,
        // The plugin's "banned" is Lossline's "deactivated" (the column and the API keep that word).
        schema: { user: { fields: { banned: 'deactivated' } } },
      }),
    ],
    user: {
      additionalFields: {
        allSites: { type: 'boolean', required: false, defaultValue: true, input: false },
      },
    },
    verification: { storeIdentifier: { hash: async (id: string) => hashIdentifier(id) } },
    emailAndPassword: EMAIL_AND_PASSWORD,
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    rateLimit: rateLimitOf(e),
    advanced: {
      ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
      useSecureCookies: base.protocol === 'https:',
    },
    hooks: { before: beforeAuthRequest, after: afterAuthRequest },
    databaseHooks: {
      user: {
        create: { before: async (u) => void checkName(u.name) },
        update: { before: async (u) => void checkName(u.name) },
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

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function pausedAnswer(seconds: number): Response {
  return Response.json(
    {
      code: 'SIGN_IN_PAUSED',
      message: `Too many wrong passwords for this account. Try again in ${seconds} seconds, or set a new password by e-mail.`,
    },
    { status: 429, headers: { 'retry-after': String(seconds) } },
  );
}

/** The pause still running for an account, in whole seconds, or 0. */
export async function signInPauseLeft(email: string): Promise<number> {
  const [row] = await db().select().from(schema.signInFailures).where(eq(schema.signInFailures.email, email)).limit(1);
  if (!row?.pausedUntil) return 0;
  const left = Math.ceil((row.pausedUntil.getTime() - Date.now()) / 1000);
  return left > 0 ? left : 0;
}

async function recordFailure(email: string): Promise<void> {
  const forget = new Date(Date.now() - SIGN_IN_PAUSE.FAILURE_MEMORY_SECONDS * 1000);
  const [row] = await db()
    .insert(schema.signInFailures)
    .values({ email, failures: 1, lastFailureAt: new Date() })
    .onConflictDoUpdate({
      target: schema.signInFailures.email,
      set: {
        failures: sql`case when ${schema.signInFailures.lastFailureAt} < ${forget} then 1 else ${schema.signInFailures.failures} + 1 end`,
        lastFailureAt: new Date(),
      },
    })
    .returning({ failures: schema.signInFailures.failures });
  const pause = pauseAfterFailure(row!.failures);
  if (pause > 0) {
    await db()
      .update(schema.signInFailures)
      .set({ pausedUntil: new Date(Date.now() + pause * 1000) })
      .where(eq(schema.signInFailures.email, email));
  }
  // Now and then, forget failures nobody has repeated for a day.
  if (Math.random() < 0.01) await db().delete(schema.signInFailures).where(and(lt(schema.signInFailures.lastFailureAt, forget), ne(schema.signInFailures.email, email)));
}

/** The API's codes for a sign-in refusal by its status (better-auth's own code stays in `reason`). */
const SIGN_IN_CODES: Record<number, ErrorCode> = { 400: 'VALIDATION_FAILED', 401: 'UNAUTHENTICATED', 403: 'FORBIDDEN', 422: 'UNPROCESSABLE', 429: 'RATE_LIMITED' };

/**
 * A refused sign-in in the API's one error shape, { error: { code, message, reason } } (reason:
 * better-auth's code, e.g. INVALID_EMAIL_OR_PASSWORD), keeping better-auth's top-level code and
 * message beside it for its own client and the sign-in page.
 */
export async function signInErrorShape(res: Response): Promise<Response> {
  if (res.ok || !(res.headers.get('content-type') ?? '').includes('json')) return res;
  const body = (await res.clone().json().catch(() => null)) as { code?: unknown; message?: unknown } | null;
  if (!body || typeof body !== 'object') return res;
  const reason = typeof body.code === 'string' ? body.code : undefined;
  const code = SIGN_IN_CODES[res.status] ?? (res.status >= 500 ? 'INTERNAL' : 'VALIDATION_FAILED');
  const message = authMessage(reason, res.status, typeof body.message === 'string' ? body.message : undefined);
  const headers = new Headers(res.headers);
  headers.delete('content-length');
  return new Response(JSON.stringify({ ...body, error: { code, message, ...(reason ? { reason } : {}) } }), { status: res.status, headers });
}

/**
 * better-auth's HTTP handler behind Lossline's own rules: the client address set from the
 * connection (never from a header the client sent), the per-account pause on sign-in, and the
 * fixed floor on password-link requests.
 */
export async function authHandler(request: Request, clientAddress: string): Promise<Response> {
  const started = Date.now();
  const headers = new Headers(request.headers);
  headers.set(CLIENT_IP_HEADER, clientAddress);
  const method = request.method;
  const path = new URL(request.url).pathname.replace(/\/+$/, '');
  let body: string | undefined;
  if (method !== 'GET' && method !== 'HEAD') body = await request.text();
  const forward = () => auth().handler(new Request(request.url, { method, headers, body }));

  if (method === 'POST' && path.endsWith('/api/auth/sign-in/email')) {
    let email = '';
    try {
      email = String((JSON.parse(body ?? '{}') as { email?: unknown }).email ?? '').trim().toLowerCase();
    } catch {
      // better-auth answers a malformed body itself
    }
    if (email) {
      const left = await signInPauseLeft(email);
      if (left > 0) return signInErrorShape(pausedAnswer(left));
    }
    const res = await forward();
    if (email && res.status === 401) await recordFailure(email);
    else if (email && res.status === 200) await db().delete(schema.signInFailures).where(eq(schema.signInFailures.email, email));
    return signInErrorShape(res);
  }
  if (method === 'POST' && path.endsWith('/api/auth/request-password-reset')) {
    const res = await forward();
    const wait = RESET_REQUEST_FLOOR_MS - (Date.now() - started);
    if (wait > 0) await sleep(wait);
    return res;
  }
  return forward();
}
