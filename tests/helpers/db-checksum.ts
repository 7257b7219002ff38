import type { Pool } from 'pg';

/**
 * Tables a refused request may still write: sign-in sessions and the rate limiter's counters
 * (a refused sign-in must count against the limit). Everything else in the public schema is ours.
 */
const MAY_CHANGE_ON_REFUSAL = ['sessions', 'rate_limits'];

/**
 * One md5 per table of an ordered text dump of its rows (PostgreSQL's row-to-text cast, sorted),
 * so two calls return the same map exactly when no row of those tables was added, removed or
 * changed in between. Cheap on a test database (a few ms for thousands of rows).
 */
export async function tableChecksums(pool: Pool): Promise<Map<string, string>> {
  const { rows: tables } = await pool.query<{ name: string }>(
    `select table_name as name from information_schema.tables
      where table_schema = 'public' and table_type = 'BASE TABLE' and not (table_name = any($1)) order by 1`,
    [MAY_CHANGE_ON_REFUSAL],
  );
  const sql = tables
    .map(({ name }) => `select ${quoteLiteral(name)} as t, md5(coalesce(string_agg(x::text, '|' order by x::text), '')) as h from public.${quoteIdent(name)} x`)
    .join(' union all ');
  const { rows } = await pool.query<{ t: string; h: string }>(sql);
  return new Map(rows.map((r) => [r.t, r.h]));
}

/** The tables whose checksum differs between two snapshots. */
export function changedTables(before: Map<string, string>, after: Map<string, string>): string[] {
  const names = new Set([...before.keys(), ...after.keys()]);
  return [...names].filter((n) => before.get(n) !== after.get(n)).sort();
}

const quoteIdent = (s: string) => `"${s.replaceAll('"', '""')}"`;
const quoteLiteral = (s: string) => `'${s.replaceAll("'", "''")}'`;
