/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: { id: string; name: string; email: string; role: import('./lib/roles').Role } | null;
    session: { id: string; expiresAt: Date } | null;
    /** Set when the request came with a valid site API token instead of a session. */
    apiToken: { id: string; siteId: string; role: import('./lib/roles').Role } | null;
    /** The sites the signed-in person may use: 'all', or a list (src/server/access.ts). */
    sites: import('./server/access').SiteScope;
    /** Why a page was refused (403): shown by src/pages/403.astro inside the app's frame. */
    denied?: string;
  }
}
