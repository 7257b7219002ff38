import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from '../db/schema';

export type Db = ReturnType<typeof createDb>['db'];

/** Builds a pool and a Drizzle client for one database URL (tests pass their own). */
export function createDb(url: string) {
  // A bounded wait for a connection, so a request during a database outage fails within seconds
  // (and answers 503) instead of hanging; pg's default is to wait forever.
  const pool = new pg.Pool({ connectionString: url, max: 10, connectionTimeoutMillis: 5_000 });
  // An idle connection the server closed (a restart) is dropped by the pool and replaced on the
  // next query; without a listener node-postgres re-throws the event and the process ends.
  pool.on('error', (err) => console.error(`database connection lost: ${err.message}`));
  // The pool listens only to idle connections: one checked out (a transaction between two
  // statements) that the server drops would emit an unheard 'error' and end the process. With this
  // listener the next statement fails instead (answered 503) and the pool drops the connection on release.
  pool.on('connect', (client) => client.on('error', (err) => console.error(`database connection lost while in use: ${err.message}`)));
  const db = drizzle(pool, { schema, casing: 'snake_case' });
  return { pool, db };
}

/** A transaction handed out by `db.transaction`; reads that must see one snapshot take either. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;
