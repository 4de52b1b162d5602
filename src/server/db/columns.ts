/**
 * Columns many tables share, declared once: a row's own id, and the site or unit a row belongs to
 * (removed with it). Each call makes a new column builder; chain more on it where a table needs it
 * (`siteIdColumn().primaryKey()` for a table of one row per site).
 *
 * Function declarations on purpose: the schema files import each other (sites <-> tags), and a
 * declaration is callable while its module is still being evaluated in such a cycle. The referenced
 * tables are read only when Drizzle resolves the foreign key, after every schema module has loaded.
 */
import { sql } from 'drizzle-orm';
import { uuid } from 'drizzle-orm/pg-core';
import { plantUnits, sites } from './plant-schema';

/** A row's own id: a UUID PostgreSQL draws. */
export function idColumn() {
  return uuid('id').primaryKey().default(sql`gen_random_uuid()`);
}

/** The site the row belongs to (site_id), removed with its site. */
export function siteIdColumn() {
  return uuid('site_id')
    .notNull()
    .references(() => sites.id, { onDelete: 'cascade' });
}

/** The unit the row belongs to (unit_id), removed with its unit. */
export function unitIdColumn() {
  return uuid('unit_id')
    .notNull()
    .references(() => plantUnits.id, { onDelete: 'cascade' });
}
