import type { APIRoute } from 'astro';
import { healthOutput } from '~/lib/api/service-schemas';
import { app } from '~/server/app';
import { answer } from '~/server/http/api';
import { storage, storageReachable } from '~/server/storage';
import { databaseReachable } from '~/server/services/health';

/** Reports whether the database and the object store answer; 503 when either does not. */
export const GET: APIRoute = async () => {
  const database = await databaseReachable(app());
  const { s3, bucket } = storage();
  const store = await storageReachable(s3, bucket);
  const ok = database && store;
  return answer(healthOutput, { ok, database: database ? 'up' : 'down', storage: store ? 'up' : 'down' }, ok ? 200 : 503);
};
