import { getTableColumns, sql, type SQL } from 'drizzle-orm';
import type { PgTable } from 'drizzle-orm/pg-core';

/**
 * The `set` of an insert ... on conflict do update that replaces the named columns with the values
 * of the row that was to be inserted (`excluded.<column>`).
 */
export function replacedByExcluded<T extends PgTable, K extends keyof T['_']['columns'] & string>(table: T, keys: readonly K[]): Record<K, SQL> {
  const columns = getTableColumns(table) as Record<string, { name: string }>;
  return Object.fromEntries(keys.map((k) => [k, sql`excluded.${sql.identifier(columns[k]!.name)}`])) as Record<K, SQL>;
}
