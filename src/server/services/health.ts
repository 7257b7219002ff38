import { sql } from 'drizzle-orm';
import type { AppDeps } from '../app';

/** Whether the database answers a trivial query (the health endpoint reports it). */
export async function databaseReachable(deps: AppDeps): Promise<boolean> {
  return deps.db
    .execute(sql`select 1`)
    .then(() => true)
    .catch(() => false);
}
