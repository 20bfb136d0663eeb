import { defineConfig } from 'drizzle-kit';

// Migrations are generated from the schema (`npm run db:generate`), read, and committed.
// Start-up applies them as the owner role (scripts/lib/migrate.mjs).
export default defineConfig({
	schema: './src/lib/server/db/schema/index.ts',
	out: './drizzle',
	dialect: 'postgresql',
	dbCredentials: { url: process.env.DATABASE_OWNER_URL ?? 'postgres://localhost:54329/seamwell' },
	strict: true,
	verbose: true
});
