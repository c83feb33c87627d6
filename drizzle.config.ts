import { defineConfig } from 'drizzle-kit';

// Generating migrations needs no database; applying them is scripts/migrate.js.
export default defineConfig({
	schema: './src/lib/server/db/schema/index.ts',
	out: './drizzle',
	dialect: 'postgresql',
	casing: 'snake_case',
	dbCredentials: {
		url: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54330/thermalith'
	}
});
