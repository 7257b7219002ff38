import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from '../db/schema';

export type Db = ReturnType<typeof createDb>['db'];

/** Builds a pool and a Drizzle client for one database URL (tests pass their own). */
export function createDb(url: string) {
  const pool = new pg.Pool({ connectionString: url, max: 10 });
  const db = drizzle(pool, { schema, casing: 'snake_case' });
  return { pool, db };
}

/** A transaction handed out by `db.transaction`; reads that must see one snapshot take either. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;
