import { defineConfig } from 'drizzle-kit';
import { LOCAL_DATABASE_URL } from './src/lib/server/config';

export default defineConfig({
  dialect: 'mysql',
  schema: './db/schema/index.ts',
  out: './db/migrations',
  dbCredentials: {
    url: process.env.DATABASE_URL ?? LOCAL_DATABASE_URL,
  },
});
