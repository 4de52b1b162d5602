import { index, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { user } from './auth-schema';
import { idColumn, siteIdColumn } from './columns';

export * from './auth-schema';
export * from './plant-schema';
export * from './ingest-schema';
export * from './results-schema';
export * from './insight-schema';
export * from './unit-rules-schema';

/** Invitations sent by admins; the link itself is a better-auth password-reset token. */
export const invitations = pgTable(
  'invitations',
  {
    id: idColumn(),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    invitedBy: text('invited_by').references(() => user.id, { onDelete: 'set null' }),
    sentAt: timestamp('sent_at', { withTimezone: true }).notNull().defaultNow(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
  },
  (t) => [index('invitations_user_idx').on(t.userId)],
);

/**
 * Site API tokens for scheduled exports and model imports, stored as SHA-256 of the secret (shown
 * once). role is what the token acts as: 'operator' (upload files) or 'admin' (also import the model).
 */
export const apiTokens = pgTable(
  'api_tokens',
  {
    id: idColumn(),
    siteId: siteIdColumn(),
    name: text('name').notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    prefix: text('prefix').notNull(),
    role: text('role').notNull().default('operator'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [index('api_tokens_site_idx').on(t.siteId)],
);

/**
 * The sites a person who is not an admin may see and work on, when their account is not on every
 * site (user.all_sites = false). Admins always have every site; a site API token has its own site.
 */
export const personSites = pgTable(
  'person_sites',
  {
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    siteId: siteIdColumn(),
    grantedAt: timestamp('granted_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.siteId] }), index('person_sites_site_idx').on(t.siteId)],
);
