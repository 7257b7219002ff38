import type { APIRoute } from 'astro';
import { sql } from 'drizzle-orm';
import { app } from '~/server/app';
import { json } from '~/server/http/api';
import { storage, storageReachable } from '~/server/storage';

/** Reports whether the database and the object store answer; 503 when either does not. */
export const GET: APIRoute = async () => {
  const database = await app()
    .db.execute(sql`select 1`)
    .then(() => true)
    .catch(() => false);
  const { s3, bucket } = storage();
  const store = await storageReachable(s3, bucket);
  const ok = database && store;
  return json({ ok, database: database ? 'up' : 'down', storage: store ? 'up' : 'down' }, ok ? 200 : 503);
};
