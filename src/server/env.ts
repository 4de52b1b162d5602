import { z } from 'zod';
import { parseTrustProxy } from './client-ip';

/**
 * The one place that reads process.env. Parsed once at boot by the web server and the worker alike;
 * a missing or malformed variable stops start-up with a message that names it and says how to fix it.
 * Defaults are loopback values for the local fakes (see .env.example and docker-free-start.sh).
 */
const Env = z.object({
  DATABASE_URL: z.string().url().default('postgres://postgres@127.0.0.1:54329/lossline'),
  PUBLIC_BASE_URL: z.string().url().default('http://127.0.0.1:4321'),
  BETTER_AUTH_SECRET: z
    .string()
    .min(32, 'BETTER_AUTH_SECRET must be at least 32 characters: run ./docker-free-start.sh once, which writes one to .data/session-secret, or set it yourself (openssl rand -hex 32).'),
  S3_ENDPOINT: z.string().url().default('http://127.0.0.1:4569'),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('lossline-raw'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  SMTP_URL: z.string().default('smtp://127.0.0.1:1025'),
  MAIL_FROM: z.string().default('Lossline <lossline@localhost>'),
  MAIL_INBOX_URL: z.string().default('http://127.0.0.1:1080'),
  SIGN_IN_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(5),
  /** Requests a minute to /api/v1 per API token and per signed-in person (each web process counts its own); 0: no limit. */
  API_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().min(0).default(6000),
  /** The reverse proxy's address(es): only it may tell us a client's address (X-Forwarded-For). */
  TRUST_PROXY: z
    .string()
    .default('')
    .superRefine((v, ctx) => {
      if (v === 'true' || v === 'false') {
        ctx.addIssue({ code: 'custom', message: 'TRUST_PROXY takes the address of the proxy in front of Lossline (e.g. 127.0.0.1), not true/false; leave it empty when there is no proxy.' });
        return;
      }
      try {
        parseTrustProxy(v);
      } catch (err) {
        ctx.addIssue({ code: 'custom', message: (err as Error).message });
      }
    }),
});

export type AppEnv = z.infer<typeof Env>;

let cached: AppEnv | undefined;

export function env(): AppEnv {
  if (cached) return cached;
  const parsed = Env.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Lossline cannot start: the environment is not valid.\n${lines.join('\n')}`);
  }
  cached = parsed.data;
  return cached;
}
