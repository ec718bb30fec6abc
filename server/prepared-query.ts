import { createHash } from 'node:crypto';
import type { Pool, QueryResultRow } from 'pg';
import type { DataSource } from 'typeorm';

/** The pg Pool under the app's DataSource (TypeORM keeps it as the driver's `master`). */
export function poolOf(ds: DataSource): Pool {
  return (ds.driver as unknown as { master: Pool }).master;
}

const names = new Map<string, string>();

/**
 * A stable name per SQL text: each pooled connection parses (and PostgreSQL plans) a named
 * statement once, then only binds and executes it. Texts must come from a finite set (values
 * go in parameters), since every connection keeps every statement it prepared.
 */
export function statementName(text: string): string {
  let name = names.get(text);
  if (!name) {
    name = `bw_${createHash('sha1').update(text).digest('hex').slice(0, 24)}`;
    names.set(text, name);
  }
  return name;
}

/**
 * A read of a hot path as a named prepared statement on a pooled connection, without TypeORM's
 * query building and result mapping. Rows come back as pg gives them (snake_case columns,
 * bigint as string, timestamptz as Date).
 */
export async function preparedQuery<R extends QueryResultRow>(ds: DataSource, text: string, values: unknown[]): Promise<R[]> {
  return (await poolOf(ds).query<R>({ name: statementName(text), text, values })).rows;
}
