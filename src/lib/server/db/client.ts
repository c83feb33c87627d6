import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

/** Create a Drizzle client on postgres.js for a connection URL (the app, scripts and tests share this). */
export function createDb(databaseUrl: string, options: { max?: number } = {}) {
	const client = postgres(databaseUrl, { max: options.max ?? 10, onnotice: () => {} });
	const db = drizzle(client, { schema, casing: 'snake_case' });
	return { db, client };
}

export type Db = ReturnType<typeof createDb>['db'];
