import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';
import { defineConfig } from 'astro/config';

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react(), tailwind({ applyBaseStyles: false })],
  server: { host: '127.0.0.1', port: 4321 },
  security: { checkOrigin: true },
  telemetry: false,
  vite: {
    ssr: { external: ['pg', 'pg-boss', 'nodemailer', '@aws-sdk/client-s3', '@aws-sdk/s3-request-presigner'] },
  },
} as Parameters<typeof defineConfig>[0]);
