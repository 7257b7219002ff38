import { defineConfig } from 'drizzle-kit';
import { settings } from './src/server/env';

// drizzle-kit only needs the URL for introspection commands; `generate` works without a database.
export default defineConfig({
  dialect: 'postgresql',
  schema: './src/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
  // generate needs no database; commands that do read DATABASE_URL (npm scripts set it).
  dbCredentials: { url: settings().DATABASE_URL ?? 'postgres://roundmark@127.0.0.1/roundmark' },
});
