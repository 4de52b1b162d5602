import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';
import { defineConfig } from 'astro/config';

function allowedDomains() {
  const base = process.env.PUBLIC_BASE_URL;
  if (!base) return [];
  const u = new URL(base);
  return [{ hostname: u.hostname, protocol: u.protocol.replace(':', '') }];
}

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react(), tailwind({ applyBaseStyles: false })],
  server: { host: '127.0.0.1', port: 4321 },
  // Origins are checked at run time by src/server/guard.ts against PUBLIC_BASE_URL (a bearer-token
  // call is exempt); Astro's own check compares with the host it believes it has, which without
  // allowedDomains is "localhost". allowedDomains (from PUBLIC_BASE_URL at build time) lets Astro
  // build page URLs with the real host.
  security: { checkOrigin: false, allowedDomains: allowedDomains() },
  telemetry: false,
  vite: {
    ssr: { external: ['pg', 'pg-boss', 'nodemailer', '@aws-sdk/client-s3', '@aws-sdk/s3-request-presigner'] },
  },
} as Parameters<typeof defineConfig>[0]);
