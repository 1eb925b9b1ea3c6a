import { defineConfig } from 'drizzle-kit';

// Schema is the source of truth; `npm run db:generate` writes numbered SQL migrations and
// snapshots into db/migrations, which the app applies at start (src/store/migrate.ts).
export default defineConfig({
  dialect: 'sqlite',
  schema: './src/store/schema.ts',
  out: './db/migrations',
});
