import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { createDb } from '../server/db';
import { env } from '../server/env';

/** Applies the committed migrations in drizzle/ (idempotent). */
const { db, pool } = createDb(env().DATABASE_URL);
await migrate(db, { migrationsFolder: new URL('../../drizzle', import.meta.url).pathname });
await pool.end();
console.log('migrations applied');
