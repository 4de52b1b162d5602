/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: { id: string; name: string; email: string; role: import('./lib/roles').Role } | null;
    session: { id: string; expiresAt: Date } | null;
    /** Set when the request came with a valid site API token instead of a session. */
    apiToken: { id: string; siteId: string; role: import('./lib/roles').Role } | null;
  }
}
